import type { Sequelize } from 'sequelize';
import { BladeSpec } from '../modules/blade-specs/blade-spec.model.js';
import { BladeRun } from '../modules/blade-runs/blade-run.model.js';
import { Stop } from '../modules/stops/stop.model.js';
import type { StopCategory } from '@kerfline/domain/stops/schema';
import type { RemovalReason } from '@kerfline/domain/diagnosis/schema';
import { buildWorld, type World } from './fixtures.js';

/**
 * A small, hand-built history for the fleet figures, with every number worked out by hand in
 * `fleet-figures.test.ts`. Sites A and B (region North) and C (South) keep time in Europe/Berlin and money in EUR.
 * March 2026 in Berlin runs from 2026-02-28T23:00Z to 2026-03-31T22:00Z: 744 h less the hour lost to summer
 * time on 29 March = 743 h. April runs 2026-03-31T22:00Z to 2026-04-30T22:00Z = 720 h.
 *
 * Saw A-1: runs R1 (Feb → 5 Mar, 1 000 000 mm², 400 cuts, €60.00, break-in followed, worn out), R2 (5 Mar →
 *   20 Mar, 3 000 000 mm², 1 200 cuts, €65.00, followed, worn out), R3 (20 Mar → 31 Mar 21:30Z, still March in
 *   Berlin, 200 000 mm², 50 cuts, €70.00, skipped, tooth strippage), R4 (31 Mar 22:30Z = 1 Apr in Berlin, open,
 *   €70.00). Stops S1 mechanical 28 Feb 20:00Z → 1 Mar 02:00Z (3 h of it in March), S2 blade failure 10 Mar
 *   08:00–10:00Z, S3 planned maintenance 15 Mar 06:00–10:00Z, S4 hydraulic 31 Mar 20:00Z → 1 Apr 00:00Z (2 h in
 *   March, 2 h in April).
 * Saw A-2: runs R5 (16 Mar → 10 Apr, 2 000 000 mm², cuts not recorded, US$50.00, break-in not recorded, broken)
 *   and R6 (15 Jan → 15 Mar, area not recorded, €60.00, broken). Stops S5 no material 20 Mar 00:00–05:00Z, S6
 *   electrical from 29 Apr 22:00Z, still open.
 * Saw C-1: run RC (12 Mar → 25 Mar, 500 000 mm², 100 cuts, €99.99, worn out); saw C-2: stop SC mechanical
 *   12 Mar 00:00–10:00Z.
 */
export const FLEET_AS_OF = new Date('2026-06-15T00:00:00Z');

export async function buildFleetFixture(sequelize: Sequelize) {
  const world = await buildWorld(sequelize);
  const spec = await BladeSpec.create({
    siteId: null,
    name: 'Fixture 34x1.1 3/4',
    widthMm: 34,
    thicknessMm: 1.1,
    lengthMm: 4115,
    coarseTpi: 3,
    fineTpi: 4,
    toothForm: 'hook',
    toothSet: 'raker',
    material: 'bimetal',
    unitCostMinor: 6000,
    currency: 'EUR',
    supplier: null,
  });
  const [a1, a2] = world.saws.A!;
  const [c1, c2] = world.saws.C!;
  const run = (
    saw: { id: string; siteId: string },
    installedAt: string,
    removedAt: string | null,
    values: {
      area?: number | null;
      cuts?: number | null;
      cost: number;
      currency?: string;
      breakIn?: boolean | null;
      reason?: RemovalReason;
    },
  ) =>
    BladeRun.create({
      siteId: saw.siteId,
      sawId: saw.id,
      bladeSpecId: spec.id,
      stockReceiptId: null,
      installedAt: new Date(installedAt),
      installedById: null,
      tensionMpa: null,
      materialGroup: 'carbon_steel',
      breakInFollowed: values.breakIn ?? null,
      installNotes: null,
      costMinor: values.cost,
      currency: values.currency ?? 'EUR',
      removedAt: removedAt ? new Date(removedAt) : null,
      removalReason: removedAt ? (values.reason ?? 'worn_out') : null,
      areaCutMm2: values.area ?? null,
      cuts: values.cuts ?? null,
    });
  const stop = (
    saw: { id: string; siteId: string },
    startedAt: string,
    endedAt: string | null,
    category: StopCategory,
    planned = false,
  ) =>
    Stop.create({
      siteId: saw.siteId,
      sawId: saw.id,
      startedAt: new Date(startedAt),
      endedAt: endedAt ? new Date(endedAt) : null,
      category,
      planned,
      notes: null,
      createdById: null,
      endedById: null,
    });

  const runs = {
    R1: await run(a1!, '2026-02-20T08:00:00Z', '2026-03-05T10:00:00Z', {
      area: 1_000_000,
      cuts: 400,
      cost: 6000,
      breakIn: true,
    }),
    R2: await run(a1!, '2026-03-05T11:00:00Z', '2026-03-20T09:00:00Z', {
      area: 3_000_000,
      cuts: 1200,
      cost: 6500,
      breakIn: true,
    }),
    R3: await run(a1!, '2026-03-20T10:00:00Z', '2026-03-31T21:30:00Z', {
      area: 200_000,
      cuts: 50,
      cost: 7000,
      breakIn: false,
      reason: 'tooth_strippage',
    }),
    R4: await run(a1!, '2026-03-31T22:30:00Z', null, { cost: 7000 }),
    R5: await run(a2!, '2026-03-16T08:00:00Z', '2026-04-10T08:00:00Z', {
      area: 2_000_000,
      cost: 5000,
      currency: 'USD',
      reason: 'broken',
    }),
    R6: await run(a2!, '2026-01-15T08:00:00Z', '2026-03-15T12:00:00Z', { cost: 6000, reason: 'broken' }),
    RC: await run(c1!, '2026-03-12T08:00:00Z', '2026-03-25T08:00:00Z', { area: 500_000, cuts: 100, cost: 9999 }),
  };
  const stops = {
    S1: await stop(a1!, '2026-02-28T20:00:00Z', '2026-03-01T02:00:00Z', 'mechanical'),
    S2: await stop(a1!, '2026-03-10T08:00:00Z', '2026-03-10T10:00:00Z', 'blade_failure'),
    S3: await stop(a1!, '2026-03-15T06:00:00Z', '2026-03-15T10:00:00Z', 'planned_maintenance', true),
    S4: await stop(a1!, '2026-03-31T20:00:00Z', '2026-04-01T00:00:00Z', 'hydraulic'),
    S5: await stop(a2!, '2026-03-20T00:00:00Z', '2026-03-20T05:00:00Z', 'no_material_operator'),
    S6: await stop(a2!, '2026-04-29T22:00:00Z', null, 'electrical'),
    SC: await stop(c2!, '2026-03-12T00:00:00Z', '2026-03-12T10:00:00Z', 'mechanical'),
  };
  return { world, spec, runs, stops, saws: { a1: a1!, a2: a2!, c1: c1!, c2: c2! } };
}
export type FleetFixture = Awaited<ReturnType<typeof buildFleetFixture>> & { world: World };
