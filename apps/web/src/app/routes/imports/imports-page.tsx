import { useSuspenseQuery, type QueryClient } from '@tanstack/react-query';
import { useLoaderData, useNavigate, type LoaderFunctionArgs } from 'react-router-dom';
import { importListQuery, parseImportListQuery } from '../../../features/imports/api/queries';
import { ImportsTable } from '../../../features/imports/components/imports-table';
import { LinkButton } from '../../../lib/ui/button';
import { inputClass } from '../../../lib/ui/field';
import { Notice } from '../../../lib/ui/notice';
import { Pager } from '../../../lib/ui/pager';
import { importSites } from './import-site';

export function importsPageLoader(queryClient: QueryClient) {
  return async ({ request }: LoaderFunctionArgs) => {
    const search = new URL(request.url).searchParams;
    const { sites, chosen } = await importSites(queryClient, search.get('siteId'));
    const q = parseImportListQuery({ siteId: chosen?.id, offset: search.get('offset') ?? undefined });
    if (chosen) await queryClient.ensureQueryData(importListQuery(q));
    return {
      sites: sites.map((s) => ({ id: s.id, name: s.name, timeZone: s.timeZone })),
      chosen: chosen?.id ?? null,
      q,
    };
  };
}

/** A site's imports of legacy files, newest first, and the way to bring another file in. */
export function ImportsPage() {
  const { sites, chosen, q } = useLoaderData<Awaited<ReturnType<ReturnType<typeof importsPageLoader>>>>();
  const navigate = useNavigate();
  if (!chosen)
    return <Notice title="No site to bring files into">Imports are for a site’s admins and for administrators.</Notice>;
  const site = sites.find((s) => s.id === chosen)!;
  return (
    <div className="space-y-6">
      <title>{`Imports · ${site.name} · Kerfline`}</title>
      <div className="flex flex-wrap items-end justify-between gap-4">
        <div>
          <h1 className="text-3xl font-extrabold tracking-tight text-ink">Imports</h1>
          <p className="mt-1 text-ink-muted">
            Years of saw lists, blade and stop logs kept in spreadsheets, brought into {site.name}. Each import can be
            taken back out.
          </p>
        </div>
        <LinkButton variant="primary" to={`/imports/new?siteId=${chosen}`}>
          Bring a file in
        </LinkButton>
      </div>
      {sites.length > 1 ? (
        <div className="max-w-sm">
          <label htmlFor="imports-site" className="block text-sm font-semibold text-ink">
            Site
          </label>
          <select
            id="imports-site"
            className={`${inputClass} mt-1`}
            value={chosen}
            onChange={(e) => void navigate(`/imports?siteId=${e.target.value}`)}
          >
            {sites.map((s) => (
              <option key={s.id} value={s.id}>
                {s.name}
              </option>
            ))}
          </select>
        </div>
      ) : null}
      <ImportsList q={q} timeZone={site.timeZone} />
    </div>
  );
}

function ImportsList({ q, timeZone }: { q: ReturnType<typeof parseImportListQuery>; timeZone: string }) {
  const { data } = useSuspenseQuery(importListQuery(q));
  return (
    <div className="space-y-3">
      <ImportsTable batches={data.items} timeZone={timeZone} />
      <Pager total={data.total} limit={data.limit} offset={data.offset} noun="imports" />
    </div>
  );
}
