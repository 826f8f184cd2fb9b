import { useNavigate, useParams, type LoaderFunctionArgs } from 'react-router-dom';
import { useQueryClient, useSuspenseQuery, type QueryClient } from '@tanstack/react-query';
import { sawDetailQuery } from '../../../features/saws/api/queries';
import { siteDetailQuery } from '../../../features/sites/api/queries';
import { useEndStop } from '../../../features/stops/api/mutations';
import { EndStopForm } from '../../../features/stops/components/end-stop-form';
import { LinkButton } from '../../../lib/ui/button';
import { Notice } from '../../../lib/ui/notice';
import { refreshAfterSawRecord } from '../records/refresh';
import { SawFormFrame } from './saw-form-frame';

export function stopEndPageLoader(queryClient: QueryClient) {
  return async ({ params }: LoaderFunctionArgs) => {
    const saw = await queryClient.ensureQueryData(sawDetailQuery(params.sawId ?? ''));
    await queryClient.ensureQueryData(siteDetailQuery(saw.siteId));
    return null;
  };
}

/** Ending the saw's open stop: `/saws/:sawId/stop-end`. */
export function StopEndPage() {
  const sawId = useParams().sawId ?? '';
  const navigate = useNavigate();
  const queryClient = useQueryClient();
  const { data: saw } = useSuspenseQuery(sawDetailQuery(sawId));
  const { data: site } = useSuspenseQuery(siteDetailQuery(saw.siteId));
  const endStop = useEndStop();
  return (
    <SawFormFrame saw={saw} site={site} title="End the stop">
      {!saw.down ? (
        <Notice tone="info" title={`${saw.assetTag} is not down`}>
          No stop is open on this saw.
          <div className="mt-2">
            <LinkButton to={`/saws/${saw.id}`} variant="primary">
              Back to the saw
            </LinkButton>
          </div>
        </Notice>
      ) : (
        <EndStopForm
          stop={{
            id: saw.down.stopId,
            startedAt: saw.down.since,
            category: saw.down.category,
            planned: saw.down.planned,
          }}
          timeZone={site.timeZone}
          onSubmit={async (endedAt) => {
            await endStop.mutateAsync({ stopId: saw.down!.stopId, endedAt });
            await refreshAfterSawRecord(queryClient, saw);
            await navigate(`/saws/${saw.id}`, {
              state: { notice: { tone: 'info', title: `${saw.assetTag} is running again.` } },
            });
          }}
          cancel={<LinkButton to={`/saws/${saw.id}`}>Cancel</LinkButton>}
        />
      )}
    </SawFormFrame>
  );
}
