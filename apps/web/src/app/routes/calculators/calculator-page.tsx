import { useQuery, type QueryClient } from '@tanstack/react-query';
import { useParams, type LoaderFunctionArgs } from 'react-router-dom';
import type { Saw } from '@kerfline/domain/saws/schema';
import { sawListQuery } from '../../../features/saws/api/queries';
import { sawListQueryFromSearch } from '../../../features/saws/api/list-search';
import { BandLengthCalculator } from '../../../features/calculators/components/band-length-calculator';
import { BandSpeedCalculator } from '../../../features/calculators/components/band-speed-calculator';
import { BreakInCalculator } from '../../../features/calculators/components/break-in-calculator';
import { CheckTargetsCalculator } from '../../../features/calculators/components/check-targets-calculator';
import { StockAreaCalculator } from '../../../features/calculators/components/stock-area-calculator';
import { TeethInWorkCalculator } from '../../../features/calculators/components/teeth-in-work-calculator';
import { isCalculatorSlug, type CalculatorSlug } from '../../../features/calculators/components/catalogue';
import type { CalculatorSaw } from '../../../features/calculators/components/saw-picker';
import { useCalculatorsContext } from './calculators-page';

/** The calculators that can take figures from one of the user's saws. */
const USES_SAWS: readonly CalculatorSlug[] = ['band-speed', 'check-targets'];

/** The saws in use at the user's sites: the same list (and cache entry) the saws page shows first. */
const sawsInUse = () => sawListQuery(sawListQueryFromSearch(new URLSearchParams()));

export function calculatorPageLoader(queryClient: QueryClient) {
  return async ({ params }: LoaderFunctionArgs) => {
    const slug = params.calculator;
    if (!isCalculatorSlug(slug)) throw new Response(null, { status: 404, statusText: 'Not Found' });
    // The saws only save typing: the calculator works without them.
    if (USES_SAWS.includes(slug)) await queryClient.ensureQueryData(sawsInUse()).catch(() => undefined);
    return null;
  };
}

/** A saw's record as the plain SI figures a calculator takes. */
function calculatorSaw(saw: Saw): CalculatorSaw {
  return {
    id: saw.id,
    label: `${saw.assetTag} · ${saw.name}`,
    bandThicknessMm: saw.bandThicknessMm,
    bandWidthMm: saw.bandWidthMm,
    bandSpeedMinMPerMin: saw.bandSpeedMinMPerMin,
    bandSpeedMaxMPerMin: saw.bandSpeedMaxMPerMin,
  };
}

/** One calculator, chosen by the last part of the address, in the units of the calculators' frame. */
export function CalculatorPage() {
  const slug = useParams().calculator;
  const { system } = useCalculatorsContext();
  const { data: sawPage } = useQuery({ ...sawsInUse(), enabled: isCalculatorSlug(slug) && USES_SAWS.includes(slug) });
  const saws = sawPage?.items.map(calculatorSaw) ?? [];

  switch (slug) {
    case 'teeth-in-work':
      return <TeethInWorkCalculator system={system} />;
    case 'band-length':
      return <BandLengthCalculator system={system} />;
    case 'band-speed':
      return <BandSpeedCalculator system={system} saws={saws} />;
    case 'stock-area':
      return <StockAreaCalculator system={system} />;
    case 'break-in':
      return <BreakInCalculator system={system} />;
    case 'check-targets':
      return <CheckTargetsCalculator system={system} saws={saws} />;
    default:
      // The loader turns an unknown calculator away before this page renders.
      return null;
  }
}
