import type { ReactNode } from 'react';
import { Link } from 'react-router-dom';
import type { DueCheck, SawChecks } from '@kerfline/domain/site-checks/schema';
import { formatDateTime } from '../../../lib/format';
import { buttonClass } from '../../../lib/ui/button';
import { Card } from '../../../lib/ui/card';
import { CheckShape, DueStateBadge } from './check-status-badge';

/** Where the record form for a check on a saw lives. */
export function recordCheckHref(sawId: string, siteCheckId?: string): string {
  return `/saws/${encodeURIComponent(sawId)}/record-check${siteCheckId ? `?check=${encodeURIComponent(siteCheckId)}` : ''}`;
}

/** A saw's due and overdue checks in the shape of a site's list, the overdue first. */
export function sawDueItems(data: SawChecks, saw: { id: string; assetTag: string; name: string }): DueCheck[] {
  return data.items
    .filter((item) => item.state !== 'ok')
    .map((item) => ({
      siteId: data.siteId,
      sawId: saw.id,
      sawAssetTag: saw.assetTag,
      sawName: saw.name,
      siteCheckId: item.check.id,
      checkName: item.check.name,
      targetRule: item.check.targetRule,
      schedule: item.check.schedule,
      state: item.state,
      fallsDueAt: item.fallsDueAt,
      overdueAt: item.overdueAt,
      lastCheckedAt: item.lastCheckedAt,
      lastPassed: item.lastPassed,
      bladeRunId: data.bladeRunId,
    }))
    .sort((a, b) => (a.state === b.state ? 0 : a.state === 'overdue' ? -1 : 1));
}

function when(item: DueCheck, timeZone: string): string {
  if (item.state === 'overdue' && item.overdueAt) return `Overdue since ${formatDateTime(item.overdueAt, timeZone)}`;
  if (item.overdueAt) return `Due; overdue after ${formatDateTime(item.overdueAt, timeZone)}`;
  return 'Due';
}

function last(item: DueCheck, timeZone: string): string {
  if (!item.lastCheckedAt) return 'Never recorded on this saw';
  return `Last ${item.lastPassed ? 'passed' : 'failed'} ${formatDateTime(item.lastCheckedAt, timeZone)}`;
}

/**
 * The checks to do now, each with why it is due and a large "Record" action: on a saw's page (one saw) or a
 * technician's first screen (the site's saws, `showSaw`). Nothing due reads as such, in words.
 */
export function DueChecksPanel({
  items,
  timeZone,
  heading = 'Checks due',
  showSaw = false,
  canRecord,
  emptyText = 'No check is due on this saw.',
  footer,
}: {
  items: DueCheck[];
  timeZone: string;
  heading?: string;
  showSaw?: boolean;
  /** Whether to offer "Record" (technicians and site admins of the site). */
  canRecord: boolean;
  emptyText?: string;
  footer?: ReactNode;
}) {
  const overdue = items.filter((i) => i.state === 'overdue').length;
  return (
    <Card aria-labelledby="due-checks-heading">
      <div className="flex flex-wrap items-baseline justify-between gap-2 border-b border-rule px-4 py-3 sm:px-5">
        <h2 id="due-checks-heading" className="text-lg font-bold text-ink">
          {heading}
        </h2>
        <p className="tabular text-sm text-ink-muted">
          {items.length === 0 ? 'None' : `${items.length} to do${overdue > 0 ? `, ${overdue} overdue` : ''}`}
        </p>
      </div>
      {items.length === 0 ? (
        <p className="px-4 py-4 text-ink-muted sm:px-5">
          <span aria-hidden="true" className="mr-1 text-signal-safe">
            ●
          </span>
          {emptyText}
        </p>
      ) : (
        <ul className="divide-y divide-rule">
          {items.map((item) => (
            <li
              key={`${item.sawId}:${item.siteCheckId}`}
              className="flex flex-wrap items-center justify-between gap-3 px-4 py-3 sm:px-5"
            >
              <div className="min-w-0 space-y-1">
                <p className="flex flex-wrap items-center gap-2">
                  <DueStateBadge state={item.state} />
                  <span className="font-bold text-ink">
                    {showSaw ? (
                      <>
                        <Link to={`/saws/${item.sawId}`} className="underline underline-offset-4">
                          {item.sawAssetTag}
                        </Link>{' '}
                        ·{' '}
                      </>
                    ) : null}
                    {item.checkName}
                  </span>
                </p>
                <p className="text-sm text-ink-muted">
                  {when(item, timeZone)}. {last(item, timeZone)}.
                </p>
              </div>
              {canRecord ? (
                <Link
                  to={recordCheckHref(item.sawId, item.siteCheckId)}
                  className={buttonClass(item.state === 'overdue' ? 'primary' : 'secondary', 'max-sm:w-full')}
                  aria-label={`Record ${item.checkName}${showSaw ? ` on ${item.sawAssetTag}` : ''}`}
                >
                  Record
                </Link>
              ) : null}
            </li>
          ))}
        </ul>
      )}
      {footer ? <div className="border-t border-rule px-4 py-3 text-sm sm:px-5">{footer}</div> : null}
    </Card>
  );
}

/**
 * One line for a saw's state card: how many checks are due and overdue, and which, with the same shapes as the
 * badges (a triangle while any is overdue, a ring while some are due, a filled circle when none).
 */
export function DueChecksLine({ items }: { items: DueCheck[] }) {
  const overdue = items.filter((i) => i.state === 'overdue');
  const shape = overdue.length > 0 ? 'triangle' : items.length > 0 ? 'ring' : 'circle';
  const tone = shape === 'circle' ? 'text-signal-safe' : shape === 'ring' ? 'text-signal-info' : '';
  const title =
    items.length === 0
      ? 'No check due'
      : overdue.length > 0
        ? `${overdue.length} check${overdue.length === 1 ? '' : 's'} overdue${items.length > overdue.length ? `, ${items.length - overdue.length} due` : ''}`
        : `${items.length} check${items.length === 1 ? '' : 's'} due now`;
  return (
    <div className="flex gap-3">
      <span className={`mt-1 ${tone}`}>
        <CheckShape shape={shape} className="size-5" />
      </span>
      <div className="min-w-0">
        <p className="text-xl font-extrabold text-ink">{title}</p>
        {items.length > 0 ? <p className="text-ink-muted">{items.map((i) => i.checkName).join(', ')}.</p> : null}
      </div>
    </div>
  );
}
