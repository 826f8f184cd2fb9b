import http from 'node:http';
import type { AddressInfo } from 'node:net';
import { afterEach, describe, expect, it } from 'vitest';
import { closeGracefully } from './close-gracefully.js';

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
