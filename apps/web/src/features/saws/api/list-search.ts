import {
  SAW_KINDS,
  SAW_STATUSES,
  sawListQuerySchema,
  type SawKind,
  type SawListQuery,
  type SawStatus,
} from '@kerfline/domain/saws/schema';

/**
 * The status filter as the URL spells it: a saw status, `all` (retired saws too), or nothing, which means
 * the saws still in use (in service or down) — what a site looks at day to day.
 */
export type SawStatusFilter = SawStatus | 'all' | '';

export type SawFilterValues = {
  status: SawStatusFilter;
  kind: SawKind | '';
  q: string;
  /** Only on the fleet-wide list; a site's own page fixes the site in its path. */
  siteId: string;
};

const isStatus = (value: string): value is SawStatus => (SAW_STATUSES as readonly string[]).includes(value);
const isKind = (value: string): value is SawKind => (SAW_KINDS as readonly string[]).includes(value);

/** Reads the filters from the URL, dropping any value that is not one the list understands. */
export function sawFilterValuesFromSearch(params: URLSearchParams): SawFilterValues {
  const status = params.get('status') ?? '';
  const kind = params.get('kind') ?? '';
  return {
    status: status === 'all' || isStatus(status) ? status : '',
    kind: isKind(kind) ? kind : '',
    q: (params.get('q') ?? '').trim().slice(0, 80),
    siteId: params.get('site') ?? '',
  };
}

/**
 * The API's list query for the filters in the URL, parsed with the domain schema so defaults are applied
 * (equal filters give equal query keys). `siteId` from the path wins over `?site=`.
 */
export function sawListQueryFromSearch(params: URLSearchParams, pathSiteId?: string): SawListQuery {
  const filters = sawFilterValuesFromSearch(params);
  const offset = Number(params.get('offset') ?? '0');
  const siteId = pathSiteId ?? (filters.siteId || undefined);
  const candidate = {
    siteId,
    status: filters.status === '' || filters.status === 'all' ? undefined : filters.status,
    kind: filters.kind || undefined,
    q: filters.q || undefined,
    // A retired saw is only listed when asked for: by the `retired` status or by `all`.
    includeRetired: filters.status === 'all' || filters.status === 'retired' ? 'true' : 'false',
    offset: Number.isInteger(offset) && offset >= 0 ? offset : 0,
  };
  const parsed = sawListQuerySchema.safeParse(candidate);
  // A hand-edited URL with a malformed site id falls back to the unfiltered list rather than an error page.
  return parsed.success ? parsed.data : sawListQuerySchema.parse({ ...candidate, siteId: pathSiteId });
}
