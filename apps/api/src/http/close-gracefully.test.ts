import http from 'node:http';
import type { AddressInfo } from 'node:net';
import { afterEach, describe, expect, it } from 'vitest';
import { closeGracefully } from './close-gracefully.js';

const servers: http.Server[] = [];
afterEach(() => {
  for (const s of servers.splice(0)) s.closeAllConnections();
});

/** A server whose answers take `ms`, and a keep-alive agent to ask it with. */
async function slowServer(ms: number) {
  const server = http.createServer((_req, res) => {
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
  return { server, ask, port };
}

describe('closing the server', () => {
  it('answers the requests in hand before it says it is closed, and takes no new connection', async () => {
    const { server, ask, port } = await slowServer(300);
    await ask(); // a keep-alive connection left idle: closed at once, it cannot hold the close up
    const inHand = ask();
    await new Promise((resolve) => setTimeout(resolve, 50));
    let answeredFirst = false;
    const closing = closeGracefully(server, 5000).then((outcome) => {
      expect(answeredFirst).toBe(true);
      return outcome;
    });
    const answer = await inHand;
    answeredFirst = true;
    expect(answer).toEqual({ status: 200, body: 'answered' });
    expect(await closing).toBe('drained');
    const refused = await new Promise<string>((resolve) => {
      http
        .get({ host: '127.0.0.1', port }, () => resolve('answered'))
        .on('error', (e: NodeJS.ErrnoException) => resolve(e.code ?? 'error'));
    });
    expect(refused).toBe('ECONNREFUSED');
  });

  it('cuts what is still open once the grace is over', async () => {
    const { server, ask } = await slowServer(10_000);
    const inHand = ask().then(
      () => 'answered',
      () => 'cut',
    );
    await new Promise((resolve) => setTimeout(resolve, 50));
    const started = Date.now();
    expect(await closeGracefully(server, 200)).toBe('cut');
    expect(Date.now() - started).toBeLessThan(2000);
    expect(await inHand).toBe('cut');
  });
});
