/** Query keys for the signed-in user; the first segment is the API path segment (`/api/me`). */
export const meKeys = {
  all: ['me'] as const,
};
