import { useLocation, useNavigation, useSearchParams } from 'react-router-dom';
import type { OnChangeFn, SortingState } from '@tanstack/react-table';
import { sortOf, sortingOf, withFilters } from '../../../lib/list-search';

/**
 * A record table's state in the URL, for a page: the current filters, a setter that starts again from the first
 * page, the table's sorting for the sort the API was asked for, and whether the next page is loading (the
 * router's loader fetches it before the page changes).
 */
export function useTableUrl(defaultSort: string) {
  const [search, setSearch] = useSearchParams();
  const navigation = useNavigation();
  const location = useLocation();
  // While the last change is still loading, the page shows the old address: build the next one on the address
  // being loaded, so a second change made meanwhile keeps the first.
  const pending =
    navigation.location && navigation.location.pathname === location.pathname
      ? new URLSearchParams(navigation.location.search)
      : null;
  const setFilters = (changes: Record<string, string | undefined>) =>
    setSearch(withFilters(pending ?? search, changes));
  const sortingFor = (sort: string): { sorting: SortingState; onSortingChange: OnChangeFn<SortingState> } => ({
    sorting: sortingOf(sort),
    onSortingChange: (updater) => {
      const pendingSort = pending ? (pending.get('sort') ?? defaultSort) : sort;
      const next = typeof updater === 'function' ? updater(sortingOf(pendingSort)) : updater;
      const wanted = sortOf(next);
      setFilters({ sort: wanted === defaultSort ? undefined : wanted });
    },
  });
  return { search, setFilters, sortingFor, busy: navigation.state === 'loading' };
}
