import type { FieldErrors, FieldValues, Path, Resolver, ResolverOptions, UseFormSetError } from 'react-hook-form';
import { zodResolver } from '@hookform/resolvers/zod';
import type { z } from 'zod';
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

const NAMED_BY_ID =
  /\b(stop|blade run|run|receipt|photo) [0-9a-f]{8}-[0-9a-f]{4}-[0-9a-f]{4}-[0-9a-f]{4}-[0-9a-f]{12}\b/gi;

/**
 * A server message for a person: a record the API names by its id ("overlaps stop 5d0c…") is named by what the
 * message already says of it ("overlaps the stop (hydraulic, open since …)"), since an id means nothing on a phone.
 */
export function forPeople(message: string): string {
  return message.replace(NAMED_BY_ID, (_whole, noun: string) => `the ${noun.toLowerCase()}`);
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
    setError('root.server', { type: 'server', message: forPeople([error.message, ...unplaced].join(' ')) });
    return;
  }
  setError('root.server', { type: 'server', message: error instanceof Error ? forPeople(error.message) : fallback });
}

/**
 * A react-hook-form resolver that converts the form's values to the domain input and parses them with the
 * domain schema — the very schema the server parses. Schema messages go beside the fields `fieldForPath`
 * names and the rest above the form; `formChecks` adds the form's own words (a blank choice, say).
 */
export function domainSchemaResolver<TForm extends FieldValues, TSchema extends z.ZodType<FieldValues, FieldValues>>(
  schema: TSchema,
  toInput: (values: TForm) => z.input<TSchema>,
  fieldForPath: (path: string, values: TForm) => Path<TForm> | undefined,
  formChecks: (values: TForm) => Partial<Record<Path<TForm>, string>> = () => ({}),
  /** Rewords a schema message for this form (limits in the site's units, say). */
  reword: (message: string) => string = (message) => message,
): Resolver<TForm, unknown, z.output<TSchema>> {
  const schemaResolver = zodResolver(schema) as Resolver<FieldValues, unknown, FieldValues>;
  return async (values, context, options) => {
    const result = await schemaResolver(toInput(values), context, options as unknown as ResolverOptions<FieldValues>);
    const errors: Record<string, { type: string; message: string }> = {};
    const unplaced: string[] = [];
    for (const { path, type, message } of messagesByPath(result.errors)) {
      const field = fieldForPath(path, values);
      if (field) errors[field] ??= { type, message: reword(message) };
      else unplaced.push(`${path}: ${message}`);
    }
    for (const [field, message] of Object.entries(formChecks(values))) {
      if (typeof message === 'string') errors[field] = { type: 'form', message };
    }
    if (unplaced.length > 0) errors.root = { type: 'schema', message: unplaced.join('; ') };
    if (Object.keys(errors).length > 0) return { values: {}, errors: errors as FieldErrors<TForm> };
    return { values: result.values as z.output<TSchema>, errors: {} };
  };
}
