import { useQuery, useSuspenseQuery, type QueryClient } from '@tanstack/react-query';
import { Link, useParams, type LoaderFunctionArgs } from 'react-router-dom';
import { subject } from '@casl/ability';
import { useAppAbility } from '../../../lib/ability';
import { SiteRecordsNav } from '../sites/site-records-nav';
import { LinkButton } from '../../../lib/ui/button';
import { ExportButton } from '../../../lib/ui/export-button';
import { useCanExportSite } from '../../../lib/record-export';
import { siteDetailQuery } from '../../../features/sites/api/queries';
import { siteSettingsQuery } from '../../../features/site-settings/api/queries';
import { checkCountsQuery, siteChecksQuery } from '../../../features/checks/api/queries';
import { useAddSiteCheck, useChangeSiteCheck, useSiteCheckAction } from '../../../features/checks/api/mutations';
import { SiteChecksList } from '../../../features/checks/components/site-checks-list';

export function siteChecksPageLoader(queryClient: QueryClient) {
  return async ({ params }: LoaderFunctionArgs) => {
    const siteId = params.siteId ?? '';
    await Promise.all([
      queryClient.ensureQueryData(siteDetailQuery(siteId)),
      queryClient.ensureQueryData(siteChecksQuery(siteId, true)),
      queryClient.ensureQueryData(siteSettingsQuery(siteId)).catch(() => undefined),
      queryClient.ensureQueryData(checkCountsQuery(siteId)).catch(() => undefined),
    ]);
    return null;
  };
}

/** A site's own list of checks: read by whoever reads the site, kept by its admin and administrators. */
export function SiteChecksPage() {
  const siteId = useParams().siteId ?? '';
  const { data: site } = useSuspenseQuery(siteDetailQuery(siteId));
  const { data: list } = useSuspenseQuery(siteChecksQuery(siteId, true));
  const { data: settings } = useQuery(siteSettingsQuery(siteId));
  const { data: counts } = useQuery(checkCountsQuery(siteId));
  const ability = useAppAbility();
  const canEdit = ability.can('update', subject('SiteCheck', { id: '', siteId }));
  const add = useAddSiteCheck(siteId);
  const change = useChangeSiteCheck(siteId);
  const action = useSiteCheckAction(siteId);
  const canExport = useCanExportSite(site);
  const overdue = counts?.items[0]?.overdue ?? 0;
  const due = counts?.items[0]?.due ?? 0;

  return (
    <div className="space-y-6">
      <title>{`Checks · ${site.name} · Kerfline`}</title>
      <nav aria-label="Breadcrumb" className="text-sm text-ink-muted">
        <Link to={`/sites/${site.id}`} className="inline-flex min-h-11 items-center underline-offset-4 hover:underline">
          {site.name}
        </Link>
        <span aria-hidden="true" className="px-2">
          /
        </span>
        <span aria-current="page" className="text-ink">
          Checks
        </span>
      </nav>
      <SiteRecordsNav siteId={site.id} />
      <header className="flex flex-wrap items-end justify-between gap-4">
        <div className="space-y-1">
          <h1 className="text-3xl font-extrabold tracking-tight text-ink">Maintenance checks</h1>
          <p className="max-w-prose text-ink-muted">
            The checks every saw at {site.name} gets. Targets are worked out for each saw and the blade on it; a check
            falls due at each blade change or every so many days.
          </p>
        </div>
        <div className="flex flex-wrap items-center gap-3">
          <LinkButton to={`/sites/${site.id}/checks/overdue`} variant={overdue > 0 ? 'primary' : 'secondary'}>
            {overdue > 0 ? `${overdue} overdue` : due > 0 ? `${due} due now` : 'Due and overdue'}
          </LinkButton>
          {canExport ? (
            <ExportButton
              path={`/check-records/export?siteId=${encodeURIComponent(site.id)}`}
              label="Export checks recorded"
            />
          ) : null}
        </div>
      </header>
      <SiteChecksList
        checks={list.items}
        settings={settings?.items ?? []}
        system={site.unitSystem}
        timeZone={site.timeZone}
        canEdit={canEdit && site.retiredAt === null}
        settingsHref={`/sites/${site.id}/settings`}
        onAdd={(values) => add.mutateAsync(values)}
        onChange={(id, values) => change.mutateAsync({ id, patch: values })}
        onAction={(id, what) => action.mutateAsync({ id, action: what })}
      />
    </div>
  );
}
