import { addMonths } from '@kerfline/domain/fleet/period';
import type { Figures, FleetOverview, FleetSite } from '@kerfline/domain/fleet/schema';
import type { FakeRequest } from './fake-api';
import { OTHER_SITE_ID, REGION_ID, SITE_ID } from './fixtures';

/** Invented figures for the web tests of the fleet screens: two plants of the test region. */
export function makeFleetSite(overrides: Partial<FleetSite> = {}): FleetSite {
  return {
    id: SITE_ID,
    code: 'HLT',
    name: 'Holt Bar Works',
    regionId: REGION_ID,
    currency: 'USD',
    unitSystem: 'imperial',
    timeZone: 'America/Chicago',
    colourIndex: 0,
    ...overrides,
  };
}

export const otherFleetSite = (overrides: Partial<FleetSite> = {}) =>
  makeFleetSite({
    id: OTHER_SITE_ID,
    code: 'WSM',
    name: 'Wrenmoor Steel',
    currency: 'CAD',
    unitSystem: 'metric',
    timeZone: 'America/Toronto',
    colourIndex: 1,
    ...overrides,
  });

/** A quiet month or period of one site, in the reporting currency; override what a test reads. */
export function makeFigures(overrides: Partial<Figures> = {}): Figures {
  return {
    bladesUsed: 4,
    spend: { amountMinor: 25_800, currency: 'USD', complete: true, missing: [] },
    bladesRemoved: 4,
    bladesWithArea: 4,
    areaCutMm2: 4 * 2_580_640,
    costPerAreaMinorPerMm2: 25_800 / (4 * 2_580_640),
    costPerAreaComplete: true,
    meanLifeMm2: 2_580_640,
    medianLifeMm2: 2_580_640,
    meanCutsPerBlade: 120,
    stopHours: {
      blade_change: 2,
      blade_failure: 1,
      mechanical: 0,
      hydraulic: 0,
      electrical: 0,
      no_material_operator: 0,
      planned_maintenance: 4,
      other: 0,
    },
    scheduledHours: 400,
    downtimeHours: 7,
    uptimeHours: 393,
    failures: 1,
    failureDowntimeHours: 1,
    mtbfHours: 393,
    mttrHours: 1,
    operationalAvailability: 393 / 400,
    breakInRecorded: 4,
    breakInFollowed: 3,
    ...overrides,
  };
}

/** The overview as the API answers the query it was sent: the sites asked for, or all the caller's. */
export function overviewFor(request: FakeRequest): FleetOverview {
  const choices = [makeFleetSite(), otherFleetSite()];
  const asked = request.query.get('sites')?.split(',') ?? choices.map((s) => s.id);
  const from = request.query.get('from')!;
  const to = request.query.get('to')!;
  return {
    period: { from, to },
    previous: { from: addMonths(from, -6), to: addMonths(to, -6) },
    asOf: '2026-12-01T12:00:00.000Z',
    reportingCurrency: 'USD',
    sites: choices
      .filter((s) => asked.includes(s.id))
      .map((site) => ({ site, current: makeFigures(), previous: makeFigures() })),
    choices,
    fleet: { current: makeFigures(), previous: makeFigures() },
    months: [],
    warnings: [],
  };
}
