import { useSuspenseQuery, type QueryClient } from '@tanstack/react-query';
import { Link, useParams, type LoaderFunctionArgs } from 'react-router-dom';
import { importDetailQuery } from '../../../features/imports/api/queries';
import { BatchCard } from '../../../features/imports/components/batch-card';
import { siteDetailQuery } from '../../../features/sites/api/queries';

export function importPageLoader(queryClient: QueryClient) {
  return async ({ params }: LoaderFunctionArgs) => {
    const batch = await queryClient.ensureQueryData(importDetailQuery(params.importId ?? ''));
    await queryClient.ensureQueryData(siteDetailQuery(batch.siteId));
    return null;
  };
}

/** One import: its counts, its rejected rows, and taking it back out. */
export function ImportPage() {
  const id = useParams().importId ?? '';
  const { data: batch } = useSuspenseQuery(importDetailQuery(id));
  const { data: site } = useSuspenseQuery(siteDetailQuery(batch.siteId));
  return (
    <div className="space-y-6">
      <title>{`${batch.fileName} · Imports · Kerfline`}</title>
      <div>
        <Link
          to={`/imports?siteId=${site.id}`}
          className="inline-flex min-h-11 items-center font-semibold text-accent-dark underline underline-offset-4"
        >
          Imports of {site.name}
        </Link>
        <h1 className="text-3xl font-extrabold tracking-tight text-ink">Import</h1>
      </div>
      <BatchCard batch={batch} timeZone={site.timeZone} />
    </div>
  );
}
