import { useId } from 'react';
import { useSearchParams } from 'react-router-dom';
import type { UnitSystem } from '@kerfline/domain/sites/schema';
import { addMonths, defaultPeriod, periodLabel, type MonthPeriod } from '@kerfline/domain/fleet/period';
import { inputClass } from '../../../lib/ui/field';
import { siteColour } from '../../../lib/palette';
import { SiteMark } from './site-mark';

const UNITS_KEY = 'kerfline.units';

/**
 * The reader's unit system for the fleet screens: `?units=` in the address when given (shareable), else the one
 * last chosen on this device, else the system most of the shown sites use.
 */
export function unitsFromSearch(search: URLSearchParams, fallback: UnitSystem): UnitSystem {
  const asked = search.get('units');
  if (asked === 'metric' || asked === 'imperial') return asked;
  try {
    const kept = window.localStorage.getItem(UNITS_KEY);
    if (kept === 'metric' || kept === 'imperial') return kept;
  } catch {
    // Storage may be off (private windows): the fallback serves.
  }
  return fallback;
}

/** The unit system most of these sites keep (metric when tied). */
export function majorityUnits(sites: readonly { unitSystem: UnitSystem }[]): UnitSystem {
  const imperial = sites.filter((s) => s.unitSystem === 'imperial').length;
  return imperial > sites.length / 2 ? 'imperial' : 'metric';
}

export type SiteOption = { id: string; code: string; name: string; colourIndex: number };

const PRESETS = [3, 6, 12, 24] as const;

/**
 * The period, the sites and the units, all kept in the address, so a view can be bookmarked and shared and the
 * browser's back and forward step through the filters.
 */
export function FleetFilters({
  period,
  units,
  siteOptions,
  selectedSiteIds,
}: {
  period: MonthPeriod;
  /** Omit to hide the unit choice (a screen of money alone, such as budgets). */
  units?: UnitSystem;
  /** Omit to hide the site picker (a site's or a saw's own page). */
  siteOptions?: SiteOption[];
  selectedSiteIds?: string[];
}) {
  const [search, setSearch] = useSearchParams();
  const id = useId();
  const update = (changes: Record<string, string | null>) => {
    const next = new URLSearchParams(search);
    for (const [key, value] of Object.entries(changes)) {
      if (value === null || value === '') next.delete(key);
      else next.set(key, value);
    }
    next.delete('offset');
    setSearch(next);
  };
  const setUnits = (value: UnitSystem) => {
    try {
      window.localStorage.setItem(UNITS_KEY, value);
    } catch {
      // Not kept on this device; the address still holds it.
    }
    update({ units: value });
  };
  const selected = new Set(selectedSiteIds ?? []);
  const toggleSite = (siteId: string) => {
    // No `sites` in the address means every site is shown (and ticked): unticking one starts from all of them.
    const next = new Set(selected.size === 0 ? (siteOptions ?? []).map((s) => s.id) : selected);
    if (next.has(siteId)) next.delete(siteId);
    else next.add(siteId);
    update({ sites: next.size === 0 || next.size === siteOptions?.length ? null : [...next].join(',') });
  };
  const lastWhole = defaultPeriod(new Date()).to;

  return (
    <section aria-label="Filters" className="rounded-sheet border border-rule bg-card p-4">
      <div className="flex flex-wrap items-end gap-x-6 gap-y-4">
        <div className="flex flex-wrap items-end gap-3">
          <div>
            <label htmlFor={`${id}-from`} className="block text-sm font-semibold text-ink">
              From
            </label>
            <input
              id={`${id}-from`}
              type="month"
              className={`${inputClass} mt-1 w-44`}
              value={period.from}
              max={period.to}
              onChange={(e) => e.target.value && update({ from: e.target.value, to: period.to })}
            />
          </div>
          <div>
            <label htmlFor={`${id}-to`} className="block text-sm font-semibold text-ink">
              To
            </label>
            <input
              id={`${id}-to`}
              type="month"
              className={`${inputClass} mt-1 w-44`}
              value={period.to}
              min={period.from}
              onChange={(e) => e.target.value && update({ from: period.from, to: e.target.value })}
            />
          </div>
        </div>
        <div role="group" aria-label="Quick periods" className="flex flex-wrap gap-2">
          {PRESETS.map((months) => {
            const from = addMonths(lastWhole, -(months - 1));
            const active = period.from === from && period.to === lastWhole;
            return (
              <button
                key={months}
                type="button"
                aria-pressed={active}
                onClick={() => update({ from, to: lastWhole })}
                className={`min-h-11 rounded-sheet border px-3 text-sm font-semibold ${
                  active
                    ? 'border-accent bg-accent-soft text-accent-dark'
                    : 'border-ink-muted bg-card text-ink hover:bg-paper-deep'
                }`}
              >
                Last {months} months
              </button>
            );
          })}
        </div>
        {units ? (
          <fieldset className="flex items-center gap-2">
            <legend className="sr-only">Units</legend>
            <span aria-hidden="true" className="text-sm font-semibold text-ink">
              Units
            </span>
            {(['imperial', 'metric'] as const).map((system) => (
              <label
                key={system}
                className="flex min-h-11 cursor-pointer items-center gap-2 rounded-sheet border border-ink-muted px-3 text-sm font-semibold has-checked:border-accent has-checked:bg-accent-soft"
              >
                <input
                  type="radio"
                  name={`${id}-units`}
                  className="size-4 accent-accent"
                  checked={units === system}
                  onChange={() => setUnits(system)}
                />
                {system === 'imperial' ? 'Imperial (in², ft²)' : 'Metric (cm², m²)'}
              </label>
            ))}
          </fieldset>
        ) : null}
      </div>
      {siteOptions && siteOptions.length > 1 ? (
        <fieldset className="mt-4 border-t border-rule pt-3">
          <legend className="text-sm font-semibold text-ink">
            Sites{' '}
            <span className="font-normal text-ink-muted">
              ({selected.size === 0 ? 'all' : `${selected.size} of ${siteOptions.length}`})
            </span>
          </legend>
          <div className="mt-2 flex flex-wrap gap-2">
            {siteOptions.map((site) => (
              <label
                key={site.id}
                className="flex min-h-11 cursor-pointer items-center gap-2 rounded-sheet border border-rule px-3 text-sm has-checked:border-ink"
                style={{ borderLeftColor: siteColour(site.colourIndex), borderLeftWidth: 4 }}
              >
                <input
                  type="checkbox"
                  className="size-4 accent-accent"
                  checked={selected.size === 0 || selected.has(site.id)}
                  onChange={() => toggleSite(site.id)}
                />
                <SiteMark slot={site.colourIndex} />
                <span className="font-semibold">{site.code}</span>
                <span className="text-ink-muted">{site.name}</span>
              </label>
            ))}
          </div>
        </fieldset>
      ) : null}
      <p className="mt-3 text-sm text-ink-muted">Showing {periodLabel(period)}.</p>
    </section>
  );
}
