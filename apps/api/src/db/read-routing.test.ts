import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { Request, Response } from 'express';
import pg from 'pg';
import type { Sequelize } from 'sequelize';
import { QueryTypes } from 'sequelize';
import { testDatabaseUrl } from '../test-support/test-database-url.js';
import { createSequelize, sequelizeBusy } from './sequelize.js';
import { onPrimary, readYourWrites } from './read-routing.js';

/**
 * Which database each query goes to when a replica is configured. The "replica" here is a second database on
 * the same server holding a table of the same name with another value, so every answer says where it was read
 * (the streaming replica itself is exercised end to end in tests/api/scale-out.test.ts).
 */
const primaryUrl = testDatabaseUrl();
const replicaName = `${new URL(primaryUrl).pathname.slice(1)}_replica_probe`;
const replicaUrl = (() => {
  const u = new URL(primaryUrl);
  u.pathname = `/${replicaName}`;
  return u.toString();
})();
let sequelize: Sequelize;

async function onServer(sql: string, url = primaryUrl): Promise<void> {
  const client = new pg.Client({ connectionString: url });
  await client.connect();
  try {
    await client.query(sql);
  } finally {
    await client.end();
  }
}

beforeAll(async () => {
  const admin = (() => {
    const u = new URL(primaryUrl);
    u.pathname = '/postgres';
    return u.toString();
  })();
  await onServer(`DROP DATABASE IF EXISTS ${replicaName}`, admin);
  await onServer(`CREATE DATABASE ${replicaName}`, admin);
  await onServer(
    `DROP TABLE IF EXISTS where_am_i; CREATE TABLE where_am_i (side text); INSERT INTO where_am_i VALUES ('primary')`,
  );
  await onServer(`CREATE TABLE where_am_i (side text); INSERT INTO where_am_i VALUES ('replica')`, replicaUrl);
  sequelize = createSequelize(primaryUrl, { replicaUrl, poolMax: 2 });
  // DROP DATABASE waits for a checkpoint: on a loaded machine longer than vitest's 30 s for a hook.
}, 120_000);

afterAll(async () => {
  await sequelize?.close();
  await onServer('DROP TABLE IF EXISTS where_am_i');
});

const side = async (options: object = {}) =>
  (await sequelize.query<{ side: string }>('SELECT side FROM where_am_i', { type: QueryTypes.SELECT, ...options }))[0]!
    .side;

/** Runs the middleware for a request and reports where a read inside it goes. */
async function sideInRequest(method: string, session: Record<string, unknown> | undefined): Promise<string> {
  const req = { method, session } as unknown as Request;
  return new Promise((resolve, reject) => {
    readYourWrites(10_000)(req, {} as Response, () => {
      side().then(resolve, reject);
    });
  });
}

describe('reads on a replica, writes on the primary', () => {
  it('sends a plain read to the replica, and a read in a transaction or on the primary to the primary', async () => {
    expect(await side()).toBe('replica');
    expect(await sequelize.transaction(async (transaction) => side({ transaction }))).toBe('primary');
    expect(await side({ useMaster: true })).toBe('primary');
    expect(await onPrimary(() => side())).toBe('primary');
  });

  it('sends a statement that writes to the primary even when its caller reads rows back', async () => {
    const [row] = await sequelize.query<{ side: string }>(`UPDATE where_am_i SET side = side RETURNING side`, {
      type: QueryTypes.SELECT,
    });
    expect(row!.side).toBe('primary');
    const [locked] = await sequelize.transaction(async (transaction) =>
      sequelize.query<{ side: string }>('SELECT side FROM where_am_i FOR UPDATE', {
        type: QueryTypes.SELECT,
        transaction,
      }),
    );
    expect(locked!.side).toBe('primary');
  });

  it('reads a session’s pages from the primary for a while after it wrote, and others’ from the replica', async () => {
    const signedIn = () => ({ passport: { user: 'someone' } }) as Record<string, unknown>;
    const writer = signedIn();
    expect(await sideInRequest('GET', writer)).toBe('replica');
    expect(await sideInRequest('POST', writer)).toBe('primary');
    expect(typeof writer.lastWriteAt).toBe('number');
    expect(await sideInRequest('GET', writer)).toBe('primary');
    // Once the window has passed, back to the replica.
    writer.lastWriteAt = Date.now() - 11_000;
    expect(await sideInRequest('GET', writer)).toBe('replica');
    // Someone else, and a visitor who is not signed in (whose session is never marked), read the replica.
    expect(await sideInRequest('GET', signedIn())).toBe('replica');
    const visitor: Record<string, unknown> = {};
    expect(await sideInRequest('POST', visitor)).toBe('primary');
    expect(visitor.lastWriteAt).toBeUndefined();
  });

  it('counts a statement on the replica or the primary as work in hand (a stopping process waits for it)', async () => {
    expect(sequelizeBusy(sequelize)).toBe(false);
    const onReplica = sequelize.query('SELECT pg_sleep(0.5)', { type: QueryTypes.SELECT });
    await new Promise((r) => setTimeout(r, 50));
    expect(sequelizeBusy(sequelize)).toBe(true);
    await onReplica;
    const onPrimaryToo = sequelize.query('SELECT pg_sleep(0.5)', { type: QueryTypes.SELECT, useMaster: true });
    await new Promise((r) => setTimeout(r, 50));
    expect(sequelizeBusy(sequelize)).toBe(true);
    await onPrimaryToo;
    expect(sequelizeBusy(sequelize)).toBe(false);
  });
});
