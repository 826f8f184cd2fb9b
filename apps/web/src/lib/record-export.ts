import { subject } from '@casl/ability';
import { useAppAbility } from './ability';
import { toSearchParams } from './api-client';

/**
 * The export path of a record table (`/blade-runs/export?siteId=…&reason=…&sort=…`) from the very query the
 * table asks its page with: every filter and the sort kept, the paging left out (the export is every row).
 */
export function recordExportPath(base: string, query: Record<string, unknown>): string {
  const filters: Record<string, string | number | boolean | undefined> = {};
  for (const [key, value] of Object.entries(query)) {
    if (key === 'limit' || key === 'offset' || value === undefined || value === null) continue;
    filters[key] =
      value instanceof Date
        ? value.toISOString()
        : typeof value === 'object'
          ? JSON.stringify(value)
          : (value as never);
  }
  const search = toSearchParams(filters).toString();
  return search ? `${base}?${search}` : base;
}

/** Whether the reader may export a site's records (managers, leads, site admins; never technicians). */
export function useCanExportSite(site: { id: string; regionId: string }): boolean {
  return useAppAbility().can('export', subject('Site', { id: site.id, regionId: site.regionId }));
}
