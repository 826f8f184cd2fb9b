import { queryOptions } from '@tanstack/react-query';
import { pageOf } from '@kerfline/domain/common/schema';
import { ROLES, userListQuerySchema, userSchema, type Role, type UserListQuery } from '@kerfline/domain/users/schema';
import { api } from '../../../lib/api-client';
import { userKeys } from './keys';

const userPageSchema = pageOf(userSchema);

const isRole = (value: string): value is Role => (ROLES as readonly string[]).includes(value);

/** The people list's query from the URL (`role`, `offset`); unknown values are dropped. */
export function userListQueryFromSearch(params: URLSearchParams): UserListQuery {
  const role = params.get('role') ?? '';
  const offset = Number(params.get('offset') ?? '0');
  return userListQuerySchema.parse({
    role: isRole(role) ? role : undefined,
    offset: Number.isInteger(offset) && offset >= 0 ? offset : 0,
  });
}

export function userListQuery(q: UserListQuery) {
  return queryOptions({
    queryKey: userKeys.list(q),
    queryFn: ({ signal }) => api.get('/users', userPageSchema, { query: q, signal }),
  });
}
