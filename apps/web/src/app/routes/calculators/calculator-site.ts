import { queryOptions, useQuery, type QueryClient } from '@tanstack/react-query';
import { pageOf } from '@kerfline/domain/common/schema';
import { bladeRunSchema } from '@kerfline/domain/blade-runs/schema';
import { api } from '../../../lib/api-client';
import { idSchema } from '@kerfline/domain/common/schema';
import type { Saw } from '@kerfline/domain/saws/schema';
import type { Site } from '@kerfline/domain/sites/schema';
import { shippedSettings, type SiteSetting } from '@kerfline/domain/settings/schema';
import { meQuery } from '../../../features/auth/api/queries';
import { sawDetailQuery } from '../../../features/saws/api/queries';
import { siteDetailQuery } from '../../../features/sites/api/queries';
import { siteSettingsQuery } from '../../../features/site-settings/api/queries';
import type { CalculatorSaw } from '../../../features/calculators/components/saw-picker';

/** `?sawId=` when it is an id; anything else counts as not given. */
export function sawIdFromSearch(search: URLSearchParams): string | null {
  const parsed = idSchema.safeParse(search.get('sawId'));
  return parsed.success ? parsed.data : null;
}

/** A saw's record as the plain SI figures a calculator takes. */
export function calculatorSaw(saw: Saw): CalculatorSaw {
  return {
    id: saw.id,
    label: `${saw.assetTag} · ${saw.name}`,
    headFeed: saw.headFeed,
    wheelDiameterMm: saw.wheelDiameterMm,
    bandThicknessMm: saw.bandThicknessMm,
    bandWidthMm: saw.bandWidthMm,
    bandSpeedMinMPerMin: saw.bandSpeedMinMPerMin,
    bandSpeedMaxMPerMin: saw.bandSpeedMaxMPerMin,
    minHeadForceN: saw.minHeadForceN,
    maxHeadForceN: saw.maxHeadForceN,
  };
}

/**
 * The blade on a saw now (its open run), for the material it was put on to cut: a calculator opened from the saw
 * starts from it. Keyed under the blade runs' list, which the records' screens refresh when a blade goes on or off.
 */
export function bladeOnQuery(sawId: string) {
  const q = { sawId, open: 'true', limit: 1 };
  return queryOptions({
    queryKey: ['blade-runs', 'list', q],
    queryFn: ({ signal }) => api.get('/blade-runs', pageOf(bladeRunSchema), { query: q, signal }),
  });
}

/** The material the blade on the saw is cutting, as a calculator's starting text (`material=`). */
export function sawMaterialStart(queryClient: QueryClient, sawId: string | null): Record<string, string> {
  if (!sawId) return {};
  const run = queryClient.getQueryData(bladeOnQuery(sawId).queryKey)?.items[0];
  return run?.materialGroup ? { material: run.materialGroup } : {};
}

/**
 * Loads what decides the calculators' site: the saw named in the address (its site's settings and units), else
 * the user's only site. Failures are swallowed: the calculators work without a site, on shipped values.
 */
export async function loadCalculatorSite(queryClient: QueryClient, search: URLSearchParams): Promise<void> {
  try {
    const sawId = sawIdFromSearch(search);
    let siteId: string | undefined;
    if (sawId) {
      siteId = (await queryClient.ensureQueryData(sawDetailQuery(sawId))).siteId;
      await queryClient.ensureQueryData(bladeOnQuery(sawId)).catch(() => undefined);
    } else {
      const [only, ...others] = (await queryClient.ensureQueryData(meQuery())).siteIds;
      siteId = only !== undefined && others.length === 0 ? only : undefined;
    }
    if (siteId) {
      await Promise.all([
        queryClient.ensureQueryData(siteDetailQuery(siteId)),
        queryClient.ensureQueryData(siteSettingsQuery(siteId)).catch(() => undefined),
      ]);
    }
  } catch {
    // A saw or site the user cannot read: the calculators open without it.
  }
}

export interface CalculatorSite {
  /** The saw the calculators were opened for. */
  saw: Saw | undefined;
  /** The site whose settings and units apply: the saw's, else the user's only site. */
  site: Site | undefined;
  /** That site's settings, or Kerfline's shipped values when there is no such site. */
  settings: SiteSetting[];
}

/** What `loadCalculatorSite` loaded, read from the cache (and refreshed as the cache is). */
export function useCalculatorSite(search: URLSearchParams): CalculatorSite {
  const sawId = sawIdFromSearch(search);
  const me = useQuery(meQuery());
  const saw = useQuery({ ...sawDetailQuery(sawId ?? ''), enabled: sawId !== null, retry: false });
  const [only, ...others] = me.data?.siteIds ?? [];
  const siteId = sawId ? saw.data?.siteId : only !== undefined && others.length === 0 ? only : undefined;
  const site = useQuery({ ...siteDetailQuery(siteId ?? ''), enabled: siteId !== undefined, retry: false });
  const settings = useQuery({ ...siteSettingsQuery(siteId ?? ''), enabled: siteId !== undefined, retry: false });
  return {
    saw: sawId ? saw.data : undefined,
    site: siteId ? site.data : undefined,
    settings: (siteId ? settings.data?.items : undefined) ?? shippedSettings(),
  };
}
