import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { spawnSync } from 'node:child_process';
import { mkdtempSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import path from 'node:path';
import { fileURLToPath } from 'node:url';
import pg from 'pg';
import sharp from 'sharp';
import {
  signedInAgent,
  startTestApp,
  testDatabaseUrl,
  type TestContext,
} from '../../apps/api/src/test-support/test-db.js';
import { buildRecords, buildWorld, minutesAgo, PASSWORD, specBody } from '../../apps/api/src/test-support/fixtures.js';

/**
 * The backup round trip CI runs: fill the test database through the API and the fixtures, back it up with
 * backup.sh, restore it with restore.sh into a new database, and compare every table's row count and a
 * checksum of all its rows, and every sequence, before and after. Rows lost must be 0.
 */

const root = path.resolve(path.dirname(fileURLToPath(import.meta.url)), '../..');
const RESTORED = 'kerfline_restore_check_test';
const dir = mkdtempSync(path.join(tmpdir(), 'kerfline-backup-'));
const file = path.join(dir, 'kerfline.dump');

function script(name: 'backup.sh' | 'restore.sh', ...args: string[]) {
  const env: NodeJS.ProcessEnv = { ...process.env, PGDATABASE: new URL(testDatabaseUrl()).pathname.slice(1) };
  delete env.DATABASE_URL;
  return spawnSync('bash', [path.join('docker-free-scripts', name), ...args], { cwd: root, env, encoding: 'utf8' });
}

function urlOf(database: string): string {
  const url = new URL(testDatabaseUrl());
  url.pathname = `/${database}`;
  return url.toString();
}

type Fingerprint = Record<string, { rows: number; md5: string | null }>;

/**
 * Every table outside PostgreSQL's own schemas: its row count and the MD5 of all its rows as text, in a fixed
 * order (the rows' text sorts them, so tables without a primary key are covered too); and every sequence's value.
 */
async function fingerprint(database: string): Promise<Fingerprint> {
  const client = new pg.Client({ connectionString: urlOf(database) });
  await client.connect();
  try {
    const tables = await client.query<{ name: string }>(
      `SELECT format('%I.%I', schemaname, tablename) AS name FROM pg_tables
        WHERE schemaname NOT IN ('pg_catalog', 'information_schema') ORDER BY 1`,
    );
    const result: Fingerprint = {};
    for (const { name } of tables.rows) {
      const { rows } = await client.query<{ rows: number; md5: string | null }>(
        `SELECT count(*)::int AS rows, md5(string_agg(t::text, E'\\n' ORDER BY t::text)) AS md5 FROM ${name} t`,
      );
      result[name] = rows[0]!;
    }
    const sequences = await client.query<{ name: string; value: string | null }>(
      `SELECT format('%I.%I', schemaname, sequencename) AS name, last_value::text AS value FROM pg_sequences ORDER BY 1`,
    );
    for (const { name, value } of sequences.rows) result[`sequence ${name}`] = { rows: 1, md5: value };
    return result;
  } finally {
    await client.end();
  }
}

async function dropRestored(): Promise<void> {
  const client = new pg.Client({ connectionString: urlOf('postgres') });
  await client.connect();
  await client.query(`DROP DATABASE IF EXISTS ${RESTORED} WITH (FORCE)`);
  await client.end();
}

let ctx: TestContext;

beforeAll(async () => {
  ctx = startTestApp();
  const world = await buildWorld(ctx.sequelize);
  await buildRecords(world);
  // Writes through the API too, so the audit trail, sessions, a photo's bytes and a setting are in the backup.
  const admin = await signedInAgent(ctx.app, 'admin@test.example', PASSWORD);
  const spec = (await admin.post('/api/blade-specs').send(specBody(null))).body.id as string;
  const run = (
    await admin.post('/api/blade-runs').send({
      sawId: world.saws.B![0]!.id,
      bladeSpecId: spec,
      installedAt: minutesAgo(90),
      notes: 'Line one\nline two',
    })
  ).body.run.id as string;
  const png = await sharp({ create: { width: 40, height: 30, channels: 3, background: '#456' } })
    .png()
    .toBuffer();
  await admin
    .post(`/api/blade-runs/${run}/photos`)
    .field('caption', 'Wear on the back edge')
    .attach('photo', png, 'a.png')
    .expect(201);
  // A photo removed to the kept records, so a kept row and its kept bytes are in the backup too.
  const removed = (await admin.post(`/api/blade-runs/${run}/photos`).attach('photo', png, 'b.png').expect(201)).body
    .id as string;
  await admin.delete(`/api/photos/${removed}`).send({ reason: 'Photo of the wrong band' }).expect(204);
  await admin.patch(`/api/saws/${world.saws.C![1]!.id}`).send({ name: 'Ünïcödé saw – 7' }).expect(200);
  await dropRestored();
}, 120_000);
// Dropping the restored database waits for its connections to close and for a checkpoint: on a loaded machine that
// takes longer than vitest's 30 s default for a hook.
afterAll(async () => {
  await ctx.close();
  await dropRestored();
  rmSync(dir, { recursive: true, force: true });
}, 120_000);

describe('backup.sh and restore.sh', () => {
  it('round-trip every table: the same rows, byte for byte, in a freshly restored database', async () => {
    const before = await fingerprint(new URL(testDatabaseUrl()).pathname.slice(1));
    const backup = script('backup.sh', file);
    expect(backup.status, backup.stderr).toBe(0);
    const restore = script('restore.sh', file, RESTORED);
    expect(restore.status, restore.stderr).toBe(0);
    const after = await fingerprint(RESTORED);

    expect(Object.keys(after)).toEqual(Object.keys(before));
    expect(after).toEqual(before);
    // The comparison covered real data: the tables the product keeps, with rows in them.
    for (const table of [
      'public.saws',
      'public.blade_runs',
      'public.photo_blobs',
      'public.removed_records',
      'public.removed_photo_blobs',
      'public.audit_entries',
      'public.sessions',
    ])
      expect(before[table]?.rows, table).toBeGreaterThan(0);
    const tables = Object.keys(before).filter((k) => !k.startsWith('sequence '));
    const rows = tables.reduce((sum, t) => sum + before[t]!.rows, 0);
    console.log(`backup round trip: ${tables.length} tables, ${rows} rows compared, 0 rows lost`);
  });

  it('never overwrites: a backup refuses an existing file, a restore a database that holds tables', () => {
    const again = script('backup.sh', file);
    expect(again.status).not.toBe(0);
    expect(again.stderr).toMatch(/exists already/);
    const into = script('restore.sh', file, RESTORED);
    expect(into.status).not.toBe(0);
    expect(into.stderr).toMatch(/already holds \d+ tables/);
    const notBackup = script('restore.sh', path.join(root, 'package.json'), 'kerfline_never_created_test');
    expect(notBackup.status).not.toBe(0);
    expect(notBackup.stderr).toMatch(/not a backup/);
  });
});
