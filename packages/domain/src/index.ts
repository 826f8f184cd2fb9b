export * from './errors.js';
export * from './common/schema.js';
export * from './regions/schema.js';
export * from './sites/schema.js';
export * from './saws/schema.js';
export * from './users/schema.js';
export * from './auth/schema.js';
export * from './authz/ability.js';
