import { afterEach, describe, expect, it, vi } from 'vitest';
import { defaultPeriod } from '@kerfline/domain/fleet/period';
import { installFakeApi } from './test-support/fake-api';

/** Runs the app's first module afresh at an address, as a cold page load would. */
async function startAt(path: string) {
  window.history.replaceState({}, '', path);
  const fake = installFakeApi({});
  vi.resetModules();
  await import('./early-asks');
  return fake.requests.map((r) => `${r.path}${r.query.size ? `?${r.query.toString()}` : ''}`);
}

afterEach(() => {
  vi.unstubAllGlobals();
  window.history.replaceState({}, '', '/');
});

describe('what a cold page load asks for before the app starts', () => {
  it('the fleet overview: who is signed in, and the figures by the address the page will read', async () => {
    const { from, to } = defaultPeriod(new Date());
    expect(await startAt('/fleet')).toEqual(['/api/me', `/api/fleet/overview?from=${from}&to=${to}`]);
    expect(await startAt('/fleet?from=2026-01&to=2026-03&sites=a,b')).toEqual([
      '/api/me',
      '/api/fleet/overview?from=2026-01&to=2026-03&sites=a%2Cb',
    ]);
  });

  it('any other page: nothing (the sign-in page must never find an early “signed out” waiting for it)', async () => {
    expect(await startAt('/sign-in')).toEqual([]);
    expect(await startAt('/fleet/practice')).toEqual([]);
    expect(await startAt('/saws')).toEqual([]);
  });
});
