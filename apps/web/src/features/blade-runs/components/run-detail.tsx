import type { ReactNode } from 'react';
import type { BladeRun } from '@kerfline/domain/blade-runs/schema';
import { MATERIAL_GROUP_LABELS } from '@kerfline/domain/band-speed/schema';
import { CAUSES } from '@kerfline/domain/diagnosis/likely-causes';
import { REMOVAL_REASON_LABELS } from '@kerfline/domain/diagnosis/schema';
import type { UnitSystem } from '@kerfline/domain/sites/schema';
import { formatDateTime, formatStress } from '../../../lib/format';
import { formatMoney } from '../../../lib/money';
import { Card } from '../../../lib/ui/card';
import { lifeText } from './blade-runs-table';

function Fact({ label, children }: { label: string; children: ReactNode }) {
  return (
    <div className="border-t border-rule py-2.5 first:border-t-0 sm:grid sm:grid-cols-[11rem_1fr] sm:gap-4">
      <dt className="text-sm text-ink-muted">{label}</dt>
      <dd className="tabular font-semibold text-ink">{children}</dd>
    </div>
  );
}

const none = <span className="font-normal text-ink-muted">Not recorded</span>;

/** Everything recorded about one blade's life on its saw, in the site's units and clock. */
export function RunDetail({ run, system, timeZone }: { run: BladeRun; system: UnitSystem; timeZone: string }) {
  return (
    <div className="grid gap-4 lg:grid-cols-2">
      <Card aria-label="Put on" className="px-4 py-3 sm:px-5">
        <h2 className="pb-1 text-sm font-bold tracking-wider text-ink-muted uppercase">Put on</h2>
        <dl>
          <Fact label="When">{formatDateTime(run.installedAt, timeZone, true)}</Fact>
          <Fact label="By">{run.installedByName ?? none}</Fact>
          <Fact label="Tension set">{run.tensionMpa !== null ? formatStress(run.tensionMpa * 1e6, system) : none}</Fact>
          <Fact label="First material">{run.materialGroup ? MATERIAL_GROUP_LABELS[run.materialGroup] : none}</Fact>
          <Fact label="Break-in">
            {run.breakInFollowed === null ? none : run.breakInFollowed ? 'Followed' : 'Skipped'}
          </Fact>
          <Fact label="Blade cost">
            {formatMoney(run.costMinor, run.currency)}
            <span className="block text-sm font-normal text-ink-muted">
              {run.stockReceiptId
                ? 'From the stock receipt it was drawn from.'
                : 'The spec’s price: not drawn from recorded stock.'}
            </span>
          </Fact>
          {run.installNotes ? <Fact label="Notes">{run.installNotes}</Fact> : null}
        </dl>
      </Card>
      <Card aria-label="Taken off" className="px-4 py-3 sm:px-5">
        <h2 className="pb-1 text-sm font-bold tracking-wider text-ink-muted uppercase">Taken off</h2>
        {run.removedAt ? (
          <dl>
            <Fact label="When">{formatDateTime(run.removedAt, timeZone, true)}</Fact>
            <Fact label="By">{run.removedByName ?? none}</Fact>
            <Fact label="Why">{run.removalReason ? REMOVAL_REASON_LABELS[run.removalReason] : none}</Fact>
            <Fact label="Confirmed cause">{run.confirmedCause ? CAUSES[run.confirmedCause].label : none}</Fact>
            <Fact label="What it cut">
              {lifeText(run, system)}
              {run.areaSource ? (
                <span className="block text-sm font-normal text-ink-muted">
                  {run.areaSource === 'cut_logs' ? 'Added up from its cut logs.' : 'As entered when it came off.'}
                </span>
              ) : null}
            </Fact>
            {run.removalNotes ? <Fact label="Notes">{run.removalNotes}</Fact> : null}
          </dl>
        ) : (
          <p className="py-2 text-ink">Still on the saw.</p>
        )}
      </Card>
    </div>
  );
}
