import { useMutation, useQueryClient, type QueryClient } from '@tanstack/react-query';
import { siteSchema, type Site, type SiteCreate, type SiteUpdate } from '@kerfline/domain/sites/schema';
import { api } from '../../../lib/api-client';
import { siteKeys } from './keys';

/** After any write: the saved site replaces its detail entry, and every site list is marked stale. */
function storeSaved(queryClient: QueryClient, site: Site) {
  queryClient.setQueryData(siteKeys.detail(site.id), site);
  return queryClient.invalidateQueries({ queryKey: siteKeys.lists() });
}

/** Adds a plant (administrators only); a code another site already uses answers 409. */
export function useCreateSite() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: (input: SiteCreate) => api.post('/sites', input, siteSchema),
    onSuccess: (site) => storeSaved(queryClient, site),
  });
}

/** Changes a site's name, city, time zone, currency or unit system (admins, and the site's own admin). */
export function useUpdateSite(id: string) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: (input: SiteUpdate) => api.patch(`/sites/${encodeURIComponent(id)}`, input, siteSchema),
    onSuccess: (site) => storeSaved(queryClient, site),
  });
}

/** Retires a site (`retired: true`) or brings it back (administrators); its history stays either way. */
export function useSetSiteRetired(id: string) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: (retired: boolean) =>
      api.post(`/sites/${encodeURIComponent(id)}/${retired ? 'retire' : 'restore'}`, undefined, siteSchema),
    onSuccess: (site) => storeSaved(queryClient, site),
  });
}
