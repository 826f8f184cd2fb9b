import { useNavigate, useParams, useSearchParams, type LoaderFunctionArgs } from 'react-router-dom';
import { useQueryClient, useSuspenseQuery, type QueryClient } from '@tanstack/react-query';
import { sawDetailQuery } from '../../../features/saws/api/queries';
import { siteDetailQuery } from '../../../features/sites/api/queries';
import { BladeOffForm } from '../../../features/blade-runs/components/blade-off-form';
import { LinkButton } from '../../../lib/ui/button';
import { Notice } from '../../../lib/ui/notice';
import { refreshAfterSawRecord, type ReturnNotice } from '../records/refresh';
import { SawFormFrame } from './saw-form-frame';

export function bladeOffPageLoader(queryClient: QueryClient) {
  return async ({ params }: LoaderFunctionArgs) => {
    const saw = await queryClient.ensureQueryData(sawDetailQuery(params.sawId ?? ''));
    await queryClient.ensureQueryData(siteDetailQuery(saw.siteId));
    return null;
  };
}

/**
 * Taking the blade off a saw: `/saws/:sawId/blade-off`; with `?next=on` (Change blade) the put-on form follows.
 */
export function BladeOffPage() {
  const sawId = useParams().sawId ?? '';
  const [search] = useSearchParams();
  const changing = search.get('next') === 'on';
  const navigate = useNavigate();
  const queryClient = useQueryClient();
  const { data: saw } = useSuspenseQuery(sawDetailQuery(sawId));
  const { data: site } = useSuspenseQuery(siteDetailQuery(saw.siteId));
  const blade = saw.bladeOn;

  return (
    <SawFormFrame saw={saw} site={site} title={changing ? 'Change blade: take the old one off' : 'Take the blade off'}>
      {changing ? <p className="text-ink-muted">Step 1 of 2. Next: put the new blade on.</p> : null}
      {!blade ? (
        <Notice tone="info" title="No blade is recorded on this saw">
          {changing ? 'Go straight on to putting the new blade on.' : 'There is nothing to take off.'}
          <div className="mt-2">
            <LinkButton to={changing ? `/saws/${saw.id}/blade-on` : `/saws/${saw.id}`} variant="primary">
              {changing ? 'Put a blade on' : 'Back to the saw'}
            </LinkButton>
          </div>
        </Notice>
      ) : (
        <BladeOffForm
          run={{ id: blade.runId, installedAt: blade.since, bladeSpecName: blade.bladeSpecName }}
          system={site.unitSystem}
          timeZone={site.timeZone}
          submitLabel={changing ? 'Take it off, then put the new one on' : 'Take blade off'}
          onDone={async (run, outcome) => {
            await refreshAfterSawRecord(queryClient, saw);
            const notice: ReturnNotice = {
              tone: outcome.photoFailures > 0 ? 'caution' : 'info',
              title: `${run.bladeSpecName} is off ${saw.assetTag}.`,
              lines:
                outcome.photoFailures > 0
                  ? [`${outcome.photoFailures} photo(s) were not sent; add them from the blade’s page.`]
                  : [],
            };
            await navigate(changing ? `/saws/${saw.id}/blade-on` : `/saws/${saw.id}`, { state: { notice } });
          }}
          cancel={<LinkButton to={`/saws/${saw.id}`}>Cancel</LinkButton>}
        />
      )}
    </SawFormFrame>
  );
}
