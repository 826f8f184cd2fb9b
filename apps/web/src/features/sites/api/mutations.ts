import { useMutation, useQueryClient } from '@tanstack/react-query';
import { siteSchema, type SiteUpdate } from '@kerfline/domain/sites/schema';
import { api } from '../../../lib/api-client';
import { siteKeys } from './keys';

/** Changes a site's name, city, time zone, currency or unit system (admins, and the site's own admin). */
export function useUpdateSite(id: string) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: (input: SiteUpdate) => api.patch(`/sites/${encodeURIComponent(id)}`, input, siteSchema),
    onSuccess: (site) => {
      queryClient.setQueryData(siteKeys.detail(site.id), site);
      return queryClient.invalidateQueries({ queryKey: siteKeys.lists() });
    },
  });
}
