import { afterEach, describe, expect, it, vi } from 'vitest';
import { z } from 'zod';
import { ApiError, apiRequest, api, askEarly } from './api-client';
import { installFakeApi } from '../test-support/fake-api';

const thing = z.object({ id: z.string(), widthMm: z.number() });

describe('apiRequest', () => {
  it('parses an error body into one ApiError with code, status, message, details and request id', async () => {
    installFakeApi({
      'POST /api/saws': {
        status: 409,
        body: {
          error: {
            code: 'CONFLICT',
            message: 'Asset tag HS-07 is already used at this site',
            details: [{ path: 'assetTag', message: 'already used at this site' }],
            requestId: 'req-41',
          },
        },
      },
    });
    const error = await api.post('/saws', { assetTag: 'HS-07' }, thing).catch((e: unknown) => e);
    expect(error).toBeInstanceOf(ApiError);
    expect(error).toMatchObject({
      code: 'CONFLICT',
      status: 409,
      message: 'Asset tag HS-07 is already used at this site',
      details: [{ path: 'assetTag', message: 'already used at this site' }],
      requestId: 'req-41',
    });
  });

  it('turns an answer without an error body (a proxy page) into an ApiError named after its status', async () => {
    installFakeApi({ 'GET /api/saws': { status: 502, raw: '<html>Bad gateway</html>' } });
    const error = await apiRequest('/saws', thing).catch((e: unknown) => e);
    expect(error).toMatchObject({ code: 'UNAVAILABLE', status: 502, details: [] });
    expect((error as ApiError).message).toMatch(/not available/);
  });

  it('reports a network failure as UNAVAILABLE with status 0', async () => {
    const { fetchFn } = installFakeApi({});
    fetchFn.mockRejectedValueOnce(new TypeError('Failed to fetch'));
    const error = await apiRequest('/me', thing).catch((e: unknown) => e);
    expect(error).toMatchObject({ code: 'UNAVAILABLE', status: 0 });
  });

  it('rejects a success body that does not match the schema, naming the field', async () => {
    installFakeApi({ 'GET /api/things/1': { status: 200, body: { id: '1', widthMm: '31.75' } } });
    const error = await apiRequest('/things/1', thing).catch((e: unknown) => e);
    expect(error).toMatchObject({ code: 'INTERNAL', status: 200 });
    expect((error as ApiError).details.map((d) => d.path)).toEqual(['widthMm']);
  });

  it('sends JSON with same-origin credentials and leaves empty query values out', async () => {
    const { requests } = installFakeApi({ 'GET /api/saws': { status: 200, body: { id: 'a', widthMm: 27 } } });
    const result = await api.get('/saws', thing, {
      query: { siteId: 'x', status: undefined, q: '', includeRetired: false },
    });
    expect(result).toEqual({ id: 'a', widthMm: 27 });
    expect(requests[0]?.query.toString()).toBe('siteId=x&includeRetired=false');
    expect(requests[0]?.init?.credentials).toBe('same-origin');
  });

  it('accepts an empty 204 answer when no body is expected', async () => {
    const { requests } = installFakeApi({ 'POST /api/auth/sign-out': { status: 204 } });
    await expect(api.post('/auth/sign-out', undefined, null)).resolves.toBeUndefined();
    expect(requests[0]?.method).toBe('POST');
  });
});

describe('answers asked for early', () => {
  afterEach(() => vi.useRealTimers());

  it('the first read of the same address takes the early answer; the next read asks again', async () => {
    let served = 0;
    const { requests } = installFakeApi({
      'GET /api/saws': () => ({ status: 200, body: { id: `answer-${(served += 1)}`, widthMm: 34 } }),
    });
    askEarly('/saws', { from: '2026-01', to: '2026-06', sites: null });
    expect(requests).toHaveLength(1);
    await expect(api.get('/saws', thing, { query: { from: '2026-01', to: '2026-06' } })).resolves.toEqual({
      id: 'answer-1',
      widthMm: 34,
    });
    expect(requests).toHaveLength(1);
    await expect(api.get('/saws', thing, { query: { from: '2026-01', to: '2026-06' } })).resolves.toMatchObject({
      id: 'answer-2',
    });
    expect(requests).toHaveLength(2);
  });

  it('an answer asked for more than ten seconds before it is read is not used', async () => {
    vi.useFakeTimers({ toFake: ['Date'] });
    let served = 0;
    const { requests } = installFakeApi({
      'GET /api/saws': () => ({ status: 200, body: { id: `answer-${(served += 1)}`, widthMm: 34 } }),
    });
    askEarly('/saws');
    vi.setSystemTime(Date.now() + 11_000);
    await expect(api.get('/saws', thing)).resolves.toMatchObject({ id: 'answer-2' });
    expect(requests).toHaveLength(2);
  });

  it('an early answer for another address is left alone', async () => {
    const { requests } = installFakeApi({
      'GET /api/saws': { status: 200, body: { id: 'x', widthMm: 34 } },
    });
    askEarly('/saws', { from: '2026-01' });
    await api.get('/saws', thing, { query: { from: '2026-02' } });
    expect(requests.map((r) => r.query.get('from'))).toEqual(['2026-01', '2026-02']);
  });
});
