import { Link, Outlet, useMatch, useOutletContext, useSearchParams } from 'react-router-dom';
import { useQuery, type QueryClient } from '@tanstack/react-query';
import type { UnitSystem } from '@kerfline/domain/sites/schema';
import { siteListQuery } from '../../../features/sites/api/queries';
import {
  CalculatorSwitcher,
  CalculatorTiles,
  UnitSwitch,
  calculatorHref,
} from '../../../features/calculators/components/calculator-nav';
import { unitSystemParam } from '../../../features/calculators/components/quantities';

/** What the calculators' frame hands to each calculator page. */
export interface CalculatorsContext {
  system: UnitSystem;
  setSystem: (system: UnitSystem) => void;
}

export function useCalculatorsContext(): CalculatorsContext {
  return useOutletContext<CalculatorsContext>();
}

export function calculatorsLoader(queryClient: QueryClient) {
  return async () => {
    // The sites only suggest the starting unit system: a failure there must not stop the calculators.
    await queryClient.ensureQueryData(siteListQuery()).catch(() => undefined);
    return null;
  };
}

/**
 * The frame of the shop calculators. The unit system lives in the address (`?units=`), so a link to a
 * calculator opens in the same units; without it, the user's first site's units, else metric.
 */
export function CalculatorsLayout() {
  const [search, setSearch] = useSearchParams();
  const { data: sites } = useQuery(siteListQuery());
  const system = unitSystemParam(search.get('units')) ?? sites?.items[0]?.unitSystem ?? 'metric';
  const onCalculator = useMatch('/calculators/:calculator') !== null;

  const setSystem = (next: UnitSystem) =>
    setSearch(
      (current) => {
        const params = new URLSearchParams(current);
        params.set('units', next);
        return params;
      },
      { replace: true },
    );

  const context: CalculatorsContext = { system, setSystem };
  return (
    <div className="space-y-6">
      {onCalculator ? (
        <div className="space-y-4">
          <div className="flex flex-wrap items-center justify-between gap-3">
            <nav aria-label="Breadcrumb" className="text-sm">
              <Link
                to={calculatorHref(null, system)}
                className="inline-flex min-h-11 items-center text-ink-muted underline-offset-4 hover:text-ink hover:underline"
              >
                Shop calculators
              </Link>
            </nav>
            <UnitSwitch value={system} onChange={setSystem} />
          </div>
          <CalculatorSwitcher system={system} />
        </div>
      ) : null}
      <Outlet context={context} />
    </div>
  );
}

/** Every calculator as a tile, in the units chosen here. */
export function CalculatorsIndexPage() {
  const { system, setSystem } = useCalculatorsContext();
  return (
    <div className="space-y-6">
      <title>Shop calculators · Kerfline</title>
      <div className="flex flex-wrap items-end justify-between gap-4">
        <div>
          <h1 className="text-3xl font-extrabold tracking-tight text-ink">Shop calculators</h1>
          <p className="mt-1 max-w-prose text-ink-muted">
            The shop-floor sums, worked out the same way everywhere in Kerfline. Choose the units, then a calculator.
          </p>
        </div>
        <UnitSwitch value={system} onChange={setSystem} />
      </div>
      <CalculatorTiles system={system} />
    </div>
  );
}
