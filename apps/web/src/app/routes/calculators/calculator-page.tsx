import { useQuery, useQueryClient, type QueryClient } from '@tanstack/react-query';
import { Link, useParams, useSearchParams, type LoaderFunctionArgs } from 'react-router-dom';
import { sawListQuery } from '../../../features/saws/api/queries';
import { sawListQueryFromSearch } from '../../../features/saws/api/list-search';
import { BandLengthCalculator } from '../../../features/calculators/components/band-length-calculator';
import { BandSpeedCalculator } from '../../../features/calculators/components/band-speed-calculator';
import { BreakInCalculator } from '../../../features/calculators/components/break-in-calculator';
import { CheckTargetsCalculator } from '../../../features/calculators/components/check-targets-calculator';
import { StockAreaCalculator } from '../../../features/calculators/components/stock-area-calculator';
import { TeethInWorkCalculator } from '../../../features/calculators/components/teeth-in-work-calculator';
import { isCalculatorSlug, type CalculatorSlug } from '../../../features/calculators/components/catalogue';
import { sawStartTexts, startTextsFromSearch } from '../../../features/calculators/components/saw-links';
import { useCalculatorsContext } from './calculators-page';
import {
  calculatorSaw,
  loadCalculatorSite,
  sawIdFromSearch,
  sawMaterialStart,
  useCalculatorSite,
  type CalculatorSite,
} from './calculator-site';

/** The calculators that can take figures from one of the user's saws. */
const USES_SAWS: readonly CalculatorSlug[] = ['band-speed', 'check-targets'];

/** The saws in use at the user's sites: the same list (and cache entry) the saws page shows first. */
const sawsInUse = () => sawListQuery(sawListQueryFromSearch(new URLSearchParams()));

export function calculatorPageLoader(queryClient: QueryClient) {
  return async ({ params, request }: LoaderFunctionArgs) => {
    const slug = params.calculator;
    if (!isCalculatorSlug(slug)) throw new Response(null, { status: 404, statusText: 'Not Found' });
    const search = new URL(request.url).searchParams;
    await Promise.all([
      // The saws only save typing: the calculator works without them.
      USES_SAWS.includes(slug) ? queryClient.ensureQueryData(sawsInUse()).catch(() => undefined) : undefined,
      loadCalculatorSite(queryClient, search),
    ]);
    return null;
  };
}

/** Says which saw and whose settings the figures are for, with a way back to the saw. */
function ForSaw({ site }: { site: CalculatorSite }) {
  if (!site.saw && !site.site) return null;
  return (
    <p className="rounded-sheet border border-rule bg-card px-3 py-2 text-sm text-ink">
      {site.saw ? (
        <>
          For{' '}
          <Link to={`/saws/${site.saw.id}`} className="font-bold underline underline-offset-4">
            {site.saw.assetTag} · {site.saw.name}
          </Link>
          {site.site ? ', with ' : ''}
        </>
      ) : (
        'With '
      )}
      {site.site ? (
        <>
          the settings of{' '}
          <Link to={`/sites/${site.site.id}/settings`} className="font-semibold underline underline-offset-4">
            {site.site.name}
          </Link>
        </>
      ) : null}
      .
    </p>
  );
}

/**
 * One calculator, chosen by the last part of the address, in the units of the calculators' frame. Opened for a
 * saw (`?sawId=`), it uses that saw's site settings and starts from the figures the address carries.
 */
export function CalculatorPage() {
  const slug = useParams().calculator;
  const [search] = useSearchParams();
  const { system } = useCalculatorsContext();
  const { data: sawPage } = useQuery({ ...sawsInUse(), enabled: isCalculatorSlug(slug) && USES_SAWS.includes(slug) });
  const saws = sawPage?.items.map(calculatorSaw) ?? [];
  const site = useCalculatorSite(search);
  const saw = site.saw ? calculatorSaw(site.saw) : undefined;
  // The figures the calculator opens with: the saw's, then any the address gives. A new address (another saw)
  // starts the calculator afresh.
  const queryClient = useQueryClient();
  const start = {
    ...(saw ? sawStartTexts(saw, system) : {}),
    ...sawMaterialStart(queryClient, sawIdFromSearch(search)),
    ...startTextsFromSearch(search),
  };
  const key = `${slug}:${search.get('sawId') ?? ''}`;

  let calculator;
  switch (slug) {
    case 'teeth-in-work':
      calculator = <TeethInWorkCalculator system={system} settings={site.settings} timeZone={site.site?.timeZone} />;
      break;
    case 'band-length':
      calculator = <BandLengthCalculator system={system} />;
      break;
    case 'band-speed':
      calculator = (
        <BandSpeedCalculator
          key={key}
          system={system}
          saws={saws}
          saw={saw}
          start={start}
          settings={site.settings}
          timeZone={site.site?.timeZone}
        />
      );
      break;
    case 'stock-area':
      calculator = <StockAreaCalculator system={system} />;
      break;
    case 'break-in':
      calculator = (
        <BreakInCalculator
          key={key}
          system={system}
          start={start}
          settings={site.settings}
          timeZone={site.site?.timeZone}
        />
      );
      break;
    case 'check-targets':
      calculator = (
        <CheckTargetsCalculator
          key={key}
          system={system}
          saws={saws}
          saw={saw}
          start={start}
          settings={site.settings}
          timeZone={site.site?.timeZone}
        />
      );
      break;
    default:
      // The loader turns an unknown calculator away before this page renders.
      return null;
  }
  return (
    <div className="space-y-4">
      <ForSaw site={site} />
      {calculator}
    </div>
  );
}
