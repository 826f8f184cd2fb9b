import type { BladeRun } from '@kerfline/domain/blade-runs/schema';
import type { BladeSpec } from '@kerfline/domain/blade-specs/schema';
import { SAW_ID, SITE_ID } from './fixtures';

/** Invented records for the web tests of the records' forms and tables. */
export const SPEC_ID = '5b1f0a2c-3d4e-4f5a-8b6c-7d8e9f0a1b22';
export const OTHER_SPEC_ID = '6c2a1b3d-4e5f-4a6b-9c7d-8e9f0a1b2c33';
export const RUN_ID = '8e4c3d5f-6a7b-4c8d-ab9e-0f1a2b3c4d55';

export function makeSpec(overrides: Partial<BladeSpec> = {}): BladeSpec {
  return {
    id: SPEC_ID,
    siteId: null,
    name: '1.25 in bi-metal 4/6',
    widthMm: 31.75,
    thicknessMm: 1.0668,
    lengthMm: 4114.8,
    pitch: { kind: 'variable', coarseTpi: 4, fineTpi: 6 },
    toothForm: 'hook',
    toothSet: 'raker',
    material: 'bimetal',
    unitCostMinor: 6450,
    currency: 'USD',
    supplier: null,
    archived: false,
    createdAt: '2025-01-01T00:00:00.000Z',
    updatedAt: '2025-01-01T00:00:00.000Z',
    ...overrides,
  };
}

export function makeRun(overrides: Partial<BladeRun> = {}): BladeRun {
  return {
    id: RUN_ID,
    siteId: SITE_ID,
    sawId: SAW_ID,
    sawAssetTag: 'HS-07',
    bladeSpecId: SPEC_ID,
    bladeSpecName: '1.25 in bi-metal 4/6',
    stockReceiptId: null,
    installedAt: '2026-03-01T13:00:00.000Z',
    installedById: null,
    installedByName: 'Dale Pruitt',
    tensionMpa: 206.8427,
    materialGroup: 'alloy_steel',
    breakInFollowed: null,
    installNotes: null,
    costMinor: 6450,
    currency: 'USD',
    removedAt: null,
    removedById: null,
    removedByName: null,
    removalReason: null,
    areaCutMm2: null,
    cuts: null,
    areaSource: null,
    removalNotes: null,
    confirmedCause: null,
    confirmedCauseAt: null,
    confirmedCauseById: null,
    photoCount: 0,
    createdAt: '2026-03-01T13:00:00.000Z',
    updatedAt: '2026-03-01T13:00:00.000Z',
    ...overrides,
  };
}
