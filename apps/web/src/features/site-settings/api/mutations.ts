import { useMutation, useQueryClient, type QueryClient } from '@tanstack/react-query';
import { siteSettingSchema, type SettingValues, type SiteSetting } from '@kerfline/domain/settings/schema';
import { api } from '../../../lib/api-client';
import { siteSettingKeys } from './keys';

const settingPath = (siteId: string, key: string) =>
  `/sites/${encodeURIComponent(siteId)}/settings/${encodeURIComponent(key)}`;

/** The saved setting replaces its entry in the site's list; the list is then refetched for good measure. */
function storeSaved(queryClient: QueryClient, siteId: string, saved: SiteSetting) {
  queryClient.setQueryData(
    siteSettingKeys.site(siteId),
    (current: { siteId: string; items: SiteSetting[] } | undefined) =>
      current ? { ...current, items: current.items.map((item) => (item.key === saved.key ? saved : item)) } : current,
  );
  return queryClient.invalidateQueries({ queryKey: siteSettingKeys.site(siteId) });
}

/** Sets the site's own value of one setting (the whole value, in the units its fields' names say). */
export function useChangeSiteSetting(siteId: string) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: ({ key, value }: { key: string; value: SettingValues }) =>
      api.put(settingPath(siteId, key), { value }, siteSettingSchema),
    onSuccess: (saved) => storeSaved(queryClient, siteId, saved),
  });
}

/** Puts the site back on Kerfline's shipped value of one setting. */
export function useResetSiteSetting(siteId: string) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: (key: string) => api.delete(settingPath(siteId, key), siteSettingSchema),
    onSuccess: (saved) => storeSaved(queryClient, siteId, saved),
  });
}
