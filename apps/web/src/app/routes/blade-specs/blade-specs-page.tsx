import { useLocation, useSearchParams, type LoaderFunctionArgs } from 'react-router-dom';
import { useQuery, useSuspenseQuery, type QueryClient } from '@tanstack/react-query';
import { subject } from '@casl/ability';
import { BLADE_MATERIALS } from '@kerfline/domain/checks/schema';
import { BLADE_MATERIAL_LABELS, type BladeSpec } from '@kerfline/domain/blade-specs/schema';
import type { UnitSystem } from '@kerfline/domain/sites/schema';
import { meQuery } from '../../../features/auth/api/queries';
import { bladeSpecListQuery, parseBladeSpecListQuery } from '../../../features/blade-specs/api/queries';
import { SpecsList } from '../../../features/blade-specs/components/specs-list';
import { parseSiteListQuery, siteListQuery } from '../../../features/sites/api/queries';
import { useAppAbility } from '../../../lib/ability';
import { LinkButton } from '../../../lib/ui/button';
import { FilterBar, FilterSelect } from '../../../lib/ui/filters';
import { Notice } from '../../../lib/ui/notice';
import { returnNoticeOf } from '../records/refresh';

function specQueryOf(search: URLSearchParams) {
  const material = search.get('material');
  return parseBladeSpecListQuery({
    material: material && (BLADE_MATERIALS as readonly string[]).includes(material) ? material : undefined,
    includeArchived: search.get('archived') === 'shown' ? 'true' : 'false',
  });
}

export function bladeSpecsPageLoader(queryClient: QueryClient) {
  return async ({ request }: LoaderFunctionArgs) => {
    const search = new URL(request.url).searchParams;
    await Promise.all([
      queryClient.ensureQueryData(bladeSpecListQuery(specQueryOf(search))),
      queryClient.ensureQueryData(siteListQuery(parseSiteListQuery())).catch(() => undefined),
    ]);
    return null;
  };
}

/** The units the catalogue is shown in: the viewer's own site's, else the units most of their sites use. */
export function catalogueUnits(sites: { id: string; unitSystem: UnitSystem }[], homeSiteId: string | null): UnitSystem {
  const home = sites.find((site) => site.id === homeSiteId);
  if (home) return home.unitSystem;
  const imperial = sites.filter((site) => site.unitSystem === 'imperial').length;
  return imperial > sites.length / 2 ? 'imperial' : 'metric';
}

/**
 * The blade-spec catalogue, `/blade-specs`: the fleet-wide specs kept by administrators and each site's own,
 * kept by its site admin; pitch written the trade's way.
 */
export function BladeSpecsPage() {
  const [search, setSearch] = useSearchParams();
  const q = specQueryOf(search);
  const { data: specs } = useSuspenseQuery(bladeSpecListQuery(q));
  const { data: sites } = useQuery(siteListQuery(parseSiteListQuery()));
  const { data: me } = useSuspenseQuery(meQuery());
  const ability = useAppAbility();
  const notice = returnNoticeOf(useLocation().state);
  const siteName = (siteId: string | null) =>
    siteId === null
      ? 'Every site (fleet-wide)'
      : `${sites?.items.find((site) => site.id === siteId)?.name ?? 'A site'}’s own`;
  const canCreate =
    ability.can('create', subject('BladeSpec', { id: '', siteId: null })) ||
    (me.user.siteId !== null && ability.can('create', subject('BladeSpec', { id: '', siteId: me.user.siteId })));
  const editHref = (spec: BladeSpec) =>
    ability.can('update', subject('BladeSpec', { id: spec.id, siteId: spec.siteId }))
      ? `/blade-specs/${spec.id}/edit`
      : undefined;
  const system = catalogueUnits(sites?.items ?? [], me.user.siteId);
  const setFilter = (key: string, value: string) => {
    const next = new URLSearchParams(search);
    if (value) next.set(key, value);
    else next.delete(key);
    setSearch(next);
  };
  return (
    <div className="space-y-5">
      <title>Blade specs · Kerfline</title>
      <header className="flex flex-wrap items-end justify-between gap-4">
        <div>
          <h1 className="text-3xl font-extrabold tracking-tight text-ink">Blade specs</h1>
          <p className="mt-1 text-ink-muted">
            The blades your sites put on their saws: {specs.total} spec{specs.total === 1 ? '' : 's'}, sizes in{' '}
            {system === 'imperial' ? 'inches' : 'millimetres'}.
          </p>
        </div>
        {canCreate ? (
          <LinkButton to="/blade-specs/new" variant="primary">
            Add blade spec
          </LinkButton>
        ) : null}
      </header>
      {notice ? <Notice tone={notice.tone} title={notice.title} /> : null}
      <FilterBar>
        <FilterSelect
          label="Material"
          value={q.material ?? ''}
          options={BLADE_MATERIALS.map((m) => ({ value: m, label: BLADE_MATERIAL_LABELS[m] }))}
          onChange={(value) => setFilter('material', value)}
          allLabel="Any material"
        />
        <FilterSelect
          label="Archived specs"
          value={search.get('archived') === 'shown' ? 'shown' : ''}
          options={[{ value: 'shown', label: 'Shown too' }]}
          onChange={(value) => setFilter('archived', value)}
          allLabel="Left out"
        />
      </FilterBar>
      <SpecsList specs={specs.items} system={system} ownerName={siteName} editHref={editHref} />
    </div>
  );
}
