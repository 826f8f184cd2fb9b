import { Link } from 'react-router-dom';
import { Notice } from '../../../lib/ui/notice';

/** Missing exchange rates, said plainly: the totals marked * leave that money out until a rate is entered. */
export function RateWarning({ warnings, canEnterRates }: { warnings: string[]; canEnterRates: boolean }) {
  if (warnings.length === 0) return null;
  return (
    <Notice tone="caution" title="Some money could not be converted">
      <ul className="list-disc pl-5">
        {warnings.map((w) => (
          <li key={w}>{w}</li>
        ))}
      </ul>
      <p className="mt-1">
        Totals marked * leave that money out, and cost per area is not shown for those months.{' '}
        {canEnterRates ? (
          <Link to="/exchange-rates" className="font-semibold underline">
            Enter the rates
          </Link>
        ) : (
          'An administrator can enter the rates.'
        )}
      </p>
    </Notice>
  );
}
