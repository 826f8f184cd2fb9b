import { mkdtemp, readdir, rm } from 'node:fs/promises';
import { tmpdir } from 'node:os';
import path from 'node:path';
import type { Sequelize } from 'sequelize';
import type { CaughtMail } from '@kerfline/domain/mail/schema';
import { readCaughtMail, startMailCatcher, waitForCaughtMail, type MailCatcher } from '../mail/catcher.js';

export type TestMail = MailCatcher & {
  /** Waits for a message to `to` (optionally matching `where`). */
  waitFor: (to: string, where?: (mail: CaughtMail) => boolean, timeoutMs?: number) => Promise<CaughtMail>;
  /** Every caught message to `to`. */
  to: (to: string) => Promise<CaughtMail[]>;
  clear: () => Promise<void>;
};

/** A local mail catcher on a free loopback port with its own folder: the same code start.sh runs. */
export async function startTestMail(): Promise<TestMail> {
  const dir = await mkdtemp(path.join(tmpdir(), 'kerfline-mail-'));
  const catcher = await startMailCatcher({ dir });
  return {
    ...catcher,
    waitFor: (to, where, timeoutMs) => waitForCaughtMail(dir, to, where, timeoutMs),
    to: async (to) => (await readCaughtMail(dir, { limit: 1000, offset: 0 })).items.filter((m) => m.to.includes(to)),
    clear: async () => {
      for (const name of await readdir(dir)) await rm(path.join(dir, name), { force: true });
    },
    close: async () => {
      await catcher.close();
      await rm(dir, { recursive: true, force: true });
    },
  };
}

/** The 43-character secret in a mailed link to `page` (`invitation` or `reset-password`). */
export function linkTokenIn(mail: CaughtMail, page: 'invitation' | 'reset-password'): string {
  const match = new RegExp(`/${page}#token=([A-Za-z0-9_-]{43})`).exec(mail.text);
  if (!match) throw new Error(`no ${page} link in the mail:\n${mail.text}`);
  return match[1]!;
}

/** Empties the job queue's tables between tests, so no job left by one test is run in another. */
export async function clearJobs(sequelize: Sequelize): Promise<void> {
  await sequelize.query(`DO $$ BEGIN
    IF to_regclass('pgboss.job') IS NOT NULL THEN DELETE FROM pgboss.job; END IF;
  END $$;`);
}

/** Waits until `check` is true (polling the database, say), or fails after `timeoutMs`. */
export async function eventually(check: () => Promise<boolean>, what: string, timeoutMs = 15_000): Promise<void> {
  const until = Date.now() + timeoutMs;
  while (!(await check())) {
    if (Date.now() > until) throw new Error(`timed out waiting until ${what}`);
    await new Promise((r) => setTimeout(r, 150));
  }
}
