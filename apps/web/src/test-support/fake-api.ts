import { vi } from 'vitest';

export type FakeRequest = { method: string; path: string; query: URLSearchParams; body: unknown };
export type FakeResponse = { status: number; body?: unknown; raw?: string };
type Route = FakeResponse | ((request: FakeRequest) => FakeResponse | Promise<FakeResponse>);

/**
 * Replaces `fetch` (the network edge, nothing of ours) with a small in-memory API. Routes are keyed
 * `METHOD /api/path`; an unknown route answers 404 in the API's error shape. Every request is recorded.
 */
export function installFakeApi(routes: Record<string, Route>) {
  const requests: (FakeRequest & { init: RequestInit | undefined })[] = [];
  const fetchFn = vi.fn(async (input: RequestInfo | URL, init?: RequestInit) => {
    const url = new URL(
      typeof input === 'string' ? input : input instanceof URL ? input.href : input.url,
      'http://kerfline.test',
    );
    const method = (init?.method ?? 'GET').toUpperCase();
    const body = typeof init?.body === 'string' ? (JSON.parse(init.body) as unknown) : undefined;
    const request = { method, path: url.pathname, query: url.searchParams, body };
    requests.push({ ...request, init });
    const route = routes[`${method} ${url.pathname}`];
    const answer: FakeResponse = route
      ? typeof route === 'function'
        ? await route(request)
        : route
      : { status: 404, body: { error: { code: 'NOT_FOUND', message: `No fake route for ${method} ${url.pathname}` } } };
    if (answer.status === 204) return new Response(null, { status: 204 });
    const text = answer.raw ?? JSON.stringify(answer.body);
    return new Response(text, {
      status: answer.status,
      headers: { 'Content-Type': answer.raw === undefined ? 'application/json' : 'text/html' },
    });
  });
  vi.stubGlobal('fetch', fetchFn);
  return { requests, fetchFn };
}
