import http from 'node:http';
import type { AddressInfo } from 'node:net';
import { afterEach, describe, expect, it } from 'vitest';
import { createSequelize, sequelizeBusy } from '../db/sequelize.js';
import { testDatabaseUrl } from '../test-support/test-database-url.js';
import { closeGracefully, waitUntilIdle } from './close-gracefully.js';

const servers: http.Server[] = [];
afterEach(() => {
  for (const s of servers.splice(0)) s.closeAllConnections();
});

/**
 * A server whose answers take `ms`, and a keep-alive agent to ask it with. `arrived` settles when a request
 * reaches the handler and `answered` says whether the server has finished sending an answer: both seen from the
 * server's side, so the order they show does not depend on when the client gets round to reading.
 */
async function slowServer(ms: number) {
  let arrived: () => void = () => undefined;
  const state = { answered: false, arrived: new Promise<void>((resolve) => (arrived = resolve)) };
  const server = http.createServer((_req, res) => {
    arrived();
    res.on('finish', () => (state.answered = true));
    setTimeout(() => res.end('answered'), ms);
  });
  servers.push(server);
  await new Promise<void>((resolve) => server.listen(0, '127.0.0.1', resolve));
  const { port } = server.address() as AddressInfo;
  const agent = new http.Agent({ keepAlive: true });
  const ask = () =>
    new Promise<{ status: number; body: string }>((resolve, reject) => {
      http
        .get({ host: '127.0.0.1', port, agent }, (res) => {
          let body = '';
          res.on('data', (chunk: Buffer) => (body += chunk.toString()));
          res.on('end', () => resolve({ status: res.statusCode ?? 0, body }));
        })
        .on('error', reject);
    });
  return { server, ask, port, state };
}

describe('closing the server', () => {
  it('answers the requests in hand before it says it is closed, and takes no new connection', async () => {
    const { server, ask, port, state } = await slowServer(300);
    const inHand = ask();
    await state.arrived;
    const outcome = await closeGracefully(server, 5000);
    // Closed only once the answer was sent, and the client has it whole.
    expect(state.answered).toBe(true);
    expect(outcome).toBe('drained');
    expect(await inHand).toEqual({ status: 200, body: 'answered' });
    const refused = await new Promise<string>((resolve) => {
      http
        .get({ host: '127.0.0.1', port }, () => resolve('answered'))
        .on('error', (e: NodeJS.ErrnoException) => resolve(e.code ?? 'error'));
    });
    expect(refused).toBe('ECONNREFUSED');
  });

  it('does not wait for a keep-alive connection left idle', async () => {
    const { server, ask } = await slowServer(0);
    await ask();
    const started = Date.now();
    expect(await closeGracefully(server, 5000)).toBe('drained');
    expect(Date.now() - started).toBeLessThan(2000);
  });

  it('cuts what is still open once the grace is over', async () => {
    const { server, ask, state } = await slowServer(10_000);
    const inHand = ask().then(
      () => 'answered',
      () => 'cut',
    );
    await state.arrived;
    const started = Date.now();
    expect(await closeGracefully(server, 200)).toBe('cut');
    expect(Date.now() - started).toBeLessThan(2000);
    expect(await inHand).toBe('cut');
  });
});

describe('waiting for the database work in hand', () => {
  it('says idle only after a quiet spell, and busy if the work outlasts the wait', async () => {
    let busyUntil = Date.now() + 150;
    const busy = () => Date.now() < busyUntil;
    const started = Date.now();
    expect(await waitUntilIdle(busy, { settleMs: 100, maxMs: 2000 })).toBe('idle');
    expect(Date.now() - started).toBeGreaterThanOrEqual(240);

    busyUntil = Date.now() + 10_000;
    expect(await waitUntilIdle(busy, { settleMs: 100, maxMs: 200 })).toBe('busy');
  });

  it('lets a request whose client left finish its statements before the pool closes', async () => {
    const sequelize = createSequelize(testDatabaseUrl(), { poolMax: 2 });
    let arrived: () => void = () => undefined;
    const arrival = new Promise<void>((resolve) => (arrived = resolve));
    // A handler with a gap between its two statements, as one that checks access and then reads.
    const handled = new Promise<string>((resolve) => {
      const server = http.createServer((_req, res) => {
        arrived();
        void (async () => {
          try {
            await sequelize.query('SELECT 1');
            await new Promise((r) => setTimeout(r, 50));
            await sequelize.query('SELECT 2');
            res.end('answered');
            resolve('both statements ran');
          } catch (error) {
            resolve(`failed: ${(error as Error).message}`);
          }
        })();
      });
      servers.push(server);
      server.listen(0, '127.0.0.1', () => {
        const { port } = server.address() as AddressInfo;
        const request = http.get({ host: '127.0.0.1', port }).on('error', () => undefined);
        void arrival.then(async () => {
          request.destroy();
          // The client is gone, so the server has nothing to wait for...
          expect(await closeGracefully(server, 5000)).toBe('drained');
          // ...but the handler is still working: the pool closes only once it is done. (A quiet spell of 1 s against
          // the handler's 50 ms gap, so that a stalled event loop on a loaded machine cannot end it early.)
          expect(await waitUntilIdle(() => sequelizeBusy(sequelize), { settleMs: 1000, maxMs: 5000 })).toBe('idle');
          await sequelize.close();
        });
      });
    });
    expect(await handled).toBe('both statements ran');
  });
});
