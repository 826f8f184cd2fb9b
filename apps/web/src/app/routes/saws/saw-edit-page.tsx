import { useNavigate, useParams, type LoaderFunctionArgs } from 'react-router-dom';
import { useSuspenseQuery, type QueryClient } from '@tanstack/react-query';
import { subject } from '@casl/ability';
import type { SawUpdate } from '@kerfline/domain/saws/schema';
import { useAppAbility } from '../../../lib/ability';
import { LinkButton } from '../../../lib/ui/button';
import { Card } from '../../../lib/ui/card';
import { Notice } from '../../../lib/ui/notice';
import { sawDetailQuery } from '../../../features/saws/api/queries';
import { useUpdateSaw } from '../../../features/saws/api/mutations';
import { SawForm } from '../../../features/saws/components/saw-form';
import { siteDetailQuery } from '../../../features/sites/api/queries';
import { UNIT_SYSTEM_LABELS } from '../../../features/sites/components/site-tiles';

export function sawEditPageLoader(queryClient: QueryClient) {
  return async ({ params }: LoaderFunctionArgs) => {
    const saw = await queryClient.ensureQueryData(sawDetailQuery(params.sawId ?? ''));
    await queryClient.ensureQueryData(siteDetailQuery(saw.siteId));
    return null;
  };
}

export function SawEditPage() {
  const sawId = useParams().sawId ?? '';
  const { data: saw } = useSuspenseQuery(sawDetailQuery(sawId));
  const { data: site } = useSuspenseQuery(siteDetailQuery(saw.siteId));
  const ability = useAppAbility();
  const update = useUpdateSaw(saw.id);
  const navigate = useNavigate();
  const back = `/saws/${saw.id}`;

  let body;
  if (saw.status === 'retired') {
    body = <Notice title="This saw is retired">A retired saw is kept for its history and cannot be edited.</Notice>;
  } else if (!ability.can('update', subject('Saw', { id: saw.id, siteId: saw.siteId }))) {
    body = <Notice title="Not for your role">Only an administrator or this site's admin can edit its saws.</Notice>;
  } else {
    body = (
      <Card className="p-5 sm:p-6">
        <SawForm
          siteId={site.id}
          unitSystem={site.unitSystem}
          saw={saw}
          submitLabel="Save changes"
          cancel={
            <LinkButton to={back} variant="quiet">
              Cancel
            </LinkButton>
          }
          onSubmit={async (input, changed) => {
            if (changed.length > 0) {
              const patch: Record<string, unknown> = {};
              for (const field of changed) patch[field] = input[field];
              await update.mutateAsync(patch as SawUpdate);
            }
            await navigate(back);
          }}
        />
      </Card>
    );
  }

  return (
    <div className="mx-auto max-w-3xl space-y-6">
      <title>{`Edit ${saw.assetTag} · Kerfline`}</title>
      <div>
        <h1 className="text-3xl font-extrabold tracking-tight text-ink">
          Edit <span className="tabular">{saw.assetTag}</span>
        </h1>
        <p className="mt-1 text-ink-muted">
          {saw.name} at {site.name}. Measurements in {UNIT_SYSTEM_LABELS[site.unitSystem].toLowerCase()}.
        </p>
      </div>
      {body}
    </div>
  );
}
