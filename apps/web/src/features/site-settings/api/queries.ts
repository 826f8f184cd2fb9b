import { queryOptions } from '@tanstack/react-query';
import { siteSettingsSchema } from '@kerfline/domain/settings/schema';
import { api } from '../../../lib/api-client';
import { siteSettingKeys } from './keys';

/** Every setting of a site: the value in force, the shipped value and basis, who changed it and when. */
export function siteSettingsQuery(siteId: string) {
  return queryOptions({
    queryKey: siteSettingKeys.site(siteId),
    queryFn: ({ signal }) => api.get(`/sites/${encodeURIComponent(siteId)}/settings`, siteSettingsSchema, { signal }),
  });
}
