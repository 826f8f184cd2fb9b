import type { UnitSystem } from '@kerfline/domain/sites/schema';
import type { ConvertedMoney } from '@kerfline/domain/fleet/schema';
import { formatLargeArea, formatMoneyPerArea, formatNumber } from '../../../lib/format';
import { formatMoney } from '../../../lib/money';

/** Money in the reporting currency, marked when a month's rate was missing (the total is then too low). */
export function spendText(money: ConvertedMoney): string {
  return `${formatMoney(money.amountMinor, money.currency, { cents: 'auto' })}${money.complete ? '' : ' *'}`;
}

export function costPerAreaText(
  minorPerMm2: number | null,
  currency: string,
  units: UnitSystem,
  complete = true,
): string {
  if (!complete) return 'No rate *';
  return minorPerMm2 === null ? '—' : formatMoneyPerArea(minorPerMm2, currency, units);
}

export function lifeText(mm2: number | null, units: UnitSystem): string {
  return mm2 === null ? '—' : formatLargeArea(mm2, units);
}

export function percentText(share: number | null, decimals = 1): string {
  return share === null ? '—' : `${formatNumber(share * 100, decimals)}\u00a0%`;
}

export function hoursText(hours: number | null): string {
  if (hours === null) return '—';
  return `${formatNumber(hours, hours < 10 ? 1 : 0)}\u00a0h`;
}

export type Change = { text: string; direction: 'up' | 'down' | 'same'; verdict: 'better' | 'worse' | 'neutral' };

/** The change of a share (availability) in percentage points: 98.1 % → 98.3 % is "up 0.2 points". */
export function pointsChangeOf(current: number | null, previous: number | null, better: 'up' | 'down'): Change | null {
  if (current === null || previous === null) return null;
  const points = (current - previous) * 100;
  if (Math.abs(points) < 0.05) return { text: 'no change', direction: 'same', verdict: 'neutral' };
  const direction = points > 0 ? 'up' : 'down';
  return {
    text: `${direction} ${formatNumber(Math.abs(points), 1)} points`,
    direction,
    verdict: direction === better ? 'better' : 'worse',
  };
}

/**
 * The change of a figure against the previous period, in words and with a direction; `better` says which way is
 * good for this figure (null: neither, as with spend, which follows production).
 */
export function changeOf(current: number | null, previous: number | null, better: 'up' | 'down' | null): Change | null {
  if (current === null || previous === null || previous === 0) return null;
  const ratio = current / previous - 1;
  if (Math.abs(ratio) < 0.005) return { text: 'no change', direction: 'same', verdict: 'neutral' };
  const direction = ratio > 0 ? 'up' : 'down';
  return {
    text: `${direction === 'up' ? 'up' : 'down'} ${formatNumber(Math.abs(ratio) * 100, Math.abs(ratio) < 0.1 ? 1 : 0)}\u00a0%`,
    direction,
    verdict: better === null ? 'neutral' : direction === better ? 'better' : 'worse',
  };
}
