import { AsyncLocalStorage } from 'node:async_hooks';
import type { RequestHandler } from 'express';
import type { Sequelize } from 'sequelize';

/**
 * Reads on a PostgreSQL read replica, writes on the primary (Sequelize's `replication`), without showing anyone
 * a stale copy of what they just wrote.
 *
 * Sequelize sends a query to a replica when it is a SELECT outside a transaction and not marked `useMaster`.
 * Everything in a transaction (every write here runs in `inTransaction`) and every non-SELECT goes to the
 * primary. On top of that, a request is pinned to the primary for all of its reads when
 * - it is not a GET or HEAD (a write, or a sign-in: what it reads back must be what it wrote), or
 * - its session wrote within the last `windowMs` (the replica may still be a few milliseconds behind, so the
 *   person's next pages, which list and open what they just wrote, read the primary).
 * The session is kept in PostgreSQL, so the mark is seen by every API process behind the balancer.
 */
const pinned = new AsyncLocalStorage<boolean>();

type ConnectionManager = { getConnection(options?: { type?: string; useMaster?: boolean }): Promise<unknown> };

/** A statement that writes or locks, even when its caller reads rows back (`type: SELECT` on `… RETURNING`). */
const WRITES =
  /^\s*(insert|update|delete|merge|with\b[\s\S]*\b(insert|update|delete)\b)|\bfor (no key )?update\b|\bfor share\b/i;

/**
 * Makes every query issued inside a pinned request or job ask Sequelize for the primary, and every statement that
 * writes or locks go there whatever type its caller gave it. Call once per Sequelize.
 */
export function routeReadsByRequest(sequelize: Sequelize): void {
  const manager = (sequelize as unknown as { connectionManager: ConnectionManager }).connectionManager;
  const getConnection = manager.getConnection.bind(manager);
  manager.getConnection = (options = {}) =>
    getConnection(pinned.getStore() === true ? { ...options, useMaster: true } : options);
  const query = sequelize.query.bind(sequelize) as (sql: unknown, options?: object) => Promise<unknown>;
  (sequelize as unknown as { query: typeof query }).query = (sql, options) =>
    query(sql, typeof sql === 'string' && WRITES.test(sql) ? { ...options, useMaster: true } : options);
}

/** Runs `work` with every read on the primary (job workers: they read back what they just claimed). */
export function onPrimary<T>(work: () => Promise<T>): Promise<T> {
  return pinned.run(true, work);
}

/** Whether queries made here go to the primary because of the request they serve (for tests). */
export function readsPinnedToPrimary(): boolean {
  return pinned.getStore() === true;
}

type SessionWithWrites = { lastWriteAt?: number; passport?: { user?: unknown } };

/** Express middleware (after the session): pins a request's reads to the primary as described above. */
export function readYourWrites(windowMs: number): RequestHandler {
  return (req, _res, next) => {
    const session = (req as { session?: SessionWithWrites }).session;
    const writing = req.method !== 'GET' && req.method !== 'HEAD';
    const recent = session?.lastWriteAt !== undefined && Date.now() - session.lastWriteAt < windowMs;
    // Only a signed-in session is marked: an anonymous one (a failed sign-in) is never stored for it.
    if (writing && session?.passport?.user !== undefined) session.lastWriteAt = Date.now();
    pinned.run(writing || recent, () => next());
  };
}
