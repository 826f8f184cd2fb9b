import { NavLink } from 'react-router-dom';
import { subject } from '@casl/ability';
import { useAppAbility } from '../../../lib/ability';

const linkClass = ({ isActive }: { isActive: boolean }) =>
  `flex min-h-11 items-center rounded-sheet border px-3 text-sm font-semibold whitespace-nowrap ${
    isActive ? 'border-accent bg-accent-soft text-accent-dark' : 'border-rule bg-card text-ink hover:bg-paper-deep'
  }`;

/**
 * The site's records, one tap each: its saws, the work of today, stock, blade runs, stops, and (for those who may
 * read it) the history of changes and the removed entries; the list of checks, those due and those recorded.
 */
export function SiteRecordsNav({ siteId }: { siteId: string }) {
  const ability = useAppAbility();
  const base = `/sites/${siteId}`;
  const canReadStock = ability.can('read', subject('StockReceipt', { id: '', siteId }));
  const canReadHistory = ability.can('read', subject('AuditEntry', { id: '', siteId }));
  const canPutBack = ability.can('update', subject('RemovedRecord', { id: '', siteId }));
  return (
    <nav aria-label="The site’s records" className="-mx-1 flex gap-2 overflow-x-auto px-1 pb-1">
      <NavLink to={base} end className={linkClass}>
        Saws
      </NavLink>
      <NavLink to={`/today?site=${siteId}`} className={linkClass}>
        Today
      </NavLink>
      {canReadStock ? (
        <NavLink to={`${base}/stock`} className={linkClass}>
          Blade stock
        </NavLink>
      ) : null}
      <NavLink to={`${base}/blade-runs`} className={linkClass}>
        Blade runs
      </NavLink>
      <NavLink to={`${base}/stops`} className={linkClass}>
        Stops
      </NavLink>
      <NavLink to={`${base}/checks`} end className={linkClass}>
        Checks
      </NavLink>
      <NavLink to={`${base}/checks/overdue`} className={linkClass}>
        Checks due
      </NavLink>
      <NavLink to={`${base}/check-records`} className={linkClass}>
        Checks recorded
      </NavLink>
      {canReadHistory ? (
        <NavLink to={`${base}/history`} className={linkClass}>
          History
        </NavLink>
      ) : null}
      {canPutBack ? (
        <NavLink to={`${base}/removed`} className={linkClass}>
          Removed entries
        </NavLink>
      ) : null}
    </nav>
  );
}
