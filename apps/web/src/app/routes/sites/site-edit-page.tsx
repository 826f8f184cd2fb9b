import { useState } from 'react';
import { Link, useNavigate, useParams, type LoaderFunctionArgs } from 'react-router-dom';
import { subject } from '@casl/ability';
import { useSuspenseQuery, type QueryClient } from '@tanstack/react-query';
import type { Site, SiteCreate, SiteUpdate } from '@kerfline/domain/sites/schema';
import { useAppAbility } from '../../../lib/ability';
import { Button, LinkButton } from '../../../lib/ui/button';
import { Card } from '../../../lib/ui/card';
import { Notice } from '../../../lib/ui/notice';
import { siteDetailQuery } from '../../../features/sites/api/queries';
import { useSetSiteRetired, useUpdateSite } from '../../../features/sites/api/mutations';
import { SiteForm, siteFormValuesOf } from '../../../features/sites/components/site-form';
import { regionListQuery } from '../../../features/regions/api/queries';
import { useRenameRegion } from '../../../features/regions/api/mutations';
import { RegionForm } from '../../../features/regions/components/region-form';

export function siteEditPageLoader(queryClient: QueryClient) {
  return async ({ params }: LoaderFunctionArgs) => {
    await Promise.all([
      queryClient.ensureQueryData(siteDetailQuery(params.siteId ?? '')),
      queryClient.ensureQueryData(regionListQuery()),
    ]);
    return null;
  };
}

/** Only what changed is sent; the code never changes, and the region only when the editor may move the site. */
function patchOf(site: Site, input: SiteCreate, mayMove: boolean): SiteUpdate {
  const patch: SiteUpdate = {};
  if (input.name !== site.name) patch.name = input.name;
  if ((input.city ?? null) !== site.city) patch.city = input.city ?? null;
  if (input.timeZone !== site.timeZone) patch.timeZone = input.timeZone;
  if (input.currency.toUpperCase() !== site.currency) patch.currency = input.currency;
  if (input.unitSystem !== site.unitSystem) patch.unitSystem = input.unitSystem;
  if (mayMove && input.regionId !== site.regionId) patch.regionId = input.regionId;
  return patch;
}

function Retirement({ site }: { site: Site }) {
  const setRetired = useSetSiteRetired(site.id);
  const [confirming, setConfirming] = useState(false);
  return (
    <Card aria-labelledby="retire-heading" className="space-y-3 p-5 sm:p-6">
      <h2 id="retire-heading" className="text-lg font-bold text-ink">
        {site.retiredAt ? 'Retired site' : 'Retire the site'}
      </h2>
      {setRetired.isError ? <Notice>{setRetired.error.message}</Notice> : null}
      {site.retiredAt ? (
        <>
          <p className="text-sm text-ink">
            Retired on {new Date(site.retiredAt).toLocaleDateString('en-GB', { dateStyle: 'medium' })}. Its saws, people
            and records are kept; it is left out of lists and pickers.
          </p>
          <Button disabled={setRetired.isPending} onClick={() => setRetired.mutate(false)}>
            Bring back into use
          </Button>
        </>
      ) : confirming ? (
        <div className="space-y-3 rounded-sheet border-l-4 border-signal-stop bg-signal-stop-soft px-4 py-3">
          <p className="font-bold text-signal-stop">Retire {site.name}?</p>
          <p className="text-sm text-ink">
            It leaves lists and pickers and cannot be changed until it is brought back. Nothing is deleted: its saws,
            people and history stay readable.
          </p>
          <div className="flex flex-wrap gap-2">
            <Button variant="danger" disabled={setRetired.isPending} onClick={() => setRetired.mutate(true)}>
              Yes, retire it
            </Button>
            <Button variant="quiet" onClick={() => setConfirming(false)}>
              Keep it in use
            </Button>
          </div>
        </div>
      ) : (
        <>
          <p className="text-sm text-ink-muted">For a plant that has closed or been sold. Its history stays.</p>
          <Button variant="danger" onClick={() => setConfirming(true)}>
            Retire…
          </Button>
        </>
      )}
    </Card>
  );
}

function RenameRegion({ regionId, name }: { regionId: string; name: string }) {
  const rename = useRenameRegion(regionId);
  return (
    <Card aria-labelledby="region-heading" className="space-y-3 p-5 sm:p-6">
      <h2 id="region-heading" className="text-lg font-bold text-ink">
        The region {name}
      </h2>
      {rename.isSuccess ? <Notice tone="info">Region renamed to {rename.data.name}.</Notice> : null}
      <RegionForm
        defaultName={name}
        submitLabel="Rename region"
        failedTitle="The region was not renamed"
        onSubmit={(input) => rename.mutateAsync(input)}
      />
    </Card>
  );
}

/** A site's details, for its own site admin and administrators; retiring it and its region for administrators. */
export function SiteEditPage() {
  const siteId = useParams().siteId ?? '';
  const { data: site } = useSuspenseQuery(siteDetailQuery(siteId));
  const { data: regions } = useSuspenseQuery(regionListQuery());
  const ability = useAppAbility();
  const update = useUpdateSite(site.id);
  const navigate = useNavigate();
  const asSubject = subject('Site', { id: site.id, regionId: site.regionId });
  const canEdit = ability.can('update', asSubject);
  const mayMove = ability.can('update', asSubject, 'regionId');
  const mayRetire = ability.can('update', asSubject, 'retiredAt');
  const region = regions.items.find((r) => r.id === site.regionId);
  return (
    <div className="mx-auto max-w-3xl space-y-6">
      <title>{`Change ${site.name} · Kerfline`}</title>
      <nav aria-label="Breadcrumb" className="text-sm">
        <Link
          to={`/sites/${site.id}`}
          className="inline-flex min-h-11 items-center text-ink-muted underline-offset-4 hover:text-ink hover:underline"
        >
          {site.name}
        </Link>
      </nav>
      <h1 className="text-3xl font-extrabold tracking-tight text-ink">Change {site.name}</h1>
      {!canEdit ? (
        <Notice tone="info" title="Not for your role">
          The site&apos;s own site admin and administrators change it.
        </Notice>
      ) : site.retiredAt ? null : (
        <Card className="p-5 sm:p-6">
          <SiteForm
            regions={regions.items}
            initial={siteFormValuesOf(site)}
            codeLocked
            regionLocked={!mayMove}
            submitLabel="Save changes"
            cancel={
              <LinkButton to={`/sites/${site.id}`} variant="quiet">
                Cancel
              </LinkButton>
            }
            onSubmit={async (input) => {
              await update.mutateAsync(patchOf(site, input, mayMove));
              await navigate(`/sites/${site.id}`);
            }}
          />
        </Card>
      )}
      {mayRetire ? <Retirement site={site} /> : null}
      {mayMove && region ? <RenameRegion regionId={region.id} name={region.name} /> : null}
    </div>
  );
}
