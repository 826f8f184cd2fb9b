import { redirect, useNavigate, useSearchParams, type LoaderFunctionArgs } from 'react-router-dom';
import { useQueryClient, useSuspenseQuery, type QueryClient } from '@tanstack/react-query';
import { idSchema } from '@kerfline/domain/common/schema';
import { newSawSubject, useAppAbility } from '../../../lib/ability';
import { LinkButton } from '../../../lib/ui/button';
import { Card } from '../../../lib/ui/card';
import { Notice } from '../../../lib/ui/notice';
import { useCreateSaw } from '../../../features/saws/api/mutations';
import { SawForm } from '../../../features/saws/components/saw-form';
import { siteDetailQuery } from '../../../features/sites/api/queries';
import { siteKeys } from '../../../features/sites/api/keys';
import { UNIT_SYSTEM_LABELS } from '../../../features/sites/components/site-tiles';

export function sawNewPageLoader(queryClient: QueryClient) {
  return async ({ request }: LoaderFunctionArgs) => {
    const siteId = idSchema.safeParse(new URL(request.url).searchParams.get('siteId'));
    // A saw always belongs to a site; without one, the user picks a site first.
    if (!siteId.success) throw redirect('/sites');
    await queryClient.ensureQueryData(siteDetailQuery(siteId.data));
    return null;
  };
}

export function SawNewPage() {
  const [search] = useSearchParams();
  const siteId = search.get('siteId') ?? '';
  const { data: site } = useSuspenseQuery(siteDetailQuery(siteId));
  const ability = useAppAbility();
  const create = useCreateSaw();
  const queryClient = useQueryClient();
  const navigate = useNavigate();
  const cancel = (
    <LinkButton to={`/sites/${site.id}`} variant="quiet">
      Cancel
    </LinkButton>
  );

  return (
    <div className="mx-auto max-w-3xl space-y-6">
      <title>{`Add a saw · ${site.name} · Kerfline`}</title>
      <div>
        <h1 className="text-3xl font-extrabold tracking-tight text-ink">Add a saw</h1>
        <p className="mt-1 text-ink-muted">
          At {site.name}. Measurements in {UNIT_SYSTEM_LABELS[site.unitSystem].toLowerCase()}, the site's units.
        </p>
      </div>
      {ability.can('create', newSawSubject(site.id)) ? (
        <Card className="p-5 sm:p-6">
          <SawForm
            siteId={site.id}
            unitSystem={site.unitSystem}
            submitLabel="Add saw"
            cancel={cancel}
            onSubmit={async (input) => {
              const saw = await create.mutateAsync(input);
              // The new saw counts towards the site's saws in use.
              void queryClient.invalidateQueries({ queryKey: siteKeys.detail(site.id) });
              void queryClient.invalidateQueries({ queryKey: siteKeys.lists() });
              await navigate(`/saws/${saw.id}`);
            }}
          />
        </Card>
      ) : (
        <Notice title="Not for your role">Only an administrator or this site's admin can add saws here.</Notice>
      )}
    </div>
  );
}
