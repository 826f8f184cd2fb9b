import { queryOptions } from '@tanstack/react-query';
import { pageOf } from '@kerfline/domain/common/schema';
import {
  removedRecordListQuerySchema,
  removedRecordSchema,
  type RemovedRecordListQuery,
} from '@kerfline/domain/removed-records/schema';
import { api } from '../../../lib/api-client';
import { removedRecordKeys } from './keys';

const removedPageSchema = pageOf(removedRecordSchema);

/** The list query with its defaults, so equal filters give equal keys. */
export function parseRemovedRecordListQuery(
  input: Partial<Record<keyof RemovedRecordListQuery, unknown>>,
): RemovedRecordListQuery {
  return removedRecordListQuerySchema.parse(input);
}

/** A page of the records removed at the sites the user may put back at, newest removal first. */
export function removedRecordListQuery(q: RemovedRecordListQuery) {
  return queryOptions({
    queryKey: removedRecordKeys.list(q),
    queryFn: ({ signal }) => api.get('/removed-records', removedPageSchema, { query: q, signal }),
  });
}
