/**
 * Query keys for a site's settings; the first segment is the API path segment (`/api/sites/:id/settings`), so
 * refreshing everything about sites refreshes settings too.
 */
export const siteSettingKeys = {
  all: ['sites', 'settings'] as const,
  site: (siteId: string) => [...siteSettingKeys.all, siteId] as const,
};
