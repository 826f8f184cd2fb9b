import type { UnitSystem } from '@kerfline/domain/sites/schema';
import type { DueStateName } from '@kerfline/domain/checks/check-due';
import { RULE_SETTING_KEYS, type CheckQuantity, type SiteCheck } from '@kerfline/domain/site-checks/schema';
import { settingDefinition } from '@kerfline/domain/settings/registry';
import { settingFigureBasis, type SiteSetting } from '@kerfline/domain/settings/schema';
import {
  DISPLAY_UNITS,
  quantityFromDisplay,
  quantityToDisplay,
  type DisplayQuantityKind,
} from '@kerfline/domain/units/display';
import { formatDual, formatNumber, formatQuantity } from '../../../lib/format';
import { basisWords } from '../../../lib/figure-basis';

type NumberQuantity = Exclude<CheckQuantity, 'condition'>;

/**
 * How a check's numbers show: a length read with feelers in thousandths of an inch or hundredths of a millimetre,
 * a force in lbf or N, a stress or pressure in psi or MPa. Check figures are stored in mm, N and MPa.
 */
const SHOWN: Record<NumberQuantity, { kind: DisplayQuantityKind; toSi: number }> = {
  length: { kind: 'smallLength', toSi: 1 },
  force: { kind: 'force', toSi: 1 },
  stress: { kind: 'stress', toSi: 1e6 },
};

const shown = (quantity: CheckQuantity) => SHOWN[quantity === 'condition' ? 'length' : quantity];

/** A check figure in the site's unit: `0.037 in`, `35 N`, `508 psi`. */
export function checkFigure(quantity: CheckQuantity, value: number, system: UnitSystem): string {
  const s = shown(quantity);
  return formatQuantity(s.kind, value * s.toSi, system);
}

/** A check figure in the site's unit first and the other system's second: `0.037 in (0.94 mm)`. */
export function checkFigureDual(quantity: CheckQuantity, value: number, system: UnitSystem): string {
  const s = shown(quantity);
  return formatDual(s.kind, value * s.toSi, system);
}

/** The unit a reading is typed in on a site. */
export function readingUnit(quantity: CheckQuantity, system: UnitSystem): string {
  return DISPLAY_UNITS[shown(quantity).kind][system].unit;
}

/** A reading typed in the site's unit, in the check's stored unit (mm, N, MPa). */
export function readingToStored(quantity: CheckQuantity, typed: number, system: UnitSystem): number {
  const s = shown(quantity);
  return quantityFromDisplay(s.kind, typed, system) / s.toSi;
}

/** A stored check figure as the text a field starts with, in the site's unit (plain digits). */
export function storedToEntry(quantity: CheckQuantity, value: number, system: UnitSystem): string {
  const s = shown(quantity);
  const digits = s.kind === 'smallLength' ? (system === 'imperial' ? 4 : 3) : s.kind === 'stress' ? 2 : 1;
  return String(Number(quantityToDisplay(s.kind, value * s.toSi, system, { decimals: 12 }).value.toFixed(digits)));
}

/** "At each blade change, within 8 h" / "Every 30 days, a day's grace". */
export function whenDueWords(check: Pick<SiteCheck, 'schedule' | 'intervalDays' | 'graceHours'>): string {
  const grace = hoursWords(check.graceHours);
  return check.schedule === 'blade_change'
    ? `At each blade change, within ${grace}`
    : `Every ${formatNumber(check.intervalDays ?? 0)} days, overdue ${grace} later`;
}

function hoursWords(hours: number): string {
  if (hours === 24) return 'a day';
  if (hours > 24 && hours % 24 === 0) return `${hours / 24} days`;
  return `${formatNumber(hours, 1)}\u00a0h`;
}

/**
 * Where a check's limits come from, in words: a rule's limits are the site's settings (named, with whose value
 * it is), never a second copy of the numbers; a fixed check's are its own target and limits.
 */
export function limitsWords(check: SiteCheck, settings: readonly SiteSetting[], system: UnitSystem, timeZone?: string) {
  if (check.targetRule === 'fixed') {
    const parts: string[] = [];
    if (check.fixedTarget !== null) parts.push(`aim for ${checkFigure(check.quantity, check.fixedTarget, system)}`);
    if (check.fixedMin !== null && check.fixedMax !== null)
      parts.push(
        `${checkFigure(check.quantity, check.fixedMin, system)} to ${checkFigure(check.quantity, check.fixedMax, system)} passes`,
      );
    else if (check.fixedMin !== null) parts.push(`at least ${checkFigure(check.quantity, check.fixedMin, system)}`);
    else if (check.fixedMax !== null) parts.push(`at most ${checkFigure(check.quantity, check.fixedMax, system)}`);
    const sentence = parts.join('; ');
    return `${sentence.charAt(0).toUpperCase()}${sentence.slice(1)} — set on this list`;
  }
  if (check.targetRule === 'chip_brush') return 'Passes when the brush reaches the gullets and is not worn';
  const keys = RULE_SETTING_KEYS[check.targetRule];
  const described = keys.map((key) => {
    const setting = settings.find((s) => s.key === key);
    return { label: `“${settingDefinition(key)?.label ?? key}”`, basis: setting ? settingFigureBasis(setting) : null };
  });
  if (described.length === 1) {
    const [{ label, basis }] = described as [(typeof described)[number]];
    return `Your site’s setting ${label}${basis ? `: ${basisWords(basis, timeZone)}` : ''}`;
  }
  const named = described.map(({ label, basis }) => (basis ? `${label} (${shortBasis(basis, timeZone)})` : label));
  return `Your site’s settings ${named.join(', ')}`;
}

/** A basis in a few words, for a list that names several settings: the settings page has the citations. */
function shortBasis(basis: ReturnType<typeof settingFigureBasis>, timeZone?: string): string {
  if (basis.kind === 'published') return 'published';
  return basisWords(basis, timeZone);
}

export const DUE_STATE_WORDS: Record<DueStateName, string> = { ok: 'Up to date', due: 'Due now', overdue: 'Overdue' };
