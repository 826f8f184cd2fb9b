import { useState } from 'react';
import { useNavigate } from 'react-router-dom';
import { useSuspenseQuery, type QueryClient } from '@tanstack/react-query';
import { abilityFromMeRules, useAppAbility } from '../../../lib/ability';
import { LinkButton } from '../../../lib/ui/button';
import { Card } from '../../../lib/ui/card';
import { Notice } from '../../../lib/ui/notice';
import { meQuery } from '../../../features/auth/api/queries';
import { regionListQuery } from '../../../features/regions/api/queries';
import { useCreateRegion } from '../../../features/regions/api/mutations';
import { RegionForm } from '../../../features/regions/components/region-form';
import { useCreateSite } from '../../../features/sites/api/mutations';
import { SiteForm } from '../../../features/sites/components/site-form';

export function siteNewPageLoader(queryClient: QueryClient) {
  return async () => {
    const me = await queryClient.ensureQueryData(meQuery());
    // Someone who may not add sites gets the page's note without waiting for the regions.
    if (!abilityFromMeRules(me.rules).can('create', 'Site')) return null;
    await queryClient.ensureQueryData(regionListQuery());
    return null;
  };
}

/** The form and, beside it, a way to add the region a new plant belongs to when it is not listed yet. */
function NewSite() {
  const { data: regions } = useSuspenseQuery(regionListQuery());
  const ability = useAppAbility();
  const createSite = useCreateSite();
  const createRegion = useCreateRegion();
  const navigate = useNavigate();
  const [addedRegion, setAddedRegion] = useState<{ id: string; name: string }>();
  const canAddRegion = ability.can('create', 'Region');

  return (
    <>
      <Card className="p-5 sm:p-6">
        <SiteForm
          regions={regions.items}
          chooseRegionId={addedRegion?.id}
          regionHint={canAddRegion ? 'Not listed? Add a region below the form.' : undefined}
          submitLabel="Add site"
          cancel={
            <LinkButton to="/sites" variant="quiet">
              Cancel
            </LinkButton>
          }
          onSubmit={async (input) => {
            const site = await createSite.mutateAsync(input);
            await navigate(`/sites/${site.id}`);
          }}
        />
      </Card>
      {canAddRegion ? (
        <Card aria-labelledby="add-region-heading" className="space-y-3 p-5 sm:p-6">
          <h2 id="add-region-heading" className="text-lg font-bold text-ink">
            Add a region
          </h2>
          {addedRegion ? (
            <Notice tone="info">Region {addedRegion.name} added and chosen in the form above.</Notice>
          ) : (
            <p className="text-sm text-ink-muted">
              Sites are grouped in regions; a regional lead looks after one region.
            </p>
          )}
          <RegionForm
            onSubmit={async (input) => {
              const region = await createRegion.mutateAsync(input);
              setAddedRegion(region);
            }}
          />
        </Card>
      ) : null}
    </>
  );
}

/** A new plant (administrators only): its code, region, time zone, currency and units. */
export function SiteNewPage() {
  const ability = useAppAbility();
  return (
    <div className="mx-auto max-w-3xl space-y-6">
      <title>Add a site · Kerfline</title>
      <div>
        <h1 className="text-3xl font-extrabold tracking-tight text-ink">Add a site</h1>
        <p className="mt-1 text-ink-muted">A plant with band saws. Its saws and people are added once it exists.</p>
      </div>
      {ability.can('create', 'Site') ? (
        <NewSite />
      ) : (
        <Notice tone="info" title="Not for your role">
          Only an administrator can add sites.
        </Notice>
      )}
    </div>
  );
}
