import { z } from 'zod';
import type { AttemptLimitSettings } from '../security/attempt-limits.js';

function bool(fallback: 'true' | 'false') {
  return z
    .enum(['true', 'false'], { message: 'must be true or false' })
    .default(fallback)
    .transform((v) => v === 'true');
}

function isTimeZone(value: string): boolean {
  try {
    new Intl.DateTimeFormat('en', { timeZone: value });
    return true;
  } catch {
    return false;
  }
}

const envSchema = z.object({
  NODE_ENV: z.enum(['development', 'production', 'test']).default('development'),
  PORT: z.coerce.number().int().min(1).max(65535).default(3000),
  /** Address to listen on; 0.0.0.0 behind a load balancer. */
  HOST: z.string().default('127.0.0.1'),
  /** Full connection string; when absent, built from the PG* variables our scripts export. */
  DATABASE_URL: z.string().optional(),
  PGHOST: z.string().default('127.0.0.1'),
  PGPORT: z.coerce.number().int().default(55432),
  PGUSER: z.string().default('postgres'),
  PGPASSWORD: z.string().optional(),
  PGDATABASE: z.string().default('kerfline'),
  /** A streaming replica of the same cluster for reads (off when neither is set); writes stay on the primary. */
  DATABASE_REPLICA_URL: z.string().optional(),
  PGREPLICA_PORT: z.coerce.number().int().min(1).max(65535).optional(),
  /** How long a session's reads stay on the primary after it wrote (with a replica). */
  READ_YOUR_WRITES_SECONDS: z.coerce.number().min(0).max(3600).default(10),
  SESSION_SECRET: z.string().min(16, { message: 'SESSION_SECRET must be at least 16 characters' }),
  /** Folder with the built web app; served by the API in production. */
  WEB_DIST: z.string().optional(),
  LOG_LEVEL: z.enum(['fatal', 'error', 'warn', 'info', 'debug', 'trace', 'silent']).default('info'),
  /** Failed sign-ins allowed per client address in 15 minutes (successes never count). */
  SIGN_IN_LIMIT: z.coerce.number().int().min(1).default(30),
  /** Failed sign-ins in a row after which an account waits before its next try; the wait doubles each time. */
  SIGN_IN_LOCKOUT_AFTER: z.coerce.number().int().min(1).max(100).default(5),
  SIGN_IN_LOCKOUT_BASE_SECONDS: z.coerce.number().int().min(1).max(3600).default(60),
  SIGN_IN_LOCKOUT_MAX_MINUTES: z.coerce
    .number()
    .int()
    .min(1)
    .max(24 * 60)
    .default(15),
  /** Failed password changes per person, reset requests per address and per e-mail address, and failed uses of
   * mailed links (invitations, resets) per address, each in 15 minutes. */
  PASSWORD_CHANGE_LIMIT: z.coerce.number().int().min(1).default(10),
  PASSWORD_RESET_REQUEST_LIMIT: z.coerce.number().int().min(1).default(10),
  PASSWORD_RESET_EMAIL_LIMIT: z.coerce.number().int().min(1).default(3),
  LINK_LIMIT: z.coerce.number().int().min(1).default(20),
  /** A session ends after this long unused, and in any case this long after sign-in. */
  SESSION_IDLE_HOURS: z.coerce
    .number()
    .positive()
    .max(24 * 30)
    .default(12),
  SESSION_MAX_DAYS: z.coerce.number().positive().max(365).default(7),
  /** Set when the app sits behind a TLS-terminating load balancer: marks cookies Secure, trusts X-Forwarded-*. */
  TRUST_PROXY: z
    .enum(['true', 'false'])
    .default('false')
    .transform((v) => v === 'true'),

  /** Where links in e-mails point: the address people open Kerfline at. Defaults to http://127.0.0.1:PORT. */
  PUBLIC_URL: z
    .url({ message: 'PUBLIC_URL must be a full address such as https://kerfline.example.com' })
    .optional()
    .transform((v) => v?.replace(/\/+$/, '')),
  /** The mail server Kerfline sends through; start.sh and test.sh run a local catcher on 127.0.0.1:SMTP_PORT. */
  SMTP_HOST: z.string().min(1).default('127.0.0.1'),
  SMTP_PORT: z.coerce.number().int().min(1).max(65535).default(2525),
  /** true for a server that speaks TLS from the first byte (usually port 465); otherwise STARTTLS when offered. */
  SMTP_SECURE: bool('false'),
  SMTP_USER: z.string().optional(),
  SMTP_PASSWORD: z.string().optional(),
  /** The sender of every mail, e.g. "Kerfline <kerfline@plant.example>". */
  MAIL_FROM: z.string().min(3).default('Kerfline <kerfline@localhost>'),
  /** Folder where the local mail catcher keeps what it receives; set, it turns on the admins' outbox page. */
  MAIL_CATCHER_DIR: z.string().optional(),
  /** Attempts after the first, and the first wait between them; waits double each time. */
  MAIL_RETRY_LIMIT: z.coerce.number().int().min(0).max(20).default(5),
  MAIL_RETRY_DELAY_SECONDS: z.coerce.number().int().min(1).max(86_400).default(60),
  /** Whether this process runs the job workers and schedules; any number of processes may, none double-sends. */
  JOBS_WORKERS: bool('true'),
  /** Cron lines (minute hour day month weekday) for the scheduled mail, read in SCHEDULE_TIME_ZONE. */
  WEEKLY_DIGEST_CRON: z.string().min(9).default('0 6 * * 1'),
  MONTHLY_SUMMARY_CRON: z.string().min(9).default('0 6 1 * *'),
  /** How often pg-boss looks at the schedules (its defaults, 30 s and 5 s, when unset); tests go faster. */
  JOBS_CRON_CHECK_SECONDS: z.coerce.number().int().min(1).max(60).optional(),
  /** The largest file one import takes, in bytes (50 MiB), and the most rows. */
  IMPORT_MAX_BYTES: z.coerce
    .number()
    .int()
    .min(1024)
    .max(1024 * 1024 * 1024)
    .default(50 * 1024 * 1024),
  IMPORT_MAX_ROWS: z.coerce.number().int().min(1).max(2_000_000).default(200_000),
  SCHEDULE_TIME_ZONE: z
    .string()
    .default('UTC')
    .refine(isTimeZone, { message: 'SCHEDULE_TIME_ZONE must be an IANA time zone such as Europe/Berlin' }),
});
export type Env = z.infer<typeof envSchema>;

/** Parses the environment once at boot and fails fast with every problem listed. */
export function loadEnv(source: NodeJS.ProcessEnv = process.env): Env {
  const parsed = envSchema.safeParse(source);
  if (!parsed.success) {
    const lines = parsed.error.issues.map((i) => `  ${i.path.join('.')}: ${i.message}`).join('\n');
    throw new Error(`Kerfline cannot start; fix the environment:\n${lines}`);
  }
  return parsed.data;
}

export function databaseUrl(env: Env): string {
  if (env.DATABASE_URL) return env.DATABASE_URL;
  const auth = env.PGPASSWORD
    ? `${encodeURIComponent(env.PGUSER)}:${encodeURIComponent(env.PGPASSWORD)}`
    : encodeURIComponent(env.PGUSER);
  return `postgres://${auth}@${env.PGHOST}:${env.PGPORT}/${encodeURIComponent(env.PGDATABASE)}`;
}

/** The read replica's connection string, or undefined when reads stay on the primary. */
export function replicaUrl(env: Env): string | undefined {
  if (env.DATABASE_REPLICA_URL) return env.DATABASE_REPLICA_URL;
  if (env.PGREPLICA_PORT === undefined) return undefined;
  return databaseUrl({ ...env, PGPORT: env.PGREPLICA_PORT, DATABASE_URL: undefined });
}

/** The attempt limits of security/attempt-limits.ts, from the environment. */
export function attemptLimitsOf(env: Env): AttemptLimitSettings {
  return {
    signInPerAddress: env.SIGN_IN_LIMIT,
    lockoutAfter: env.SIGN_IN_LOCKOUT_AFTER,
    lockoutBaseSeconds: env.SIGN_IN_LOCKOUT_BASE_SECONDS,
    lockoutMaxSeconds: env.SIGN_IN_LOCKOUT_MAX_MINUTES * 60,
    passwordChangePerPerson: env.PASSWORD_CHANGE_LIMIT,
    resetRequestsPerAddress: env.PASSWORD_RESET_REQUEST_LIMIT,
    resetRequestsPerEmail: env.PASSWORD_RESET_EMAIL_LIMIT,
    linkFailuresPerAddress: env.LINK_LIMIT,
  };
}

/** The address links in e-mails start with. */
export function publicUrl(env: Env): string {
  return env.PUBLIC_URL ?? `http://${env.HOST === '0.0.0.0' ? '127.0.0.1' : env.HOST}:${env.PORT}`;
}
