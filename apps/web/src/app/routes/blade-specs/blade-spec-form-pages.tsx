import { Link, useNavigate, useParams, type LoaderFunctionArgs } from 'react-router-dom';
import { useSuspenseQuery, type QueryClient } from '@tanstack/react-query';
import { subject } from '@casl/ability';
import { meQuery } from '../../../features/auth/api/queries';
import { bladeSpecDetailQuery } from '../../../features/blade-specs/api/queries';
import { useCreateBladeSpec, useUpdateBladeSpec } from '../../../features/blade-specs/api/mutations';
import { SpecForm } from '../../../features/blade-specs/components/spec-form';
import { parseSiteListQuery, siteListQuery } from '../../../features/sites/api/queries';
import { useAppAbility } from '../../../lib/ability';
import { LinkButton } from '../../../lib/ui/button';
import { catalogueUnits } from './blade-specs-page';

export function bladeSpecNewPageLoader(queryClient: QueryClient) {
  return async () => {
    await queryClient.ensureQueryData(siteListQuery(parseSiteListQuery()));
    return null;
  };
}

export function bladeSpecEditPageLoader(queryClient: QueryClient) {
  return async ({ params }: LoaderFunctionArgs) => {
    await Promise.all([
      queryClient.ensureQueryData(bladeSpecDetailQuery(params.specId ?? '')),
      queryClient.ensureQueryData(siteListQuery(parseSiteListQuery())),
    ]);
    return null;
  };
}

function Frame({ title, children }: { title: string; children: React.ReactNode }) {
  return (
    <div className="mx-auto max-w-3xl space-y-5">
      <title>{`${title} · Kerfline`}</title>
      <nav aria-label="Breadcrumb" className="text-sm text-ink-muted">
        <Link to="/blade-specs" className="inline-flex min-h-11 items-center underline-offset-4 hover:underline">
          Blade specs
        </Link>
      </nav>
      <h1 className="text-3xl font-extrabold tracking-tight text-ink">{title}</h1>
      {children}
    </div>
  );
}

/** Adding a blade spec, `/blade-specs/new`: administrators for the fleet or a site, site admins for their site. */
export function BladeSpecNewPage() {
  const navigate = useNavigate();
  const ability = useAppAbility();
  const { data: me } = useSuspenseQuery(meQuery());
  const { data: sites } = useSuspenseQuery(siteListQuery(parseSiteListQuery()));
  const create = useCreateBladeSpec();
  const choices = [
    ...(ability.can('create', subject('BladeSpec', { id: '', siteId: null }))
      ? [{ value: '', label: 'Every site (fleet-wide catalogue)' }]
      : []),
    ...sites.items
      .filter((site) => ability.can('create', subject('BladeSpec', { id: '', siteId: site.id })))
      .map((site) => ({ value: site.id, label: `${site.name} only` })),
  ];
  const home = sites.items.find((site) => site.id === me.user.siteId);
  return (
    <Frame title="Add a blade spec">
      <SpecForm
        system={catalogueUnits(sites.items, me.user.siteId)}
        ownerChoices={choices}
        defaultOwner={choices[0]?.value ?? ''}
        defaultCurrency={home?.currency ?? sites.items[0]?.currency ?? 'USD'}
        submitLabel="Add blade spec"
        onSubmit={async (input) => {
          const spec = await create.mutateAsync(input);
          await navigate('/blade-specs', { state: { notice: { tone: 'info', title: `${spec.name} added.` } } });
        }}
        cancel={<LinkButton to="/blade-specs">Cancel</LinkButton>}
      />
    </Frame>
  );
}

/** Changing a blade spec, `/blade-specs/:specId/edit`; archiving stops offering it without touching its records. */
export function BladeSpecEditPage() {
  const specId = useParams().specId ?? '';
  const navigate = useNavigate();
  const { data: me } = useSuspenseQuery(meQuery());
  const { data: spec } = useSuspenseQuery(bladeSpecDetailQuery(specId));
  const { data: sites } = useSuspenseQuery(siteListQuery(parseSiteListQuery()));
  const update = useUpdateBladeSpec(specId);
  const owner =
    spec.siteId === null
      ? 'Every site (fleet-wide catalogue)'
      : `${sites.items.find((s) => s.id === spec.siteId)?.name ?? 'A site'} only`;
  return (
    <Frame title={`Change ${spec.name}`}>
      <p className="text-ink-muted">Offered to: {owner}</p>
      <SpecForm
        system={catalogueUnits(sites.items, me.user.siteId)}
        spec={spec}
        ownerChoices={[{ value: spec.siteId ?? '', label: owner }]}
        defaultOwner={spec.siteId ?? ''}
        defaultCurrency={spec.currency}
        submitLabel="Save changes"
        onSubmit={async (input) => {
          const { siteId: _owner, ...changes } = input;
          const saved = await update.mutateAsync(changes);
          await navigate('/blade-specs', { state: { notice: { tone: 'info', title: `${saved.name} saved.` } } });
        }}
        cancel={<LinkButton to="/blade-specs">Cancel</LinkButton>}
      />
    </Frame>
  );
}
