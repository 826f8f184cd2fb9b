/** Query keys for regions; the first segment is the API path segment (`/api/regions`). */
export const regionKeys = {
  all: ['regions'] as const,
  lists: () => [...regionKeys.all, 'list'] as const,
  list: () => [...regionKeys.lists(), { limit: 500, offset: 0 }] as const,
};
