import type { QueryClient } from '@tanstack/react-query';
import { sawKeys } from '../../../features/saws/api/keys';
import { siteSummaryKeys } from '../../../features/site-summaries/api/keys';
import { siteStockKeys } from '../../../features/blade-stock/api/keys';
import { bladeRunKeys } from '../../../features/blade-runs/api/keys';
import { stopKeys } from '../../../features/stops/api/keys';

/**
 * After a record is written at a saw (a blade on or off, a stop logged or ended): the saw's detail (its state, and
 * under it its timeline and break-in plans), the saw lists, the site tiles' figures and the site's stock are
 * stale. Each feature's own mutation has already refreshed its lists and the record's detail.
 */
export function refreshAfterSawRecord(queryClient: QueryClient, saw: { id: string; siteId: string }): Promise<unknown> {
  return Promise.all([
    queryClient.invalidateQueries({ queryKey: sawKeys.detail(saw.id) }),
    queryClient.invalidateQueries({ queryKey: sawKeys.lists() }),
    queryClient.invalidateQueries({ queryKey: siteSummaryKeys.lists() }),
    queryClient.invalidateQueries({ queryKey: siteStockKeys.all(saw.siteId) }),
    queryClient.invalidateQueries({ queryKey: bladeRunKeys.lists() }),
    queryClient.invalidateQueries({ queryKey: stopKeys.lists() }),
  ]);
}

/** A message a form leaves for the page it returns to (shown once, in words). */
export type ReturnNotice = { tone: 'info' | 'caution'; title: string; lines?: string[] };

export function returnNoticeOf(state: unknown): ReturnNotice | null {
  const notice = (state as { notice?: ReturnNotice } | null)?.notice;
  return notice && typeof notice.title === 'string' ? notice : null;
}
