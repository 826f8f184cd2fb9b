import { queryOptions } from '@tanstack/react-query';
import { pageOf } from '@kerfline/domain/common/schema';
import {
  ROLES,
  USER_STATES,
  userListQuerySchema,
  userSchema,
  type Role,
  type UserListQuery,
} from '@kerfline/domain/users/schema';
import { api } from '../../../lib/api-client';
import { userKeys } from './keys';

const userPageSchema = pageOf(userSchema);

const isRole = (value: string): value is Role => (ROLES as readonly string[]).includes(value);
const isState = (value: string): value is (typeof USER_STATES)[number] =>
  (USER_STATES as readonly string[]).includes(value);

/** The people list's query from the URL (`role`, `state`, `offset`); unknown values are dropped. */
export function userListQueryFromSearch(params: URLSearchParams): UserListQuery {
  const role = params.get('role') ?? '';
  const state = params.get('state') ?? '';
  const offset = Number(params.get('offset') ?? '0');
  return userListQuerySchema.parse({
    role: isRole(role) ? role : undefined,
    state: isState(state) ? state : undefined,
    offset: Number.isInteger(offset) && offset >= 0 ? offset : 0,
  });
}

export function userListQuery(q: UserListQuery) {
  return queryOptions({
    queryKey: userKeys.list(q),
    queryFn: ({ signal }) => api.get('/users', userPageSchema, { query: q, signal }),
  });
}

export function userDetailQuery(id: string) {
  return queryOptions({
    queryKey: userKeys.detail(id),
    queryFn: ({ signal }) => api.get(`/users/${encodeURIComponent(id)}`, userSchema, { signal }),
  });
}
