import { useQuery, useSuspenseQuery, type QueryClient } from '@tanstack/react-query';
import { Link, useParams, type LoaderFunctionArgs } from 'react-router-dom';
import { peerValueText } from '@kerfline/domain/outliers/peer-review';
import { followUpDetailQuery } from '../../../features/follow-ups/api/queries';
import { FollowUpDetail } from '../../../features/follow-ups/components/follow-up-detail';
import { siteDetailQuery } from '../../../features/sites/api/queries';

export function followUpLoader(queryClient: QueryClient) {
  return async ({ params }: LoaderFunctionArgs) => {
    await queryClient.ensureQueryData(followUpDetailQuery(params.followUpId!));
    return null;
  };
}

export function FollowUpPage() {
  const { followUpId } = useParams();
  const { data } = useSuspenseQuery(followUpDetailQuery(followUpId!));
  const site = useQuery(siteDetailQuery(data.siteId));
  const units = site.data?.unitSystem ?? 'metric';
  return (
    <div className="space-y-6">
      <title>{`${data.title} · Kerfline`}</title>
      <nav aria-label="Breadcrumb" className="text-sm">
        <Link
          to="/follow-ups"
          className="inline-flex min-h-11 items-center font-semibold underline decoration-accent underline-offset-4"
        >
          Follow-ups
        </Link>
      </nav>
      <h1 className="text-3xl font-extrabold tracking-tight text-ink">{data.title}</h1>
      <FollowUpDetail
        key={data.updatedAt}
        followUp={data}
        timeZone={site.data?.timeZone ?? 'UTC'}
        flagValue={(flag) =>
          `This saw: ${peerValueText(flag.metric, flag.value, flag.reportingCurrency, units)}${
            flag.peerMedian === null
              ? ''
              : `; peer median ${peerValueText(flag.metric, flag.peerMedian, flag.reportingCurrency, units)}`
          } (${flag.peerCount} comparable saws).`
        }
      />
    </div>
  );
}
