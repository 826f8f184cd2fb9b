import type { FieldErrors, FieldValues, Path, UseFormSetError } from 'react-hook-form';
import { isApiError } from './api-client';

export type PathMessage = { path: string; type: string; message: string };

/**
 * Every message in a resolver's (possibly nested) errors with its dotted path, e.g. `managedSiteIds.2`.
 * A form maps these paths onto the fields it shows; the DOM element react-hook-form keeps in `ref` is skipped.
 */
export function messagesByPath(errors: FieldErrors, prefix = ''): PathMessage[] {
  const found: PathMessage[] = [];
  for (const [key, node] of Object.entries(errors)) {
    if (key === 'ref' || !node || typeof node !== 'object') continue;
    const path = prefix ? `${prefix}.${key}` : key;
    const { message, type } = node as { message?: unknown; type?: unknown };
    if (typeof message === 'string') found.push({ path, type: String(type ?? 'schema'), message });
    else found.push(...messagesByPath(node as FieldErrors, path));
  }
  return found;
}

/**
 * Shows a failed save on a react-hook-form form. A 400's details and a 409's clashing fields go beside the
 * fields they name; the server's message goes above the form (`root.server`) with any detail the form has
 * no field for, so nothing the server said is lost. Anything else shows its message, or `fallback`.
 */
export function showServerError<T extends FieldValues>(
  error: unknown,
  setError: UseFormSetError<T>,
  fieldForPath: (path: string) => Path<T> | undefined,
  fallback: string,
): void {
  if (isApiError(error) && (error.status === 400 || error.status === 409) && error.details.length > 0) {
    const unplaced: string[] = [];
    for (const detail of error.details) {
      const field = fieldForPath(detail.path);
      if (field) setError(field, { type: 'server', message: detail.message });
      else unplaced.push(detail.path ? `${detail.path}: ${detail.message}` : detail.message);
    }
    setError('root.server', { type: 'server', message: [error.message, ...unplaced].join(' ') });
    return;
  }
  setError('root.server', { type: 'server', message: error instanceof Error ? error.message : fallback });
}
