import { useParams, type LoaderFunctionArgs } from 'react-router-dom';
import { useQuery, useQueryClient, useSuspenseQuery, type QueryClient } from '@tanstack/react-query';
import { sawDetailQuery } from '../../../features/saws/api/queries';
import { siteDetailQuery } from '../../../features/sites/api/queries';
import { bladeRunDetailQuery } from '../../../features/blade-runs/api/queries';
import { useLogCut } from '../../../features/cut-logs/api/mutations';
import { CutLogForm } from '../../../features/cut-logs/components/cut-log-form';
import { LinkButton } from '../../../lib/ui/button';
import { refreshAfterSawRecord } from '../records/refresh';
import { SawFormFrame } from './saw-form-frame';

export function cutLogNewPageLoader(queryClient: QueryClient) {
  return async ({ params }: LoaderFunctionArgs) => {
    const saw = await queryClient.ensureQueryData(sawDetailQuery(params.sawId ?? ''));
    await queryClient.ensureQueryData(siteDetailQuery(saw.siteId));
    return null;
  };
}

/** Logging a cut at a saw: `/saws/:sawId/cut-logs/new`. */
export function CutLogNewPage() {
  const sawId = useParams().sawId ?? '';
  const queryClient = useQueryClient();
  const { data: saw } = useSuspenseQuery(sawDetailQuery(sawId));
  const { data: site } = useSuspenseQuery(siteDetailQuery(saw.siteId));
  const run = useQuery({ ...bladeRunDetailQuery(saw.bladeOn?.runId ?? ''), enabled: saw.bladeOn !== null });
  const logCut = useLogCut();
  if (saw.bladeOn && run.isPending) return <p role="status">Loading…</p>;
  return (
    <SawFormFrame saw={saw} site={site} title="Log a cut">
      <CutLogForm
        sawId={saw.id}
        system={site.unitSystem}
        timeZone={site.timeZone}
        materialGroup={run.data?.materialGroup ?? null}
        onSubmit={async (input) => {
          const log = await logCut.mutateAsync(input);
          await refreshAfterSawRecord(queryClient, saw);
          return log;
        }}
        cancel={<LinkButton to={`/saws/${saw.id}`}>Back to the saw</LinkButton>}
      />
    </SawFormFrame>
  );
}
