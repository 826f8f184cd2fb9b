import { z } from 'zod';

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
  SESSION_SECRET: z.string().min(16, { message: 'SESSION_SECRET must be at least 16 characters' }),
  /** Folder with the built web app; served by the API in production. */
  WEB_DIST: z.string().optional(),
  LOG_LEVEL: z.enum(['fatal', 'error', 'warn', 'info', 'debug', 'trace', 'silent']).default('info'),
  /** Sign-in attempts allowed per IP address in 15 minutes. */
  SIGN_IN_LIMIT: z.coerce.number().int().min(1).default(20),
  /** Set when the app sits behind a TLS-terminating load balancer: marks cookies Secure, trusts X-Forwarded-*. */
  TRUST_PROXY: z
    .enum(['true', 'false'])
    .default('false')
    .transform((v) => v === 'true'),
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
