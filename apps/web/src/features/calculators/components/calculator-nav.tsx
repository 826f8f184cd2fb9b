import { useId } from 'react';
import { Link, NavLink } from 'react-router-dom';
import { UNIT_SYSTEMS, type UnitSystem } from '@kerfline/domain/sites/schema';
import { CALCULATORS, type CalculatorSlug } from './catalogue';

/**
 * A calculator's address with the unit system kept, so every link opens in the units the user chose; `params`
 * (a saw, starting figures) follow it.
 */
export function calculatorHref(
  slug: CalculatorSlug | null,
  system: UnitSystem,
  params: Readonly<Record<string, string>> = {},
): string {
  const search = new URLSearchParams({ units: system, ...params });
  return `/calculators${slug ? `/${slug}` : ''}?${search.toString()}`;
}

const SYSTEM_NAMES: Record<UnitSystem, { name: string; units: string }> = {
  metric: { name: 'Metric', units: 'mm, m/min' },
  imperial: { name: 'Imperial', units: 'in, ft/min' },
};

/** Metric or imperial for every figure on the calculators; the route keeps the choice in the address. */
export function UnitSwitch({ value, onChange }: { value: UnitSystem; onChange: (system: UnitSystem) => void }) {
  const name = useId();
  return (
    <fieldset className="flex flex-wrap items-center gap-x-3 gap-y-1">
      <legend className="float-left mr-3 text-sm font-semibold text-ink">Units</legend>
      <div className="inline-flex rounded-sheet border border-ink-muted bg-card p-0.5">
        {UNIT_SYSTEMS.map((system) => (
          <label key={system} className="relative cursor-pointer">
            {/* The radio itself covers its tile, unseen: a tap anywhere on the tile lands on the control. */}
            <input
              type="radio"
              name={name}
              value={system}
              checked={value === system}
              onChange={() => onChange(system)}
              className="peer absolute inset-0 z-10 size-full cursor-pointer appearance-none opacity-0"
            />
            <span className="flex min-h-11 items-center gap-1.5 rounded-[4px] px-3 text-sm font-bold text-ink peer-checked:bg-ink peer-checked:text-card peer-focus-visible:outline-3 peer-focus-visible:outline-offset-2 peer-focus-visible:outline-ink">
              {SYSTEM_NAMES[system].name}
              <span className="font-semibold opacity-80">{SYSTEM_NAMES[system].units}</span>
            </span>
          </label>
        ))}
      </div>
    </fieldset>
  );
}

/** The index: one tile per calculator, the whole tile a link. */
export function CalculatorTiles({ system }: { system: UnitSystem }) {
  return (
    <ul className="grid gap-4 sm:grid-cols-2 xl:grid-cols-3">
      {CALCULATORS.map((calculator, index) => (
        <li key={calculator.slug}>
          <Link
            to={calculatorHref(calculator.slug, system)}
            className="group flex h-full min-h-11 flex-col rounded-sheet border border-rule bg-card p-5 transition-colors hover:border-accent"
          >
            <span aria-hidden="true" className="tabular text-sm font-bold tracking-wider text-accent">
              {String(index + 1).padStart(2, '0')}
            </span>
            <h2 className="mt-1 text-xl font-bold text-ink group-hover:text-accent-dark group-hover:underline">
              {calculator.title}
            </h2>
            <p className="mt-1 text-ink-muted">{calculator.summary}</p>
          </Link>
        </li>
      ))}
    </ul>
  );
}

const switcherLinkClass = ({ isActive }: { isActive: boolean }) =>
  `flex min-h-11 items-center rounded-sheet border px-3 text-sm font-semibold whitespace-nowrap transition-colors ${
    isActive
      ? 'border-accent bg-accent-soft text-accent-dark underline decoration-2 underline-offset-4'
      : 'border-rule bg-card text-ink hover:border-accent'
  }`;

/**
 * A compact row of the calculators on each calculator's page; the current one is filled and underlined, not only
 * tinted. `params` (the saw the page was opened for) carry over to the other calculators.
 */
export function CalculatorSwitcher({
  system,
  params = {},
}: {
  system: UnitSystem;
  params?: Readonly<Record<string, string>>;
}) {
  return (
    <nav aria-label="Calculators">
      <ul className="flex flex-wrap gap-2">
        {CALCULATORS.map((calculator) => (
          <li key={calculator.slug}>
            <NavLink to={calculatorHref(calculator.slug, system, params)} className={switcherLinkClass}>
              {calculator.short}
            </NavLink>
          </li>
        ))}
      </ul>
    </nav>
  );
}
