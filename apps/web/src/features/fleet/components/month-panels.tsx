import type { UnitSystem } from '@kerfline/domain/sites/schema';
import { numberFormat } from '@kerfline/domain/common/number-format';
import type { Figures } from '@kerfline/domain/fleet/schema';
import { monthLabel } from '@kerfline/domain/fleet/period';
import { minorUnitDigits } from '@kerfline/domain/money/currency';
import { APP_LOCALE, formatNumber } from '../../../lib/format';
import { ChartPanel } from './chart-panel';
import { costPerAreaText, hoursText, lifeText, percentText, spendText } from './figure-text';
import { SiteMark } from './site-mark';

/** One site's or saw's months: blade spend as a line, every figure of each month in the table view. */
export function MonthPanel({
  title,
  label,
  slot,
  months,
  currency,
  units,
  exportPath,
  status,
  errorMessage,
  onRetry,
}: {
  title: string;
  label: string;
  slot: number;
  months: { month: string; figures: Figures }[] | null;
  currency: string;
  units: UnitSystem;
  exportPath: string;
  status: 'pending' | 'error' | 'success';
  errorMessage?: string;
  onRetry?: () => void;
}) {
  const digits = minorUnitDigits(currency);
  return (
    <ChartPanel
      title={title}
      units={`${currency} per month; the table has every figure of each month`}
      status={status}
      errorMessage={errorMessage}
      onRetry={onRetry}
      spec={
        months && {
          kind: 'line',
          series: [
            {
              id: label,
              label,
              slot,
              points: months.map((m) => ({
                x: m.month,
                y: m.figures.spend.complete ? m.figures.spend.amountMinor / 10 ** digits : null,
              })),
            },
          ],
          yLegend: `${currency} per month`,
          formatY: (v) => numberFormat(APP_LOCALE, { style: 'currency', currency, maximumFractionDigits: 0 }).format(v),
        }
      }
      table={
        months && {
          columns: [
            'Month',
            'Blades put on',
            'Blade spend',
            'Cost per area',
            'Blade life (median)',
            'Stop hours',
            'Failures',
            'Operational availability',
          ],
          rows: months.map((m) => ({
            key: m.month,
            cells: [
              monthLabel(m.month),
              formatNumber(m.figures.bladesUsed),
              spendText(m.figures.spend),
              costPerAreaText(m.figures.costPerAreaMinorPerMm2, currency, units, m.figures.costPerAreaComplete),
              lifeText(m.figures.medianLifeMm2, units),
              hoursText(m.figures.downtimeHours),
              formatNumber(m.figures.failures),
              percentText(m.figures.operationalAvailability),
            ],
          })),
        }
      }
      legend={[{ key: label, label, mark: <SiteMark slot={slot} /> }]}
      exportPath={exportPath}
      emptyMessage="No blades were put on in this period."
    />
  );
}
