import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { startTestApp, type TestContext } from '../test-support/test-db.js';
import { MULTIPART_ROUTES } from '../app.js';
import { listRoutes } from './route-list.js';

let ctx: TestContext;
beforeAll(() => {
  ctx = startTestApp();
});
afterAll(async () => ctx.close());

describe('the list of routes, read from the router', () => {
  it('holds every API route with its method and full path, each once', () => {
    const routes = listRoutes(ctx.app).map((r) => `${r.method} ${r.path}`);
    for (const expected of [
      'GET /api/health',
      'POST /api/auth/sign-in',
      'POST /api/me/password',
      'POST /api/invitations/accept',
      'GET /api/saws/:id',
      'POST /api/saws/:id/restore',
      'POST /api/blade-runs/:id/photos',
      'GET /api/photos/:id/thumbnail',
      'DELETE /api/photos/:id',
      'GET /api/removed-records',
      'GET /api/removed-records/:id',
      'POST /api/removed-records/:id/restore',
    ])
      expect(routes).toContain(expected);
    expect(new Set(routes).size).toBe(routes.length);
    expect(routes.every((r) => / \/api\//.test(r))).toBe(true);
  });

  it('accepts multipart bodies on the upload routes only, and each such rule names a route that exists', () => {
    const posts = listRoutes(ctx.app).filter((r) => r.method === 'POST');
    const concrete = (path: string) => path.replace(/:[A-Za-z]+/g, '00000000-0000-4000-8000-000000000000');
    for (const rule of MULTIPART_ROUTES) {
      expect(
        posts.some((r) => rule.test(concrete(r.path))),
        String(rule),
      ).toBe(true);
    }
    const uploads = posts.filter((r) => MULTIPART_ROUTES.some((rule) => rule.test(concrete(r.path))));
    expect(uploads.map((r) => r.path).sort()).toEqual(
      ['/api/blade-runs/:id/photos', '/api/check-records/:id/photos', '/api/imports', '/api/imports/check'].sort(),
    );
  });
});
