import { Link, useLocation } from 'react-router-dom';
import { buttonClass } from './button';
import { formatNumber } from '../format';

/**
 * Previous / next through a paged list. The offset lives in the URL (`offset`), next to the filters, so a
 * page of results can be shared and reloaded.
 */
export function Pager({ total, limit, offset, noun }: { total: number; limit: number; offset: number; noun: string }) {
  const location = useLocation();
  if (total === 0) return null;

  const hrefFor = (nextOffset: number) => {
    const params = new URLSearchParams(location.search);
    if (nextOffset > 0) params.set('offset', String(nextOffset));
    else params.delete('offset');
    const search = params.toString();
    return `${location.pathname}${search ? `?${search}` : ''}`;
  };

  const first = offset + 1;
  const last = Math.min(offset + limit, total);
  return (
    <nav
      aria-label={`Pages of ${noun}`}
      className="flex flex-wrap items-center justify-between gap-3 text-sm text-ink-muted"
    >
      <p className="tabular">
        {formatNumber(first)}–{formatNumber(last)} of {formatNumber(total)} {noun}
      </p>
      {total > limit ? (
        <div className="flex gap-2">
          {offset > 0 ? (
            <Link className={buttonClass('secondary')} to={hrefFor(Math.max(0, offset - limit))}>
              Previous
            </Link>
          ) : null}
          {last < total ? (
            <Link className={buttonClass('secondary')} to={hrefFor(offset + limit)}>
              Next
            </Link>
          ) : null}
        </div>
      ) : null}
    </nav>
  );
}
