import { describe, expect, it } from 'vitest';
import { render, screen, within } from '@testing-library/react';
import userEvent from '@testing-library/user-event';
import { createMemoryRouter } from 'react-router-dom';
import { inToMm, psiToPa } from '@kerfline/domain/units/units';
import { defaultSiteChecks, type SawChecks, type SiteCheck } from '@kerfline/domain/site-checks/schema';
import { siteCheckResult } from '@kerfline/domain/site-checks/evaluate';
import { shippedSettings } from '@kerfline/domain/settings/schema';
import type { Role } from '@kerfline/domain/users/schema';
import { createQueryClient } from '../../../lib/query-client';
import { installFakeApi, type FakeRequest } from '../../../test-support/fake-api';
import { SAW_ID, SITE_ID, makeMe, makeSaw, makeSite, page } from '../../../test-support/fixtures';
import { AppProviders } from '../../providers';
import { appRoutes } from '../../router';

function renderApp(path: string) {
  const queryClient = createQueryClient();
  const router = createMemoryRouter(appRoutes(queryClient), { initialEntries: [path] });
  render(<AppProviders queryClient={queryClient} router={router} />);
  return { router, user: userEvent.setup() };
}

const id = (n: number) => `00000000-0000-4000-8000-${String(n).padStart(12, '0')}`;

/** The shipped list as the API returns it for the test site, plus a fixed check of the site's own. */
function siteChecks(): SiteCheck[] {
  const shipped = defaultSiteChecks().map((c, i) => ({
    ...c,
    id: id(100 + i),
    siteId: SITE_ID,
    retiredAt: null,
    recordCount: 3,
    createdAt: '2025-01-01T00:00:00.000Z',
    updatedAt: '2025-01-01T00:00:00.000Z',
    updatedById: null,
    updatedByName: null,
  }));
  return [
    ...shipped,
    {
      ...shipped[0]!,
      id: id(200),
      name: 'Feed cylinder pressure',
      measures: 'Gauge on the feed valve',
      targetRule: 'fixed',
      quantity: 'stress',
      fixedTarget: psiToPa(500) / 1e6,
      fixedMin: psiToPa(450) / 1e6,
      fixedMax: psiToPa(550) / 1e6,
      schedule: 'periodic',
      intervalDays: 14,
      graceHours: 24,
      position: 6,
      recordCount: 0,
      updatedById: id(9),
      updatedByName: 'Ines Carvalho',
    },
  ];
}

/** The saw's checks as the API works them out: hydraulic head, a 0.035 in bi-metal band on it. */
function sawChecks(): SawChecks {
  const blade = { thicknessMm: inToMm(0.035), widthMm: inToMm(1), material: 'bimetal' as const };
  const saw = { bandThicknessMm: inToMm(0.035), bandWidthMm: inToMm(1), headFeed: 'hydraulic' as const };
  return {
    sawId: SAW_ID,
    siteId: SITE_ID,
    bladeRunId: id(300),
    bladeSpecName: '1 in × 0.035 in bi-metal 6/10',
    items: siteChecks().map((check) => {
      const r = siteCheckResult(check, saw, blade, {}, { system: 'imperial' });
      return {
        check,
        target: {
          applicable: r.applicable,
          target: r.target,
          min: r.min,
          max: r.max,
          basis: r.basis,
          explanation: r.explanation,
        },
        state: check.targetRule === 'guide_clearance' ? 'overdue' : check.schedule === 'blade_change' ? 'due' : 'ok',
        fallsDueAt: '2026-11-30T12:00:00.000Z',
        overdueAt: '2026-11-30T20:00:00.000Z',
        lastRecordId: null,
        lastCheckedAt: null,
        lastPassed: null,
      };
    }),
  };
}

function api(role: Role, extra: Record<string, Parameters<typeof installFakeApi>[0][string]> = {}) {
  return installFakeApi({
    'GET /api/me': { status: 200, body: makeMe(role) },
    'GET /api/sites': { status: 200, body: page([makeSite()]) },
    [`GET /api/saws/${SAW_ID}`]: { status: 200, body: makeSaw({ headFeed: 'hydraulic' }) },
    [`GET /api/sites/${SITE_ID}`]: { status: 200, body: makeSite() },
    [`GET /api/saws/${SAW_ID}/checks`]: { status: 200, body: sawChecks() },
    [`GET /api/sites/${SITE_ID}/checks`]: { status: 200, body: { siteId: SITE_ID, items: siteChecks() } },
    [`GET /api/sites/${SITE_ID}/settings`]: { status: 200, body: { siteId: SITE_ID, items: shippedSettings() } },
    'GET /api/check-counts': { status: 200, body: { items: [{ siteId: SITE_ID, due: 2, overdue: 1 }] } },
    ...extra,
  });
}

/** What the server answers when the reading is 0.030 in: tighter than the band, so it fails. */
function failedRecord(request: FakeRequest) {
  const body = request.body as { siteCheckId: string; reading: number; notes: string | null };
  return {
    status: 201,
    body: {
      id: id(400),
      siteId: SITE_ID,
      sawId: SAW_ID,
      sawAssetTag: 'HS-07',
      siteCheckId: body.siteCheckId,
      checkName: 'Guide bearing clearance',
      targetRule: 'guide_clearance',
      quantity: 'length',
      bladeRunId: id(300),
      checkedAt: '2026-12-01T15:00:00.000Z',
      checkedById: id(5),
      checkedByName: 'Dana Okafor',
      reading: body.reading,
      answers: null,
      target: 0.9144,
      min: 0.9144,
      max: 0.9398,
      passed: false,
      basis: { kind: 'site_setting', settingKey: 'guide_clearance', changedByName: null, changedAt: null, note: 'n' },
      explanation:
        'Set the guide opening to the band thickness plus 0.001 in (0.025 mm): 0.036 in (0.914 mm). Measured 0.030 in (0.762 mm) is tighter than the band itself: the guides will pinch and heat it.',
      notes: body.notes,
      photoCount: 0,
      createdAt: '2026-12-01T15:00:00.000Z',
    },
  };
}

describe('recording a check on a saw', () => {
  it('shows the cautions and the most urgent check’s target with its source, and shows the server’s verdict', async () => {
    const fake = api('technician', { 'POST /api/check-records': failedRecord });
    const { user } = renderApp(`/saws/${SAW_ID}/record-check`);
    const caution = await screen.findByRole('region', { name: 'Caution: adjusting a saw' });
    expect(caution).toHaveTextContent('Isolate and lock out the power before reaching into the saw.');
    expect(caution).toHaveTextContent('Wear gloves and eye protection');
    expect(caution).toHaveTextContent('Put the guards back on before running the saw.');
    expect(caution).toHaveTextContent('the saw maker’s manual come first');
    // The overdue guide check is chosen; its target is 0.035 + 0.001 = 0.036 in, inches first.
    expect(screen.getByRole('radio', { name: /Guide bearing clearance/ })).toBeChecked();
    const target = screen.getByRole('region', { name: 'Target' });
    expect(target).toHaveTextContent('0.036 in');
    expect(target).toHaveTextContent('Passes: 0.036 in to 0.037 in');
    expect(target).toHaveTextContent('Source: Kerfline’s starting value (no printed source gives one value).');
    // The head down-force does not apply to a hydraulic head, and says why.
    expect(screen.getByText(/Not for this saw \(1\)/)).toBeInTheDocument();
    expect(screen.getByText(/feeds its head hydraulically/)).toBeInTheDocument();

    const reading = screen.getByRole('textbox', { name: /Reading/ });
    await user.type(reading, '0.030');
    await user.click(screen.getByRole('button', { name: 'Save reading' }));
    const result = await screen.findByRole('region', { name: 'Result' });
    expect(within(result).getByText('Failed').closest('[data-shape]')).toHaveAttribute('data-shape', 'square');
    expect(result).toHaveTextContent('tighter than the band itself');
    expect(result).toHaveTextContent('Put it right before the saw cuts again');
    // Sent in millimetres (0.030 in × 25.4 = 0.762 mm), with no verdict of the browser's own.
    const sent = fake.requests.find((r) => r.method === 'POST')!.body as Record<string, unknown>;
    expect(sent.reading).toBeCloseTo(0.762, 9);
    expect(sent).not.toHaveProperty('passed');
    expect(sent.siteCheckId).toBe(id(100));
  });

  it('says what to fix before sending, and puts the server’s refusal beside the reading', async () => {
    const fake = api('technician', {
      'POST /api/check-records': {
        status: 400,
        body: {
          error: {
            code: 'VALIDATION_FAILED',
            message: 'Measured clearance must be at most 10 mm',
            details: [{ path: 'reading', message: 'Measured clearance must be at most 10 mm' }],
          },
        },
      },
    });
    const { user } = renderApp(`/saws/${SAW_ID}/record-check`);
    const reading = await screen.findByRole('textbox', { name: /Reading/ });
    await user.click(screen.getByRole('button', { name: 'Save reading' }));
    expect(reading).toHaveAccessibleDescription('Enter the reading');
    await user.type(reading, 'thin');
    await user.click(screen.getByRole('button', { name: 'Save reading' }));
    expect(reading).toHaveAccessibleDescription(/not a number|number/i);
    expect(fake.requests.filter((r) => r.method === 'POST')).toHaveLength(0);
    await user.clear(reading);
    await user.type(reading, '0.5');
    await user.click(screen.getByRole('button', { name: 'Save reading' }));
    await screen.findByText('The check was not saved');
    expect(reading).toHaveAccessibleDescription('Measured clearance must be at most 10 mm');
  });

  it('takes the chip brush’s two answers, and lets the site admin remove a record made by mistake', async () => {
    const fake = api('site_admin', {
      'POST /api/check-records': failedRecord,
      [`DELETE /api/check-records/${id(400)}`]: { status: 204 },
    });
    const { user } = renderApp(`/saws/${SAW_ID}/record-check?check=${id(103)}`);
    await screen.findByRole('group', { name: 'Does the brush reach into the gullets?' });
    await user.click(
      within(screen.getByRole('group', { name: 'Does the brush reach into the gullets?' })).getByRole('radio', {
        name: 'Yes',
      }),
    );
    await user.click(screen.getByRole('button', { name: 'Save reading' }));
    expect(screen.getByRole('group', { name: 'Is the brush worn?' })).toHaveAccessibleDescription(
      'Say whether the brush is worn',
    );
    await user.click(
      within(screen.getByRole('group', { name: 'Is the brush worn?' })).getByRole('radio', { name: 'No' }),
    );
    await user.click(screen.getByRole('button', { name: 'Save reading' }));
    await screen.findByRole('region', { name: 'Result' });
    expect(fake.requests.find((r) => r.method === 'POST')!.body).toMatchObject({
      siteCheckId: id(103),
      answers: { reachesGullets: true, worn: false },
    });

    // The site admin may remove it at once, saying why; it is kept and can be put back.
    await user.click(screen.getByRole('button', { name: 'Remove this recorded check…' }));
    const panel = screen.getByRole('region', { name: 'Remove this recorded check?' });
    expect(panel).toHaveTextContent('can put it back from Removed entries');
    await user.type(within(panel).getByRole('textbox', { name: 'Why is it being removed?' }), 'Wrong saw');
    await user.click(within(panel).getByRole('button', { name: 'Remove the recorded check' }));
    expect(await screen.findByText('The recorded check was removed.')).toBeInTheDocument();
    expect(fake.requests.find((r) => r.method === 'DELETE')).toMatchObject({
      path: `/api/check-records/${id(400)}`,
      body: { reason: 'Wrong saw' },
    });
  });

  it('lets a manager read but not record', async () => {
    api('manager');
    renderApp(`/saws/${SAW_ID}/record-check`);
    expect(await screen.findByText('You can read this saw’s checks but not record them')).toBeInTheDocument();
    expect(screen.queryByRole('button', { name: 'Save reading' })).toBeNull();
  });
});

describe('the saw page’s checks', () => {
  it('lists the checks due with a large Record action, one tap from the page', async () => {
    api('technician');
    renderApp(`/saws/${SAW_ID}`);
    const panel = await screen.findByRole('region', { name: 'Checks due' });
    expect(panel).toHaveTextContent('4 to do, 1 overdue');
    expect(within(panel).getAllByText('Overdue')[0]!.closest('[data-shape]')).toHaveAttribute('data-shape', 'triangle');
    expect(within(panel).getByRole('link', { name: 'Record Guide bearing clearance' })).toHaveAttribute(
      'href',
      `/saws/${SAW_ID}/record-check?check=${id(100)}`,
    );
    expect(screen.getByRole('link', { name: 'Record a check' })).toHaveAttribute(
      'href',
      `/saws/${SAW_ID}/record-check`,
    );
  });
});

describe('a site’s list of checks', () => {
  it('names where each rule’s limits come from, and lets the site admin change a fixed check in psi', async () => {
    const fake = api('site_admin', {
      [`PATCH /api/site-checks/${id(200)}`]: (request) => ({
        status: 200,
        body: { ...siteChecks()[6]!, ...(request.body as object) },
      }),
    });
    const { user } = renderApp(`/sites/${SITE_ID}/checks`);
    const guide = await screen.findByRole('article', { name: 'Guide bearing clearance' });
    expect(guide).toHaveTextContent(
      'Your site’s setting “Guide opening”: Kerfline’s starting value (no printed source gives one value)',
    );
    expect(guide).toHaveTextContent('At each blade change, within 8 h');
    const tension = screen.getByRole('article', { name: 'Band tension' });
    expect(tension).toHaveTextContent('“Band tension, carbon bands” (published)');
    const own = screen.getByRole('article', { name: 'Feed cylinder pressure' });
    expect(own).toHaveTextContent('Aim for 500 psi; 450 psi to 550 psi passes — set on this list');
    expect(own).toHaveTextContent('Every 14 days, overdue a day later');

    await user.click(within(own).getByRole('button', { name: 'Change Feed cylinder pressure' }));
    const form = screen.getByRole('form', { name: 'Change Feed cylinder pressure' });
    const highest = within(form).getByRole('textbox', { name: /Highest passing/ });
    expect(highest).toHaveValue('550');
    await user.clear(highest);
    await user.type(highest, '600');
    await user.click(within(form).getByRole('button', { name: 'Save changes' }));
    await expect.poll(() => fake.requests.some((r) => r.method === 'PATCH')).toBe(true);
    const patch = fake.requests.find((r) => r.method === 'PATCH')!.body as Record<string, number>;
    // 600 psi × 6,894.757 Pa/psi = 4.1369 MPa (NIST SP 811, B.8); the untouched target stays 500 psi.
    expect(patch.fixedMax).toBeCloseTo(4.136854, 5);
    expect(patch.fixedTarget).toBeCloseTo(3.447379, 5);
  });

  it('shows the list without changes to a technician', async () => {
    api('technician');
    renderApp(`/sites/${SITE_ID}/checks`);
    await screen.findByRole('article', { name: 'Guide bearing clearance' });
    expect(screen.queryByRole('button', { name: /^Change / })).toBeNull();
    expect(screen.queryByRole('button', { name: 'Add a check' })).toBeNull();
    expect(screen.getByRole('link', { name: '1 overdue' })).toHaveAttribute('href', `/sites/${SITE_ID}/checks/overdue`);
  });
});

describe('a site’s overdue checks', () => {
  it('asks the server for the page and filters in the URL, and offers Record on each row', async () => {
    const fake = api('technician', {
      [`GET /api/sites/${SITE_ID}/checks/overdue`]: (request) => ({
        status: 200,
        body: {
          items: [
            {
              siteId: SITE_ID,
              sawId: SAW_ID,
              sawAssetTag: 'HS-07',
              sawName: 'Bar line saw',
              siteCheckId: id(100),
              checkName: 'Guide bearing clearance',
              targetRule: 'guide_clearance',
              schedule: 'blade_change',
              state: 'overdue',
              fallsDueAt: '2026-11-30T12:00:00.000Z',
              overdueAt: '2026-11-30T20:00:00.000Z',
              lastCheckedAt: null,
              lastPassed: null,
              bladeRunId: id(300),
            },
          ],
          total: 26,
          limit: 25,
          offset: Number(request.query.get('offset') ?? 0),
        },
      }),
    });
    renderApp(`/sites/${SITE_ID}/checks/overdue?state=pending&check=${id(100)}&offset=25`);
    const table = await screen.findByRole('table', { name: 'Checks due and overdue' });
    const asked = fake.requests.find((r) => r.path.endsWith('/checks/overdue'))!;
    expect(Object.fromEntries(asked.query)).toMatchObject({
      state: 'pending',
      siteCheckId: id(100),
      offset: '25',
      limit: '25',
    });
    expect(within(table).getByRole('link', { name: 'Record Guide bearing clearance on HS-07' })).toHaveAttribute(
      'href',
      `/saws/${SAW_ID}/record-check?check=${id(100)}`,
    );
    expect(screen.getByText('26–26 of 26 checks')).toBeInTheDocument();
    expect(screen.getByRole('combobox', { name: 'Show' })).toHaveValue('pending');
  });
});

const dueItem = (sawId: string, tag: string, checkId: string, name: string, state: 'due' | 'overdue') => ({
  siteId: SITE_ID,
  sawId,
  sawAssetTag: tag,
  sawName: 'Bar line saw',
  siteCheckId: checkId,
  checkName: name,
  targetRule: 'guide_clearance',
  schedule: 'blade_change',
  state,
  fallsDueAt: '2026-11-30T12:00:00.000Z',
  overdueAt: '2026-11-30T20:00:00.000Z',
  lastCheckedAt: null,
  lastPassed: null,
  bladeRunId: null,
});

describe('the start screen and the sites’ tiles', () => {
  it('lists a technician’s checks due today by saw, each saw with one Record that opens its most urgent check', async () => {
    const OTHER_SAW = id(77);
    api('technician', {
      'GET /api/saws': { status: 200, body: page([makeSaw()]) },
      [`GET /api/sites/${SITE_ID}/checks/overdue`]: {
        status: 200,
        body: {
          items: [
            dueItem(SAW_ID, 'HS-07', id(100), 'Guide bearing clearance', 'overdue'),
            dueItem(SAW_ID, 'HS-07', id(101), 'Band tracking', 'overdue'),
            dueItem(OTHER_SAW, 'HS-08', id(104), 'Head down-force', 'due'),
          ],
          total: 3,
          limit: 20,
          offset: 0,
        },
      },
    });
    renderApp('/today');
    const panel = await screen.findByRole('region', { name: 'Checks due today' });
    expect(panel).toHaveTextContent('3 to do on 2 saws, 2 overdue');
    expect(panel).toHaveTextContent('Guide bearing clearance, Band tracking');
    expect(within(panel).getByRole('link', { name: 'Record checks on HS-07' })).toHaveAttribute(
      'href',
      `/saws/${SAW_ID}/record-check?check=${id(100)}`,
    );
    expect(within(panel).getByRole('link', { name: 'Record checks on HS-08' })).toHaveAttribute(
      'href',
      `/saws/${OTHER_SAW}/record-check?check=${id(104)}`,
    );
  });

  it('puts each site’s overdue checks on its tile, with a triangle while any is overdue', async () => {
    api('manager', {
      'GET /api/site-summaries': {
        status: 200,
        body: {
          asOf: '2026-12-01T00:00:00.000Z',
          items: [{ siteId: SITE_ID, sawsInUse: 2, sawsDown: 0, downSince: null, bladesOn: 2, stock: null }],
        },
      },
    });
    renderApp('/sites');
    const figure = (await screen.findByText('Checks overdue')).closest('div')!;
    expect(figure).toHaveTextContent('Checks overdue1');
    expect(figure).toHaveTextContent('2 more due now');
    expect(figure.parentElement!.querySelector('[data-shape]')).toHaveAttribute('data-shape', 'triangle');
  });
});
