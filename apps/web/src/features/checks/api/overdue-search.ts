import {
  CHECK_SCHEDULES,
  DUE_LIST_STATES,
  dueCheckListQuerySchema,
  type DueCheckListQuery,
} from '@kerfline/domain/site-checks/schema';

/** The overdue list's filters as the URL spells them: `state`, `check`, `schedule` and `offset`. */
export type OverdueFilterValues = { state: string; check: string; schedule: string };

export function overdueFiltersFromSearch(params: URLSearchParams): OverdueFilterValues {
  const state = params.get('state') ?? '';
  const schedule = params.get('schedule') ?? '';
  return {
    state: (DUE_LIST_STATES as readonly string[]).includes(state) ? state : 'overdue',
    check: params.get('check') ?? '',
    schedule: (CHECK_SCHEDULES as readonly string[]).includes(schedule) ? schedule : '',
  };
}

/**
 * The API's query for the filters in the URL, parsed with the domain schema so defaults apply (equal filters,
 * equal query keys). Anything the schema refuses falls back to the first page of overdue checks.
 */
export function overdueQueryFromSearch(params: URLSearchParams): DueCheckListQuery {
  const f = overdueFiltersFromSearch(params);
  const parsed = dueCheckListQuerySchema.safeParse({
    state: f.state,
    siteCheckId: f.check || undefined,
    schedule: f.schedule || undefined,
    offset: params.get('offset') ?? undefined,
    limit: 25,
  });
  return parsed.success ? parsed.data : dueCheckListQuerySchema.parse({ limit: 25 });
}
