import { subject } from '@casl/ability';
import type { Response } from 'express';
import type { AppAbility } from '@kerfline/domain/authz/ability';
import type { Page } from '@kerfline/domain/common/schema';
import type { UnitSystem } from '@kerfline/domain/sites/schema';
import { scopedWhere } from '../../authz/sequelize-scope.js';
import { AppError } from '../../errors.js';
import { streamCsv } from '../../http/csv.js';
import { Site } from '../sites/site.model.js';

/** Rows asked of a list service per page of an export: never the whole history at once. */
export const EXPORT_PAGE_ROWS = 1000;

const REFUSED = 'Your role does not export records; ask your site admin or a manager';

/** What an export covers: one site (its code and units) or every site the caller reads. */
export type ExportScope = { site: { id: string; code: string; unitSystem: UnitSystem } | null };

/**
 * Who may export a site's record table: the site must be one the caller reads (else 404, as for every id out of
 * scope) and may `export` (else 403: technicians read their site's records but do not export them). Without a
 * site the export covers every site the caller reads, and the caller must be allowed to export each of them, so
 * nothing leaves in a file that the rules keep on screen.
 */
export async function exportScope(ability: AppAbility, siteId: string | undefined): Promise<ExportScope> {
  const sites = await Site.findAll({
    where: scopedWhere(ability, 'read', 'Site', Site, siteId ? { id: siteId } : {}),
    attributes: ['id', 'code', 'regionId', 'unitSystem'],
  });
  if (siteId && sites.length === 0) throw AppError.notFound('Site');
  for (const site of sites)
    if (!ability.can('export', subject('Site', { id: site.id, regionId: site.regionId })))
      throw new AppError('FORBIDDEN', REFUSED);
  if (!siteId && sites.length === 0) throw new AppError('FORBIDDEN', REFUSED);
  const one = siteId ? sites[0]! : null;
  return { site: one ? { id: one.id, code: one.code, unitSystem: one.unitSystem } : null };
}

/** The unit system of an export: the one asked for, else the site's own, else metric (the records' SI). */
export const exportUnits = (asked: UnitSystem | undefined, scope: ExportScope): UnitSystem =>
  asked ?? scope.site?.unitSystem ?? 'metric';

/** `HLT-blade-runs-2026-12-02` or `all-sites-stops-2026-12-02`. */
export const exportName = (scope: ExportScope, table: string, now = new Date()): string =>
  `${scope.site?.code ?? 'all-sites'}-${table}-${now.toISOString().slice(0, 10)}`;

/**
 * Streams a record table as CSV through the very list service the screen pages with (same filters, same scope),
 * a thousand rows a page. The first page's total goes out as `X-Row-Count` for the progress bar. The lists sort on
 * their column and then the id, so the pages neither overlap nor skip while the records stand still.
 */
export async function streamListCsv<T>(
  res: Response,
  name: string,
  header: readonly string[],
  page: (limit: number, offset: number) => Promise<Page<T>>,
  cells: (item: T) => unknown[],
  pageRows = EXPORT_PAGE_ROWS,
): Promise<void> {
  const first = await page(pageRows, 0);
  async function* batches() {
    let current = first;
    let sent = 0;
    for (;;) {
      yield current.items.map(cells);
      sent += current.items.length;
      if (current.items.length < pageRows || sent >= current.total) return;
      current = await page(pageRows, sent);
    }
  }
  await streamCsv(res, name, header, first.total, batches());
}
