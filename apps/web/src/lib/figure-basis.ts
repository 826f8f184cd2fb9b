import type { FigureBasis } from '@kerfline/domain/figures/basis';
import { formatDate } from './format';

/** Said of a figure the site uses as Kerfline shipped it, because no printed source gives one value. */
export const STARTING_VALUE_WORDS = 'Kerfline’s starting value (no printed source gives one value)';

/**
 * Where a figure comes from, in the words every screen uses: "published: <citation>", Kerfline's starting value,
 * or "your site's setting, changed by <name> on <date>" (the date in the site's time zone). A figure from the
 * site's records or a reading says so in its own note.
 */
export function basisWords(basis: FigureBasis, timeZone?: string): string {
  switch (basis.kind) {
    case 'published':
      return `published: ${basis.citation}`;
    case 'site_setting': {
      if (basis.changedAt === null) return STARTING_VALUE_WORDS;
      const who = basis.changedByName ?? 'someone no longer listed';
      const zone = timeZone ?? Intl.DateTimeFormat().resolvedOptions().timeZone;
      return `your site’s setting, changed by ${who} on ${formatDate(basis.changedAt, zone)}`;
    }
    case 'record': {
      if (basis.setAt === undefined) return basis.note;
      const who = basis.setByName ?? 'someone no longer listed';
      const zone = timeZone ?? Intl.DateTimeFormat().resolvedOptions().timeZone;
      return `${basis.note}, set by ${who} on ${formatDate(basis.setAt, zone)}`;
    }
    case 'measured':
      return basis.note;
  }
}

/** The same words starting with a capital, for a line of its own. */
export function basisSentence(basis: FigureBasis, timeZone?: string): string {
  const words = basisWords(basis, timeZone);
  return words.charAt(0).toUpperCase() + words.slice(1);
}
