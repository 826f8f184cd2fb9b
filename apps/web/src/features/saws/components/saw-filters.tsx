import type { FormEvent } from 'react';
import { Link, useLocation, useSearchParams } from 'react-router-dom';
import { Field, inputClass } from '../../../lib/ui/field';
import { Button, buttonClass } from '../../../lib/ui/button';
import type { SawFilterValues } from '../api/list-search';

/**
 * The saw list's filters. They live in the URL: applying them navigates, the route's loader fetches, and
 * the page can be shared or reloaded as it is. Empty values are left out of the URL.
 */
export function SawFilters({
  values,
  siteOptions,
}: {
  values: SawFilterValues;
  siteOptions?: { id: string; name: string }[];
}) {
  const [, setSearchParams] = useSearchParams();
  const location = useLocation();

  const apply = (form: HTMLFormElement) => {
    const next = new URLSearchParams();
    for (const [key, value] of new FormData(form)) {
      if (typeof value === 'string' && value.trim() !== '') next.set(key, value.trim());
    }
    // A new filter starts again at the first page, so no offset is carried over.
    setSearchParams(next);
  };

  const onSubmit = (event: FormEvent<HTMLFormElement>) => {
    event.preventDefault();
    apply(event.currentTarget);
  };

  const hasFilters = values.status !== '' || values.kind !== '' || values.q !== '' || values.siteId !== '';

  return (
    // Keyed by the URL's filters so the fields reset when the user goes back or follows a link.
    <form
      key={location.search}
      role="search"
      aria-label="Filter saws"
      onSubmit={onSubmit}
      className="flex flex-wrap items-end gap-3"
    >
      {siteOptions ? (
        <Field label="Site" className="w-full sm:w-52">
          {(props) => (
            <select
              {...props}
              name="site"
              defaultValue={values.siteId}
              onChange={(e) => apply(e.currentTarget.form!)}
              className={inputClass}
            >
              <option value="">All my sites</option>
              {siteOptions.map((site) => (
                <option key={site.id} value={site.id}>
                  {site.name}
                </option>
              ))}
            </select>
          )}
        </Field>
      ) : null}
      <Field label="Status" className="w-full sm:w-48">
        {(props) => (
          <select
            {...props}
            name="status"
            defaultValue={values.status}
            onChange={(e) => apply(e.currentTarget.form!)}
            className={inputClass}
          >
            <option value="">In use</option>
            <option value="in_service">In service</option>
            <option value="down">Down</option>
            <option value="retired">Retired</option>
            <option value="all">All, with retired</option>
          </select>
        )}
      </Field>
      <Field label="Kind" className="w-full sm:w-40">
        {(props) => (
          <select
            {...props}
            name="kind"
            defaultValue={values.kind}
            onChange={(e) => apply(e.currentTarget.form!)}
            className={inputClass}
          >
            <option value="">Any kind</option>
            <option value="horizontal">Horizontal</option>
            <option value="vertical">Vertical</option>
          </select>
        )}
      </Field>
      <Field label="Asset tag or name" className="min-w-48 flex-1">
        {(props) => (
          <input {...props} name="q" type="search" defaultValue={values.q} maxLength={80} className={inputClass} />
        )}
      </Field>
      <div className="flex gap-2">
        <Button type="submit">Search</Button>
        {hasFilters ? (
          <Link to={location.pathname} className={buttonClass('quiet')}>
            Clear filters
          </Link>
        ) : null}
      </div>
    </form>
  );
}
