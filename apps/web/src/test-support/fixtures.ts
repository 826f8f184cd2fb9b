import type { Me } from '@kerfline/domain/auth/schema';
import { defineAbilityFor, type Principal } from '@kerfline/domain/authz/ability';
import type { Saw } from '@kerfline/domain/saws/schema';
import type { Site } from '@kerfline/domain/sites/schema';
import type { Role, User } from '@kerfline/domain/users/schema';

/** Invented scenario for the web tests: one region, two plants, a few saws. */
export const REGION_ID = '0b6f2c1e-6a1d-4c8e-9a52-1f0e7c3d9a01';
export const SITE_ID = '3c9d7e2a-51b4-4f0a-8e6c-2d1b9a7f4e10';
export const OTHER_SITE_ID = '7a2e4c91-0d3b-4b6e-a1f5-9c8d2e6b3f22';
export const SAW_ID = 'c4e8a1b2-7d3f-4e9a-b6c5-0f1d2e3a4b55';

export function makeSite(overrides: Partial<Site> = {}): Site {
  return {
    id: SITE_ID,
    regionId: REGION_ID,
    code: 'HLT',
    name: 'Holt Bar Works',
    city: 'Rockford',
    timeZone: 'America/Chicago',
    currency: 'USD',
    unitSystem: 'imperial',
    activeSawCount: 2,
    retiredAt: null,
    ...overrides,
  };
}

export function makeSaw(overrides: Partial<Saw> = {}): Saw {
  return {
    id: SAW_ID,
    siteId: SITE_ID,
    assetTag: 'HS-07',
    name: 'Bar line saw',
    kind: 'horizontal',
    headFeed: 'gravity_spring',
    make: 'Tallowby',
    model: 'Heathcote',
    wheelDiameterMm: 355.6,
    centreDistanceMm: 1016,
    bandWidthMm: 31.75,
    bandThicknessMm: 1.0668,
    bandLengthMm: 4114.8,
    bandSpeedMinMPerMin: 24.384,
    bandSpeedMaxMPerMin: 121.92,
    capacityRoundMm: 254,
    capacityRectWidthMm: null,
    capacityRectHeightMm: null,
    minHeadForceN: null,
    maxHeadForceN: null,
    headForceSet: null,
    status: 'in_service',
    down: null,
    bladeOn: null,
    retiredAt: null,
    createdAt: '2025-03-12T13:05:00.000Z',
    updatedAt: '2025-03-12T13:05:00.000Z',
    ...overrides,
  };
}

/** The principal a user of `role` at the test site would have, as the API resolves it. */
export function principalFor(role: Role, siteId: string | null = SITE_ID): Principal {
  const atSite = role === 'site_admin' || role === 'technician';
  return {
    id: `00000000-0000-4000-8000-00000000000${['admin', 'manager', 'regional_lead', 'site_admin', 'technician'].indexOf(role) + 1}`,
    role,
    siteId: atSite ? siteId : null,
    regionId: role === 'regional_lead' ? REGION_ID : null,
    siteIds: role === 'admin' ? 'all' : siteId ? [siteId] : [],
    regionIds: role === 'admin' ? 'all' : [REGION_ID],
  };
}

export function abilityFor(role: Role, siteId: string | null = SITE_ID) {
  return defineAbilityFor(principalFor(role, siteId));
}

/** `/api/me` for a user of `role`, with the rules the domain writes for them. */
export function makeMe(role: Role, name = 'Dana Okafor'): Me {
  const principal = principalFor(role);
  const user: User = {
    id: principal.id,
    email: 'dana.okafor@example.com',
    name,
    role,
    siteId: principal.siteId,
    regionId: principal.regionId,
    managedSiteIds: [],
    allSites: false,
    active: true,
  };
  return {
    user,
    siteIds: principal.siteIds === 'all' ? [SITE_ID, OTHER_SITE_ID] : principal.siteIds,
    rules: defineAbilityFor(principal).rules as Me['rules'],
  };
}

export const page = <T>(items: T[]) => ({ items, total: items.length, limit: 100, offset: 0 });
