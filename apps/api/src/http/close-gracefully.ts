import type { Server } from 'node:http';

/**
 * Stops taking connections and waits for the requests in hand to be answered, at most `graceMs`, before the
 * caller closes what they use (the database pools): closed first, a request still running would have answered 500.
 * Keep-alive connections are closed as soon as they are idle (at once, and again as the requests in hand are
 * answered); whatever is still open after the grace is cut.
 */
export async function closeGracefully(server: Server, graceMs: number): Promise<'drained' | 'cut'> {
  const closed = new Promise<void>((resolve) => server.close(() => resolve()));
  server.closeIdleConnections();
  const idle = setInterval(() => server.closeIdleConnections(), 50);
  let timer: ReturnType<typeof setTimeout> | undefined;
  const outcome = await Promise.race([
    closed.then(() => 'drained' as const),
    new Promise<'cut'>((resolve) => {
      timer = setTimeout(() => resolve('cut'), graceMs);
    }),
  ]);
  clearTimeout(timer);
  clearInterval(idle);
  if (outcome === 'cut') server.closeAllConnections();
  return outcome;
}
