import { useNavigate, useParams, type LoaderFunctionArgs } from 'react-router-dom';
import { useQueryClient, useSuspenseQuery, type QueryClient } from '@tanstack/react-query';
import { STOP_CATEGORY_LABELS } from '@kerfline/domain/stops/schema';
import { sawDetailQuery } from '../../../features/saws/api/queries';
import { siteDetailQuery } from '../../../features/sites/api/queries';
import { useLogStop } from '../../../features/stops/api/mutations';
import { StopForm } from '../../../features/stops/components/stop-form';
import { LinkButton } from '../../../lib/ui/button';
import { refreshAfterSawRecord } from '../records/refresh';
import { SawFormFrame } from './saw-form-frame';

export function stopNewPageLoader(queryClient: QueryClient) {
  return async ({ params }: LoaderFunctionArgs) => {
    const saw = await queryClient.ensureQueryData(sawDetailQuery(params.sawId ?? ''));
    await queryClient.ensureQueryData(siteDetailQuery(saw.siteId));
    return null;
  };
}

/** Logging a stop at a saw: `/saws/:sawId/stops/new`. */
export function StopNewPage() {
  const sawId = useParams().sawId ?? '';
  const navigate = useNavigate();
  const queryClient = useQueryClient();
  const { data: saw } = useSuspenseQuery(sawDetailQuery(sawId));
  const { data: site } = useSuspenseQuery(siteDetailQuery(saw.siteId));
  const logStop = useLogStop();
  return (
    <SawFormFrame saw={saw} site={site} title="Log a stop">
      <StopForm
        sawId={saw.id}
        timeZone={site.timeZone}
        onSubmit={async (input) => {
          const stop = await logStop.mutateAsync(input);
          await refreshAfterSawRecord(queryClient, saw);
          await navigate(`/saws/${saw.id}`, {
            state: {
              notice: {
                tone: 'info',
                title: stop.endedAt
                  ? `Stop logged: ${STOP_CATEGORY_LABELS[stop.category].toLowerCase()}.`
                  : `${saw.assetTag} is down: ${STOP_CATEGORY_LABELS[stop.category].toLowerCase()}.`,
              },
            },
          });
        }}
        cancel={<LinkButton to={`/saws/${saw.id}`}>Cancel</LinkButton>}
      />
    </SawFormFrame>
  );
}
