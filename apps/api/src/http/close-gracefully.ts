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

/**
 * Waits until `busy` has said no for `settleMs` on end, at most `maxMs`: the database work in hand is done.
 * A request whose client has left is no longer a connection the server waits for, yet its handler may still be
 * between two statements; the pools close only once no statement has run or waited for a while.
 */
export async function waitUntilIdle(
  busy: () => boolean,
  { settleMs, maxMs, everyMs = 10 }: { settleMs: number; maxMs: number; everyMs?: number },
): Promise<'idle' | 'busy'> {
  const started = Date.now();
  let idleSince = busy() ? null : started;
  for (;;) {
    const now = Date.now();
    if (busy()) idleSince = null;
    else idleSince ??= now;
    if (idleSince !== null && now - idleSince >= settleMs) return 'idle';
    if (now - started >= maxMs) return 'busy';
    await new Promise((resolve) => setTimeout(resolve, everyMs));
  }
}
