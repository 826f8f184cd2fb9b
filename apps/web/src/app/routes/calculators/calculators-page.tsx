import { Link, Outlet, useMatch, useOutletContext, useSearchParams, type LoaderFunctionArgs } from 'react-router-dom';
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
import { loadCalculatorSite, sawIdFromSearch, useCalculatorSite } from './calculator-site';
import { startTextsFromSearch } from '../../../features/calculators/components/saw-links';

/** The saw a calculator was opened for, and its figures, carried to the other calculators. */
function sawParams(search: URLSearchParams): Record<string, string> {
  const sawId = sawIdFromSearch(search);
  return sawId ? { sawId, ...startTextsFromSearch(search) } : {};
}

/** What the calculators' frame hands to each calculator page. */
export interface CalculatorsContext {
  system: UnitSystem;
  setSystem: (system: UnitSystem) => void;
}

export function useCalculatorsContext(): CalculatorsContext {
  return useOutletContext<CalculatorsContext>();
}

export function calculatorsLoader(queryClient: QueryClient) {
  return async ({ request }: LoaderFunctionArgs) => {
    // The sites only suggest the starting unit system: a failure there must not stop the calculators.
    await Promise.all([
      queryClient.ensureQueryData(siteListQuery()).catch(() => undefined),
      loadCalculatorSite(queryClient, new URL(request.url).searchParams),
    ]);
    return null;
  };
}

/**
 * The frame of the shop calculators. The unit system lives in the address (`?units=`), so a link to a
 * calculator opens in the same units; without it, the units of the saw it was opened for (`?sawId=`), else of
 * the user's first site, else metric.
 */
export function CalculatorsLayout() {
  const [search, setSearch] = useSearchParams();
  const { data: sites } = useQuery(siteListQuery());
  const calculatorSite = useCalculatorSite(search);
  const system =
    unitSystemParam(search.get('units')) ?? calculatorSite.site?.unitSystem ?? sites?.items[0]?.unitSystem ?? 'metric';
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
          <CalculatorSwitcher system={system} params={sawParams(search)} />
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
