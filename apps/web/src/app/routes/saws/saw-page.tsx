import { useRef, useState } from 'react';
import { Link, useLocation, useParams, type LoaderFunctionArgs } from 'react-router-dom';
import { useQuery, useQueryClient, useSuspenseQuery, type QueryClient } from '@tanstack/react-query';
import { effectiveSettingsOf } from '@kerfline/domain/settings/schema';
import { subject } from '@casl/ability';
import { useAppAbility } from '../../../lib/ability';
import { Button, LinkButton } from '../../../lib/ui/button';
import { Card } from '../../../lib/ui/card';
import { Notice } from '../../../lib/ui/notice';
import { formatDate } from '../../../lib/format';
import { siteSettingsQuery } from '../../../features/site-settings/api/queries';
import { sawDetailQuery } from '../../../features/saws/api/queries';
import { useRestoreSaw, useRetireSaw } from '../../../features/saws/api/mutations';
import { SawDetailPanel } from '../../../features/saws/components/saw-detail-panel';
import { SawFiguresPanel } from '../../../features/saws/components/saw-figures-panel';
import { SawStatusBadge } from '../../../features/saws/components/saw-status-badge';
import { siteDetailQuery } from '../../../features/sites/api/queries';
import { siteKeys } from '../../../features/sites/api/keys';
import { calculatorHrefForSaw } from '../../../features/calculators/components/saw-links';
import { calculatorSaw } from '../calculators/calculator-site';
import { SawStatePanel } from '../../../features/saws/components/saw-state-panel';
import { SawTimeline } from '../../../features/saws/components/saw-timeline';
import { stopListQuery } from '../../../features/stops/api/queries';
import { bladeRunDetailQuery, bladeRunListQuery } from '../../../features/blade-runs/api/queries';
import { BladeEconomicsPanel } from '../../../features/blade-runs/components/blade-economics';
import { BreakInAnswer } from '../../../features/blade-runs/components/break-in-answer';
import { parseListQuery } from '../../../lib/list-search';
import { bladeRunListQuerySchema } from '@kerfline/domain/blade-runs/schema';
import { stopListQuerySchema } from '@kerfline/domain/stops/schema';
import { refreshAfterSawRecord, returnNoticeOf } from '../records/refresh';
import { SawActionButtons, sawActionsFor } from './saw-actions';
import { sawChecksQuery } from '../../../features/checks/api/queries';
import { DueChecksLine, DueChecksPanel, sawDueItems } from '../../../features/checks/components/due-checks-panel';
import { FollowUpsPanel } from '../../../features/follow-ups/components/follow-ups-panel';

/** The saw's latest stop: when it ended says since when the saw has been running. */
export const latestStopOf = (sawId: string) => stopListQuery(parseListQuery(stopListQuerySchema, { sawId, limit: 1 }));
/** The saw's latest blades taken off, for blade life and cost per area. */
export const recentRemovedRunsOf = (sawId: string) =>
  bladeRunListQuery(parseListQuery(bladeRunListQuerySchema, { sawId, open: 'false', sort: '-removedAt', limit: 20 }));

export function sawPageLoader(queryClient: QueryClient) {
  return async ({ params }: LoaderFunctionArgs) => {
    const saw = await queryClient.ensureQueryData(sawDetailQuery(params.sawId ?? ''));
    await Promise.all([
      queryClient.ensureQueryData(siteDetailQuery(saw.siteId)),
      // The settings only say whose the guide opening is; the page shows shipped values without them.
      queryClient.ensureQueryData(siteSettingsQuery(saw.siteId)).catch(() => undefined),
      queryClient.ensureQueryData(sawChecksQuery(saw.id)).catch(() => undefined),
    ]);
    return null;
  };
}

/** One saw: its state on top, then everything recorded about it in the site's units. */
export function SawPage() {
  const sawId = useParams().sawId ?? '';
  const { data: saw } = useSuspenseQuery(sawDetailQuery(sawId));
  const { data: site } = useSuspenseQuery(siteDetailQuery(saw.siteId));
  const { data: settings } = useQuery(siteSettingsQuery(saw.siteId));
  const ability = useAppAbility();
  const queryClient = useQueryClient();
  const retire = useRetireSaw(saw.id);
  const restore = useRestoreSaw(saw.id);
  const [confirming, setConfirming] = useState(false);
  const confirmRef = useRef<HTMLHeadingElement>(null);

  const mayUpdate = ability.can('update', subject('Saw', { id: saw.id, siteId: saw.siteId }));
  const canChange = saw.status !== 'retired' && mayUpdate;
  const location = useLocation();
  const notice = returnNoticeOf(location.state);
  const latestStop = useQuery(latestStopOf(saw.id));
  const recentRuns = useQuery(recentRemovedRunsOf(saw.id));
  const bladeRun = useQuery({ ...bladeRunDetailQuery(saw.bladeOn?.runId ?? ''), enabled: saw.bladeOn !== null });
  const lastStopEndedAt = latestStop.isSuccess
    ? (latestStop.data.items[0]?.endedAt ?? (latestStop.data.items.length === 0 ? null : undefined))
    : undefined;
  const checks = useQuery({ ...sawChecksQuery(saw.id), enabled: saw.status !== 'retired' });
  const dueItems = checks.data ? sawDueItems(checks.data, saw) : [];
  const actions = sawActionsFor(saw, ability, { overdue: dueItems.filter((i) => i.state === 'overdue').length });
  const canRecord =
    saw.status !== 'retired' && ability.can('create', subject('CheckRecord', { id: '', siteId: saw.siteId }));
  const canAnswerBreakIn =
    bladeRun.data !== undefined &&
    ability.can('update', subject('BladeRun', { id: bladeRun.data.id, siteId: saw.siteId }));

  const askToRetire = () => {
    setConfirming(true);
    // Move focus to the question so keyboard and screen-reader users land on it.
    requestAnimationFrame(() => confirmRef.current?.focus());
  };

  const onRetire = () => {
    retire.mutate(undefined, {
      onSuccess: () => {
        setConfirming(false);
        // A retired saw no longer counts as in use at its site.
        void queryClient.invalidateQueries({ queryKey: siteKeys.detail(saw.siteId) });
        void queryClient.invalidateQueries({ queryKey: siteKeys.lists() });
      },
    });
  };

  return (
    <div className="space-y-6">
      <title>{`${saw.assetTag} ${saw.name} · Kerfline`}</title>
      <nav aria-label="Breadcrumb" className="text-sm text-ink-muted">
        <Link
          to="/sites"
          className="inline-flex min-h-11 items-center underline-offset-4 hover:text-ink hover:underline"
        >
          Sites
        </Link>
        <span aria-hidden="true" className="px-2">
          /
        </span>
        <Link
          to={`/sites/${site.id}`}
          className="inline-flex min-h-11 items-center underline-offset-4 hover:text-ink hover:underline"
        >
          {site.name}
        </Link>
        <span aria-hidden="true" className="px-2">
          /
        </span>
        <span aria-current="page" className="text-ink">
          {saw.assetTag}
        </span>
      </nav>

      <header className="flex flex-wrap items-end justify-between gap-4">
        <div className="space-y-2">
          <SawStatusBadge status={saw.status} down={saw.down} large />
          <h1 className="text-3xl font-extrabold tracking-tight text-ink">
            <span className="tabular">{saw.assetTag}</span> <span className="font-semibold text-ink-muted">·</span>{' '}
            {saw.name}
          </h1>
          {saw.status === 'retired' && saw.retiredAt ? (
            <p className="text-ink-muted">
              Retired on {formatDate(saw.retiredAt, site.timeZone)}; kept for its history.
            </p>
          ) : null}
        </div>
        {saw.status === 'retired' && mayUpdate ? (
          <Button
            onClick={() =>
              restore.mutate(undefined, {
                onSuccess: () => void queryClient.invalidateQueries({ queryKey: siteKeys.detail(saw.siteId) }),
              })
            }
            disabled={restore.isPending}
          >
            {restore.isPending ? 'Bringing it back…' : 'Bring back into service'}
          </Button>
        ) : null}
        {canChange ? (
          <div className="flex flex-wrap gap-2">
            <LinkButton to={`/saws/${saw.id}/edit`}>Edit saw</LinkButton>
            <Button variant="danger" onClick={askToRetire} aria-expanded={confirming} aria-controls="retire-confirm">
              Retire…
            </Button>
          </div>
        ) : null}
      </header>

      {confirming ? (
        <Card id="retire-confirm" aria-labelledby="retire-heading" className="border-signal-stop p-5">
          <h2 id="retire-heading" ref={confirmRef} tabIndex={-1} className="text-lg font-bold text-ink">
            Retire {saw.assetTag}?
          </h2>
          <p className="mt-1 text-ink-muted">
            It leaves the lists of saws in use and can no longer be edited. Its records stay for reports.
          </p>
          {retire.isError ? (
            <div className="mt-3">
              <Notice title="The saw was not retired">{retire.error.message}</Notice>
            </div>
          ) : null}
          <div className="mt-4 flex flex-wrap gap-2">
            <Button variant="danger" onClick={onRetire} disabled={retire.isPending}>
              {retire.isPending ? 'Retiring…' : 'Retire saw'}
            </Button>
            <Button onClick={() => setConfirming(false)}>Keep it in use</Button>
          </div>
        </Card>
      ) : null}
      {retire.isSuccess && saw.status === 'retired' ? <Notice tone="info">{saw.assetTag} is retired.</Notice> : null}
      {restore.isError ? <Notice title="The saw was not brought back">{restore.error.message}</Notice> : null}
      {restore.isSuccess && saw.status !== 'retired' ? (
        <Notice tone="info">{saw.assetTag} is back in service.</Notice>
      ) : null}

      {notice ? (
        <Notice tone={notice.tone} title={notice.title}>
          {notice.lines && notice.lines.length > 0 ? (
            <ul className="list-disc pl-5">
              {notice.lines.map((line) => (
                <li key={line}>{line}</li>
              ))}
            </ul>
          ) : null}
        </Notice>
      ) : null}

      <SawStatePanel
        saw={saw}
        timeZone={site.timeZone}
        lastStopEndedAt={lastStopEndedAt}
        slot={
          <>
            {checks.data ? <DueChecksLine items={dueItems} /> : null}
            {canAnswerBreakIn && bladeRun.data ? (
              <BreakInAnswer run={bladeRun.data} onSaved={() => void refreshAfterSawRecord(queryClient, saw)} />
            ) : null}
          </>
        }
        actions={actions.length > 0 ? <SawActionButtons actions={actions} /> : undefined}
      />

      {dueItems.length > 0 ? (
        <DueChecksPanel
          items={dueItems}
          timeZone={site.timeZone}
          canRecord={canRecord}
          footer={
            <Link to={`/sites/${site.id}/checks`} className="font-semibold underline underline-offset-4">
              The site’s list of checks
            </Link>
          }
        />
      ) : null}

      <FollowUpsPanel sawId={saw.id} heading="Follow-ups on this saw" hideWhenEmpty />

      <div className="grid gap-6 lg:grid-cols-[3fr_2fr]">
        <SawTimeline sawId={saw.id} system={site.unitSystem} timeZone={site.timeZone} />
        <div className="space-y-6">
          {recentRuns.isSuccess ? (
            <BladeEconomicsPanel runs={recentRuns.data.items} system={site.unitSystem} currency={site.currency} />
          ) : recentRuns.isError ? (
            <Notice title="Blade life could not be loaded">{recentRuns.error.message}</Notice>
          ) : (
            <p role="status" className="text-ink-muted">
              Loading its recent blades…
            </p>
          )}

          {saw.status !== 'retired' ? (
            <nav aria-label="Figures for the band on this saw" className="grid gap-2 sm:flex sm:flex-wrap">
              <LinkButton to={calculatorHrefForSaw('check-targets', calculatorSaw(saw), site.unitSystem)}>
                Check targets for this band
              </LinkButton>
              <LinkButton to={calculatorHrefForSaw('break-in', calculatorSaw(saw), site.unitSystem)}>
                Break-in plan
              </LinkButton>
              <LinkButton to={calculatorHrefForSaw('band-speed', calculatorSaw(saw), site.unitSystem)}>
                Band speed
              </LinkButton>
            </nav>
          ) : null}
        </div>
      </div>

      <SawDetailPanel saw={saw} unitSystem={site.unitSystem} timeZone={site.timeZone} />
      <SawFiguresPanel
        saw={saw}
        unitSystem={site.unitSystem}
        settings={effectiveSettingsOf(settings?.items ?? [])}
        timeZone={site.timeZone}
      />
    </div>
  );
}
