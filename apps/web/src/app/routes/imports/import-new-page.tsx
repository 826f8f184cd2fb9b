import type { QueryClient } from '@tanstack/react-query';
import { useLoaderData, type LoaderFunctionArgs } from 'react-router-dom';
import { IMPORT_KINDS, type ImportKind } from '@kerfline/domain/imports/fields';
import { ImportWizard } from '../../../features/imports/components/import-wizard';
import { Notice } from '../../../lib/ui/notice';
import { importSites } from './import-site';

export function importNewPageLoader(queryClient: QueryClient) {
  return async ({ request }: LoaderFunctionArgs) => {
    const search = new URL(request.url).searchParams;
    const { sites, chosen } = await importSites(queryClient, search.get('siteId'));
    const kind = search.get('kind');
    return {
      sites: sites.map((s) => ({ id: s.id, name: s.name })),
      siteId: chosen?.id ?? null,
      kind: (IMPORT_KINDS as readonly string[]).includes(kind ?? '') ? (kind as ImportKind) : null,
    };
  };
}

/** The import wizard for one of the sites the person may bring files into. */
export function ImportNewPage() {
  const { sites, siteId, kind } = useLoaderData<Awaited<ReturnType<ReturnType<typeof importNewPageLoader>>>>();
  if (!siteId)
    return <Notice title="No site to bring files into">Imports are for a site’s admins and for administrators.</Notice>;
  return (
    <div className="space-y-6">
      <title>Bring a file in · Kerfline</title>
      <div>
        <h1 className="text-3xl font-extrabold tracking-tight text-ink">Bring a file in</h1>
        <p className="mt-1 text-ink-muted">
          Kerfline reads the file in your browser first; nothing is written until you bring the rows in, and the whole
          import can be taken back out afterwards.
        </p>
      </div>
      <ImportWizard sites={sites} initialSiteId={siteId} initialKind={kind} />
    </div>
  );
}
