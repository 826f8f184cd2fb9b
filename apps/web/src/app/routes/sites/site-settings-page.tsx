import { Link, useParams, useSearchParams, type LoaderFunctionArgs } from 'react-router-dom';
import { useQuery, useQueryClient, useSuspenseQuery, type QueryClient } from '@tanstack/react-query';
import { subject } from '@casl/ability';
import { SITE_SETTINGS, type SiteSettingDefinition } from '@kerfline/domain/settings/registry';
import type { SiteSetting } from '@kerfline/domain/settings/schema';
import { abilityFromMeRules, useAppAbility } from '../../../lib/ability';
import { Card } from '../../../lib/ui/card';
import { Pager } from '../../../lib/ui/pager';
import { meQuery } from '../../../features/auth/api/queries';
import { auditKeys } from '../../../features/audit/api/keys';
import { auditListQuery, parseAuditListQuery } from '../../../features/audit/api/queries';
import { siteDetailQuery } from '../../../features/sites/api/queries';
import { siteSettingsQuery } from '../../../features/site-settings/api/queries';
import { useChangeSiteSetting, useResetSiteSetting } from '../../../features/site-settings/api/mutations';
import { SettingCard } from '../../../features/site-settings/components/setting-card';
import { SettingsHistory } from '../../../features/site-settings/components/settings-history';

/** Titles of the settings' groups; a group the registry adds later shows under its own id until named here. */
const GROUP_TITLES: Partial<Record<string, string>> = {
  band_speed: 'Band speed by material',
  band_tension: 'Band tension by blade material',
  checks: 'Maintenance check limits',
  blades: 'New blades and pitch',
};

const HISTORY_PAGE = 20;

/** The history of this site's settings, from `?offset=` (newest first). */
function historyQuery(siteId: string, search: URLSearchParams) {
  const offset = Number(search.get('offset') ?? '0');
  return parseAuditListQuery({
    siteId,
    entity: 'SiteSetting',
    limit: HISTORY_PAGE,
    offset: Number.isInteger(offset) && offset >= 0 ? offset : 0,
  });
}

const canReadHistory = (ability: ReturnType<typeof abilityFromMeRules>, siteId: string) =>
  ability.can('read', subject('AuditEntry', { id: '', siteId }));

export function siteSettingsPageLoader(queryClient: QueryClient) {
  return async ({ params, request }: LoaderFunctionArgs) => {
    const siteId = params.siteId ?? '';
    const me = await queryClient.ensureQueryData(meQuery());
    const search = new URL(request.url).searchParams;
    await Promise.all([
      queryClient.ensureQueryData(siteDetailQuery(siteId)),
      queryClient.ensureQueryData(siteSettingsQuery(siteId)),
      canReadHistory(abilityFromMeRules(me.rules), siteId)
        ? queryClient.ensureQueryData(auditListQuery(historyQuery(siteId, search))).catch(() => undefined)
        : undefined,
    ]);
    return null;
  };
}

/** The registry's settings in its order, grouped, each with the site's entry. */
function groups(items: readonly SiteSetting[]) {
  const found = new Map<string, { def: SiteSettingDefinition; setting: SiteSetting }[]>();
  for (const def of SITE_SETTINGS) {
    const setting = items.find((item) => item.key === def.key);
    if (!setting) continue;
    found.set(def.group, [...(found.get(def.group) ?? []), { def, setting }]);
  }
  return [...found.entries()];
}

/**
 * A site's settings: the figures the trade has no single printed value for. Everyone who reads the site reads
 * them, with where each value comes from; its admin (and administrators) change them or put Kerfline's back.
 */
export function SiteSettingsPage() {
  const siteId = useParams().siteId ?? '';
  const [search] = useSearchParams();
  const { data: site } = useSuspenseQuery(siteDetailQuery(siteId));
  const { data: settings } = useSuspenseQuery(siteSettingsQuery(siteId));
  const ability = useAppAbility();
  const queryClient = useQueryClient();
  const change = useChangeSiteSetting(siteId);
  const reset = useResetSiteSetting(siteId);
  const showHistory = canReadHistory(ability, siteId);
  const history = useQuery({ ...auditListQuery(historyQuery(siteId, search)), enabled: showHistory });
  const canChange = ability.can('update', subject('SiteSetting', { id: '', siteId }));

  // A change shows in the history at once.
  const refreshHistory = () => queryClient.invalidateQueries({ queryKey: auditKeys.lists() });

  return (
    <div className="space-y-6">
      <title>{`Settings · ${site.name} · Kerfline`}</title>
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
          Settings
        </span>
      </nav>
      <div>
        <h1 className="text-3xl font-extrabold tracking-tight text-ink">Site settings</h1>
        <p className="mt-1 max-w-prose text-ink-muted">
          Figures the trade has no single printed value for. Kerfline starts each at a common shop value;{' '}
          {canChange ? 'you can set' : 'the site’s admin can set'} {site.name}’s own. Every screen that uses one says
          whose it is. A blade maker’s own figure for a blade comes first.
        </p>
      </div>

      {groups(settings.items).map(([group, entries]) => (
        <Card key={group} aria-label={GROUP_TITLES[group] ?? group} className="px-4 py-4 sm:px-6">
          <h2 className="pb-3 text-sm font-bold tracking-wider text-ink-muted uppercase">
            {GROUP_TITLES[group] ?? group}
          </h2>
          <div className="divide-y divide-rule">
            {entries.map(({ def, setting }) => (
              <SettingCard
                key={def.key}
                def={def}
                setting={setting}
                system={site.unitSystem}
                timeZone={site.timeZone}
                canChange={canChange}
                onSave={async (value) => {
                  await change.mutateAsync({ key: def.key, value });
                  await refreshHistory();
                }}
                onReset={async () => {
                  await reset.mutateAsync(def.key);
                  await refreshHistory();
                }}
              />
            ))}
          </div>
        </Card>
      ))}

      {showHistory ? (
        <Card aria-label="Changes to these settings" className="space-y-4 px-4 py-4 sm:px-6">
          <h2 className="text-sm font-bold tracking-wider text-ink-muted uppercase">Changes to these settings</h2>
          {history.data ? (
            <>
              <SettingsHistory entries={history.data.items} system={site.unitSystem} timeZone={site.timeZone} />
              <Pager
                total={history.data.total}
                limit={history.data.limit}
                offset={history.data.offset}
                noun="changes"
              />
            </>
          ) : history.isError ? (
            <p className="text-ink-muted">The history could not be loaded.</p>
          ) : (
            <p role="status" className="text-ink-muted">
              Loading the history…
            </p>
          )}
        </Card>
      ) : null}
    </div>
  );
}
