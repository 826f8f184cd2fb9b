import { z } from 'zod';

/**
 * Where a figure shown to a user comes from. Every figure on a calculator or saw page carries one, and the
 * screen turns it into words a user trusts:
 * - `published`: a printed source (handbook, standard, course text) named with edition and page or table;
 * - `site_setting`: a value the site keeps in its settings — either Kerfline's shipped starting value (no printed
 *   source exists; `changedAt` null) or the site's own value (who changed it, when);
 * - `record`: a figure typed into the site's own records (the saw's band thickness, a blade's cost);
 * - `measured`: a reading a person took.
 * "From memory" and "common practice" are markings for tests and the contributor guide, never this type.
 */
export const figureBasisSchema = z.discriminatedUnion('kind', [
  z.object({ kind: z.literal('published'), citation: z.string().min(1) }),
  z.object({
    kind: z.literal('site_setting'),
    settingKey: z.string().min(1),
    /** Null while the site uses Kerfline's shipped starting value. */
    changedByName: z.string().nullable(),
    changedAt: z.iso.datetime().nullable(),
    /** For a shipped value: why it has no printed source; for a changed one, the shipped value's own basis. */
    note: z.string(),
  }),
  z.object({
    kind: z.literal('record'),
    note: z.string().min(1),
    /** A figure kept on one record (a saw's own limit): who set it and when, from the audit trail. */
    setByName: z.string().nullable().optional(),
    setAt: z.iso.datetime().optional(),
  }),
  z.object({ kind: z.literal('measured'), note: z.string().min(1) }),
]);
export type FigureBasis = z.infer<typeof figureBasisSchema>;

/** A printed source, as data: shown on screen and named beside the tests that check figures against it. */
export interface PrintedSource {
  /** Stable id used in code and tests, e.g. `mh-band-speed`. */
  id: string;
  /** Full citation: title, edition, publisher, year, and page, table or clause. */
  citation: string;
}

export const published = (source: PrintedSource): FigureBasis => ({ kind: 'published', citation: source.citation });

/**
 * The basis in words a user trusts, for a line under a figure: "Published: …", "Your site's setting, changed by
 * Ana Ruiz on 2025-03-04", or "Kerfline's starting value for your site: …". Dates are shown as the ISO day.
 */
export function describeBasis(basis: FigureBasis): string {
  switch (basis.kind) {
    case 'published':
      return `Published: ${basis.citation}`;
    case 'site_setting':
      if (basis.changedAt !== null) {
        const who = basis.changedByName === null ? '' : ` by ${basis.changedByName}`;
        return `Your site's setting, changed${who} on ${basis.changedAt.slice(0, 10)}`;
      }
      return `Kerfline's starting value for your site's setting (a site admin can change it): ${basis.note}`;
    case 'record': {
      if (basis.setAt === undefined) return `From your records: ${basis.note}`;
      const who = basis.setByName ? ` by ${basis.setByName}` : '';
      return `From your records: ${basis.note}, set${who} on ${basis.setAt.slice(0, 10)}`;
    }
    case 'measured':
      return `Measured: ${basis.note}`;
  }
}
