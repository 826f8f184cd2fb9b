import { createHash } from 'node:crypto';
import type { ErrorRequestHandler, Request, RequestHandler, Response } from 'express';
import { ipKeyGenerator } from 'express-rate-limit';
import { QueryTypes, type Sequelize } from 'sequelize';
import { HTTP_STATUS_BY_CODE } from '@kerfline/domain/errors';
import { AppError } from '../errors.js';
import { toAppError } from '../http/error-handler.js';

/**
 * Attempt counters for sign-in and the other routes that take a secret, kept in PostgreSQL (`rate_limit_hits`)
 * so every API process counts the same attempts. Rules (documented in DEVELOPERS.md, "Security and reliability"):
 *
 * - sign-in: failed attempts only, per client address (`signInPerAddress` in a 15-minute window) and per account
 *   (lockout with backoff: from the `lockoutAfter`-th failure in a row the account waits `lockoutBaseSeconds`,
 *   then twice as long after each further failure, at most `lockoutMaxSeconds`). A success clears the account's
 *   failures and does not count against the address, so a whole plant signing in from one address is never
 *   slowed; a malformed body is refused before anything is counted. Unknown e-mail addresses are counted and
 *   locked exactly like known ones, so the answers never tell whether an account exists.
 * - password change: failed attempts per person; reset completion and invitation links: failed attempts per
 *   address; reset requests: every request per address and per e-mail address (each mails someone).
 */
export type AttemptLimitSettings = {
  /** Failed sign-ins per client address in the window. */
  signInPerAddress: number;
  /** Failures in a row after which an account waits before its next try. */
  lockoutAfter: number;
  lockoutBaseSeconds: number;
  lockoutMaxSeconds: number;
  /** Failed password changes per person in the window. */
  passwordChangePerPerson: number;
  /** Password reset requests per client address, and per e-mail address, in the window. */
  resetRequestsPerAddress: number;
  resetRequestsPerEmail: number;
  /** Failed uses of a mailed link (invitation preview/accept, reset completion) per address in the window. */
  linkFailuresPerAddress: number;
};

export const DEFAULT_ATTEMPT_LIMITS: AttemptLimitSettings = {
  signInPerAddress: 30,
  lockoutAfter: 5,
  lockoutBaseSeconds: 60,
  lockoutMaxSeconds: 15 * 60,
  passwordChangePerPerson: 10,
  resetRequestsPerAddress: 10,
  resetRequestsPerEmail: 3,
  linkFailuresPerAddress: 20,
};

/** Every counter's window: fixed, from its first attempt. */
export const ATTEMPT_WINDOW_SECONDS = 15 * 60;
/** An account's failures in a row are forgotten this long after the last one. */
const FAILURE_MEMORY_SECONDS = 24 * 60 * 60;

/** The client's address as counters key it: IPv6 grouped by /56, since one customer line holds a whole block. */
export function clientAddress(req: Request): string {
  return ipKeyGenerator(req.ip ?? 'unknown');
}

/** A counter key for an e-mail address: its SHA-256, so the table keeps no list of addresses people typed. */
export function emailKey(email: string): string {
  return createHash('sha256').update(email.trim().toLowerCase()).digest('hex');
}

function waitWords(seconds: number): string {
  const minutes = Math.max(1, Math.ceil(seconds / 60));
  return minutes === 1 ? '1 minute' : `${minutes} minutes`;
}

/** A 429 that says how long to wait, with `Retry-After` set on the answer. */
export function tooMany(res: Response | undefined, seconds: number, what: string, otherwise = ''): AppError {
  const wait = Math.max(1, Math.ceil(seconds));
  res?.set('Retry-After', String(wait));
  return new AppError('RATE_LIMITED', `${what}; wait ${waitWords(wait)} and try again${otherwise}`);
}

export class AttemptCounters {
  constructor(
    private readonly sequelize: Sequelize,
    readonly settings: AttemptLimitSettings,
  ) {}

  /**
   * Counts one attempt under `key` unless `limit` attempts are already counted in the window. Atomic, so
   * parallel requests cannot all slip under the limit. Returns null when counted, else seconds to wait.
   */
  async claim(key: string, limit: number): Promise<number | null> {
    const rows = await this.sequelize.query<{ hits: number }>(
      `INSERT INTO rate_limit_hits AS r (key, hits, reset_at)
       VALUES (:key, 1, now() + make_interval(secs => :window))
       ON CONFLICT (key) DO UPDATE SET
         hits = CASE WHEN r.reset_at <= now() THEN 1 ELSE r.hits + 1 END,
         reset_at = CASE WHEN r.reset_at <= now() THEN now() + make_interval(secs => :window) ELSE r.reset_at END
       WHERE r.reset_at <= now() OR r.hits < :limit
       RETURNING hits`,
      { replacements: { key, limit, window: ATTEMPT_WINDOW_SECONDS }, type: QueryTypes.SELECT },
    );
    return rows.length > 0 ? null : this.secondsLeft(key);
  }

  /** Seconds until `key`'s window ends when it has `limit` attempts counted, else null. */
  async over(key: string, limit: number): Promise<number | null> {
    const [row] = await this.sequelize.query<{ left: number }>(
      `SELECT extract(epoch FROM reset_at - now())::float AS left FROM rate_limit_hits
        WHERE key = :key AND reset_at > now() AND hits >= :limit`,
      { replacements: { key, limit }, type: QueryTypes.SELECT },
    );
    return row ? row.left : null;
  }

  /** Counts one attempt under `key` (no limit check: for failures recorded after the fact). */
  async count(key: string): Promise<void> {
    await this.claim(key, Number.MAX_SAFE_INTEGER);
  }

  /** Takes back one counted attempt (it turned out to be a success, or our own error). */
  async release(key: string): Promise<void> {
    await this.sequelize.query(`UPDATE rate_limit_hits SET hits = greatest(hits - 1, 0) WHERE key = :key`, {
      replacements: { key },
    });
  }

  private async secondsLeft(key: string): Promise<number> {
    const [row] = await this.sequelize.query<{ left: number }>(
      `SELECT greatest(extract(epoch FROM reset_at - now()), 1)::float AS left FROM rate_limit_hits WHERE key = :key`,
      { replacements: { key }, type: QueryTypes.SELECT },
    );
    return row?.left ?? 1;
  }

  /**
   * Counts a sign-in attempt for an account before its password is checked. The row's `hits` are the failures
   * in a row and `reset_at` the moment it may try again (or, when not locked, its last failure). The attempt
   * that reaches `lockoutAfter` sets the wait at once, so parallel guesses meet the lock; a success then clears
   * the row. `waitSeconds` null: the attempt may go ahead (`locksForSeconds`: the wait it set, if it fails);
   * otherwise the account is waiting that long.
   */
  async claimAccount(
    email: string,
  ): Promise<{ waitSeconds: null; locksForSeconds: number | null } | { waitSeconds: number }> {
    const s = this.settings;
    // The failures in a row this attempt makes, as an SQL expression over the existing row `r`.
    const hits = `CASE WHEN r.reset_at < now() - make_interval(secs => :memory) THEN 1 ELSE r.hits + 1 END`;
    const wait = (h: string) =>
      `CASE WHEN ${h} >= :after
         THEN least(:base * power(2, ${h} - :after), :max)
         ELSE 0 END`;
    const rows = await this.sequelize.query<{ hits: number; wait: number }>(
      `INSERT INTO rate_limit_hits AS r (key, hits, reset_at)
       VALUES (:key, 1, now() + make_interval(secs => ${wait('1')}))
       ON CONFLICT (key) DO UPDATE SET
         hits = ${hits},
         reset_at = now() + make_interval(secs => ${wait(hits)})
       WHERE r.reset_at <= now()
       RETURNING hits, extract(epoch FROM reset_at - now())::float AS wait`,
      {
        replacements: {
          key: `account:${emailKey(email)}`,
          memory: FAILURE_MEMORY_SECONDS,
          after: s.lockoutAfter,
          base: s.lockoutBaseSeconds,
          max: s.lockoutMaxSeconds,
        },
        type: QueryTypes.SELECT,
      },
    );
    const row = rows[0];
    if (!row) return { waitSeconds: await this.secondsLeft(`account:${emailKey(email)}`) };
    return { waitSeconds: null, locksForSeconds: row.wait > 0 ? row.wait : null };
  }

  /** A successful sign-in: the account's failures are forgotten. */
  async clearAccount(email: string): Promise<void> {
    await this.sequelize.query(`DELETE FROM rate_limit_hits WHERE key = :key`, {
      replacements: { key: `account:${emailKey(email)}` },
    });
  }

  /** Takes back an account attempt that was neither a success nor a failure (our own error): no lock from it. */
  async releaseAccount(email: string): Promise<void> {
    await this.sequelize.query(
      `UPDATE rate_limit_hits SET hits = greatest(hits - 1, 0), reset_at = least(reset_at, now()) WHERE key = :key`,
      { replacements: { key: `account:${emailKey(email)}` } },
    );
  }

  /**
   * One sign-in attempt under both limits: the address's failures and the account's lock are claimed before
   * `check` runs (so a locked account's password is never even tried), then a success gives both back.
   * Returns the user, or null for a failure with the wait it caused, if any; throws RATE_LIMITED when refused.
   */
  async signIn<U>(
    req: Request,
    email: string,
    check: () => Promise<U | null>,
  ): Promise<{ user: U } | { user: null; lockedForSeconds: number | null }> {
    const addressKey = `sign-in:${clientAddress(req)}`;
    const addressWait = await this.claim(addressKey, this.settings.signInPerAddress);
    if (addressWait !== null)
      throw tooMany(req.res, addressWait, 'Too many failed sign-ins from this network in the last 15 minutes');
    const account = await this.claimAccount(email);
    if (account.waitSeconds !== null) {
      await this.release(addressKey);
      throw tooMany(
        req.res,
        account.waitSeconds,
        'Too many failed sign-ins for this account in a row, so to keep it safe it waits before the next try',
        ', or choose a new password with a link from "Forgotten your password?", which works at once',
      );
    }
    let user: U | null;
    try {
      user = await check();
    } catch (error) {
      await Promise.allSettled([this.release(addressKey), this.releaseAccount(email)]);
      throw error;
    }
    if (user === null) return { user: null, lockedForSeconds: account.locksForSeconds };
    await Promise.all([this.release(addressKey), this.clearAccount(email)]);
    return { user };
  }

  /**
   * Limits a route's failed attempts (answers of 400 and above after the body was accepted) per key: `guard`
   * goes after `validate`, refusing with 429 once `limit` failures are counted in the window; `count` goes last
   * in the route, as its error handler, and counts the failure before the error answer is sent.
   */
  failureLimit(
    bucket: string,
    limit: () => number,
    keyOf: (req: Request, res: Response) => string,
    what: string,
  ): { guard: RequestHandler; count: ErrorRequestHandler } {
    const local = `attemptKey:${bucket}`;
    return {
      guard: async (req, res, next) => {
        const key = `${bucket}:${keyOf(req, res)}`;
        const wait = await this.over(key, limit());
        if (wait !== null) throw tooMany(res, wait, what);
        res.locals[local] = key;
        next();
      },
      count: async (err: unknown, _req, res, next) => {
        const key = res.locals[local] as string | undefined;
        // Our own failures (5xx: the database away, a bug) are not the caller's failed attempts.
        if (key && HTTP_STATUS_BY_CODE[toAppError(err).error.code] < 500) await this.count(key).catch(() => undefined);
        next(err);
      },
    };
  }

  /** Limits every request per key (each one costs something, such as a mail): 429 once `limit` are counted. */
  requestLimit(
    bucket: string,
    limit: () => number,
    keyOf: (req: Request, res: Response) => string,
    what: string,
  ): RequestHandler {
    return async (req, res, next) => {
      const wait = await this.claim(`${bucket}:${keyOf(req, res)}`, limit());
      if (wait !== null) throw tooMany(res, wait, what);
      next();
    };
  }
}
