import session from 'express-session';
import connectPgSimple from 'connect-pg-simple';
import type { Pool } from 'pg';
import { signedInSql, type SignedInRow } from '../modules/auth/auth.service.js';

/** What a read found beside the session, kept for this request only (keyed by its request and its session). */
type ReadAlong = { expiresInStore: number; userId: string | undefined; person: SignedInRow | null };
const READ_ALONG = Symbol('read along with the session');
type StoredSession = session.SessionData & { [READ_ALONG]?: ReadAlong; passport?: { user?: unknown } };
const storedExpiry = new WeakMap<object, number>();
const personOfRequest = new WeakMap<object, { userId: string | undefined; person: SignedInRow | null }>();

/**
 * The signed-in person the session store read in the same statement as this request's session (their row, or
 * null when no active person has that id any more), for `requireSignIn`; undefined when the request's session was
 * not read that way. It lives as long as the request: nothing outlives it.
 */
export function personReadWithSession(
  req: object,
): { userId: string | undefined; person: SignedInRow | null } | undefined {
  return personOfRequest.get(req);
}

/**
 * How often an active session's expiry is written: a hundredth of the idle timeout, at most a minute. An active
 * session's stored expiry is therefore never more than that behind its last request, so the idle timeout ends it
 * at most that much early (a minute of 12 hours by default) and never late.
 */
export function touchIntervalMs(idleMs: number): number {
  return Math.min(60_000, Math.floor(idleMs / 100));
}

/** The expiry, in whole seconds, that connect-pg-simple writes for a session: its cookie's, else a day from now. */
function expirySeconds(sess: session.SessionData): number {
  const expires = sess.cookie?.expires;
  return Math.ceil(expires ? new Date(expires).valueOf() / 1000 : Date.now() / 1000 + 86_400);
}

/**
 * Sessions in PostgreSQL (table `sessions`), so any API process can serve any request.
 *
 * Every signed-in request used to pay five round trips before its own work: the session read, the person, their
 * sites, their sites' regions, and the touch (express-session extends the expiry on every answered request, and
 * the answer waits for it). Here it pays one:
 * - the read of the session also reads the person it names and their scope (`signedInSql`), in the same
 *   statement, for `requireSignIn` to build the ability from: still from the database on every request, so a
 *   change of role, sites or region, or a deactivation, applies at once; kept for that request alone;
 * - the read also takes the stored expiry, and the touch writes only when the new expiry is at least
 *   `touchEveryMs` later than the stored one (or earlier than it); the stored expiry is what the store filters
 *   on, so the idle timeout stays enforced by every process.
 *
 * The touch that does write skips waiting for the disk (synchronous_commit off): after a database crash, a touch
 * lost from its last fraction of a second only makes that session end a little sooner. Sign-in (a save) and
 * sign-out (a delete) keep full durability. Measured with `npm run bench:floor` (DEVELOPERS.md, "Scale").
 */
export function createSessionStore(pool: Pool, options: { touchEveryMs: number }): session.Store {
  const PgStore = connectPgSimple(session);
  // The id the session names (passport's), as a uuid, or NULL (no row) when it is not one.
  const namedUser = `CASE WHEN s.sess->'passport'->>'user' ~* '^[0-9a-f]{8}-[0-9a-f]{4}-[0-9a-f]{4}-[0-9a-f]{4}-[0-9a-f]{12}$'
                       THEN (s.sess->'passport'->>'user')::uuid END`;
  const readSql = `
    SELECT s.sess, extract(epoch FROM s.expire::timestamptz)::float8 AS expire,
           (SELECT to_json(p) FROM (${signedInSql(namedUser)}) p) AS person
    FROM sessions s
    WHERE s.sid = $1 AND s.expire >= to_timestamp($2)`;

  class SessionStore extends PgStore {
    /** The library's own read starts its timer that prunes expired sessions: the first read of a process uses it. */
    private pruning = false;

    override get(sid: string, done: (err: unknown, sess?: session.SessionData | null) => void): void {
      if (!this.pruning) {
        this.pruning = true;
        return super.get(sid, done);
      }
      // The column has no time zone: its expiry is read back through the connection's zone, as to_timestamp wrote it.
      pool
        .query<{ sess: StoredSession | string; expire: number; person: SignedInRow | null }>(readSql, [
          sid,
          Math.ceil(Date.now() / 1000),
        ])
        .then(
          ({ rows: [row] }) => {
            if (!row) return done(null, null);
            let sess: StoredSession;
            try {
              sess = typeof row.sess === 'string' ? (JSON.parse(row.sess) as StoredSession) : row.sess;
            } catch {
              // As the library does: a session that cannot be read is removed.
              return this.destroy(sid, (err) => done(err, null));
            }
            const userId = sess.passport?.user;
            sess[READ_ALONG] = {
              expiresInStore: row.expire,
              userId: typeof userId === 'string' ? userId : undefined,
              person: row.person,
            };
            done(null, sess);
          },
          (error: unknown) => done(error),
        );
    }

    /** express-session makes the request's session here: what was read beside it is kept for this request only. */
    override createSession(req: Parameters<session.Store['createSession']>[0], sess: session.SessionData) {
      const stored = sess as StoredSession;
      const along = stored[READ_ALONG];
      delete stored[READ_ALONG];
      const made = super.createSession(req, sess);
      if (along) {
        storedExpiry.set(made, along.expiresInStore);
        personOfRequest.set(req, { userId: along.userId, person: along.person });
      }
      return made;
    }

    override touch(sid: string, sess: session.SessionData, done?: (err?: unknown) => void): void {
      if (!/^[\w-]+$/.test(sid)) return super.touch(sid, sess, done);
      const expire = expirySeconds(sess);
      const stored = storedExpiry.get(sess);
      if (stored !== undefined && expire >= stored && (expire - stored) * 1000 < options.touchEveryMs) {
        done?.();
        return;
      }
      pool
        .query(
          `SET LOCAL synchronous_commit = off; UPDATE sessions SET expire = to_timestamp(${expire}) WHERE sid = '${sid}'`,
        )
        .then(
          () => done?.(),
          (error: unknown) => done?.(error),
        );
    }
  }
  // The pool must listen for errors: an idle client the server drops (a PostgreSQL restart) emits one, and an
  // unheard 'error' event would end the process. The pool replaces the client on the next request.
  pool.on('error', () => undefined);
  return new SessionStore({ pool, tableName: 'sessions', pruneSessionInterval: 15 * 60 });
}
