import { QueryTypes, type Sequelize, type Transaction } from 'sequelize';
import type { MaterialGroup } from '@kerfline/domain/band-speed/schema';
import { recommendedBandSpeed } from '@kerfline/domain/band-speed/speed-ranges';
import type { StockShape } from '@kerfline/domain/stock-area/schema';
import type { StopCategory } from '@kerfline/domain/stops/schema';
import type { RemovalReason } from '@kerfline/domain/diagnosis/schema';
import type { UnitSystem } from '@kerfline/domain/sites/schema';
import { cutLogFigures } from '../modules/records/trade.js';

/*
 * Two years of invented history for the demo saws of Corvane Metals: blade runs, stops, cut logs and stock
 * receipts. Every figure here is invented for the demo, drawn from a seeded random generator against a fixed
 * reference date, so every load gives the same history. It is shaped so the dashboards have something true to
 * find: three saws eat blades (each for its own reason), one site skips break-in, one site has long stops, two
 * saws are down at the reference date, and two sites keep cut logs.
 */

/** The end of the demo history: every record is before it (and so never in the future). */
export const DEMO_REFERENCE_DATE = new Date('2026-11-30T18:00:00Z');
const HISTORY_DAYS = 730;
const DAY = 86_400_000;
const HOUR = 3_600_000;
const MINUTE = 60_000;

/** Saws that eat blades, and why: too fast a band, too coarse a pitch for thin walls, a band over-tensioned. */
export const EATERS: Record<string, 'too_fast' | 'too_coarse' | 'over_tensioned'> = {
  'RTM-S02': 'too_fast',
  'MTY-S01': 'too_coarse',
  'HOU-S04': 'over_tensioned',
};
/** Saws down at the reference date (the demo fleet lists them as down). */
const DOWN_AT_REFERENCE: Record<string, { category: StopCategory; hoursBefore: number; notes: string }> = {
  'HAM-S03': { category: 'hydraulic', hoursBefore: 26, notes: 'Head drops under load; waiting for a seal kit.' },
  'RTM-S04': { category: 'mechanical', hoursBefore: 7, notes: 'Drive wheel bearing noisy; taken out of use.' },
};
/** The site that skips break-in, and the site whose breakdowns last long. */
export const POOR_BREAK_IN_SITE = 'CV-DBN';
const LONG_STOPS_SITE = 'CV-HOU';
/** Sites that keep the optional cut logs. */
const CUT_LOG_SITES = new Set(['CV-RTM', 'CV-MTY']);

/** mulberry32: a small, well-known seeded generator; one per saw so each saw's history is stable. */
export function generator(seedText: string) {
  let seed = 2166136261;
  for (const ch of seedText) seed = Math.imul(seed ^ ch.charCodeAt(0), 16777619);
  let a = seed >>> 0;
  const next = () => {
    a = (a + 0x6d2b79f5) | 0;
    let t = Math.imul(a ^ (a >>> 15), 1 | a);
    t = (t + Math.imul(t ^ (t >>> 7), 61 | t)) ^ t;
    return ((t ^ (t >>> 14)) >>> 0) / 4294967296;
  };
  const between = (lo: number, hi: number) => lo + (hi - lo) * next();
  const normal = () => Math.sqrt(-2 * Math.log(1 - next())) * Math.cos(2 * Math.PI * next());
  return {
    next,
    between,
    /** A positive figure around `median`, spread by `sigma` in log space. */
    logNormal: (median: number, sigma: number) => median * Math.exp(sigma * normal()),
    chance: (p: number) => next() < p,
    pick<T>(weighted: readonly (readonly [T, number])[]): T {
      const total = weighted.reduce((s, [, w]) => s + w, 0);
      let r = next() * total;
      for (const [value, w] of weighted) if ((r -= w) <= 0) return value;
      return weighted[weighted.length - 1]![0];
    },
    /** A version 4 UUID from the generator, so ids are as stable as the rest. */
    uuid(): string {
      const hex = Array.from({ length: 32 }, () => Math.floor(next() * 16).toString(16));
      hex[12] = '4';
      hex[16] = ((Number.parseInt(hex[16]!, 16) & 0x3) | 0x8).toString(16);
      const h = hex.join('');
      return `${h.slice(0, 8)}-${h.slice(8, 12)}-${h.slice(12, 16)}-${h.slice(16, 20)}-${h.slice(20)}`;
    },
  };
}
type Rng = ReturnType<typeof generator>;

type SawRow = {
  id: string;
  site_id: string;
  asset_tag: string;
  kind: 'horizontal' | 'vertical';
  band_width_mm: number;
  band_thickness_mm: number;
  band_length_mm: number;
  band_speed_min_m_per_min: number;
  band_speed_max_m_per_min: number;
  retired_at: Date | null;
  site_code: string;
  currency: string;
  unit_system: UnitSystem;
};
type SawClass = 'light' | 'mid' | 'heavy' | 'beam' | 'vertical';

/** The class of a demo saw from the band it takes (names and makes may change; band sizes do not). */
function classOf(saw: SawRow): SawClass {
  if (saw.kind === 'vertical') return 'vertical';
  if (saw.band_width_mm < 30) return 'light';
  if (saw.band_width_mm < 37) return 'mid';
  if (saw.band_width_mm < 45) return 'heavy';
  return 'beam';
}

/** Cutting rate while cutting, mm²/min, and hours of cutting a day, per class (invented). */
const CUTTING: Record<SawClass, { rateMm2PerMin: number; hoursPerDay: number }> = {
  light: { rateMm2PerMin: 2500, hoursPerDay: 2.5 },
  mid: { rateMm2PerMin: 4200, hoursPerDay: 3.5 },
  heavy: { rateMm2PerMin: 6000, hoursPerDay: 3.5 },
  beam: { rateMm2PerMin: 5000, hoursPerDay: 4 },
  vertical: { rateMm2PerMin: 600, hoursPerDay: 1.5 },
};

/** Median life of a bi-metal blade per material, mm² of cut (invented for the demo). */
const LIFE_MM2: Record<MaterialGroup, number> = {
  carbon_steel: 4.5e6,
  alloy_steel: 3.2e6,
  stainless_steel: 1.8e6,
  tool_steel: 1.6e6,
  aluminium: 11e6,
  copper_alloy: 6e6,
  cast_iron: 3e6,
};

/** What each site cuts: material, a stock shape maker, and its weight in the mix. */
type Job = { material: MaterialGroup; shape: (r: Rng) => StockShape; weight: number; bundle?: number; thinWall?: true };
const round = (lo: number, hi: number) => (r: Rng) => ({
  kind: 'round_bar' as const,
  diameterMm: Math.round(r.between(lo, hi)),
});
const inch = (r: Rng, values: number[]) => values[Math.floor(r.next() * values.length)]! * 25.4;
const JOBS: Record<string, Job[]> = {
  'CV-HAM': [
    {
      material: 'carbon_steel',
      shape: (r) => ({ kind: 'round_bar', diameterMm: inch(r, [1.5, 2, 3, 4, 5, 6]) }),
      weight: 5,
    },
    {
      material: 'carbon_steel',
      shape: (r) => ({ kind: 'flat_bar', widthMm: inch(r, [3, 4, 6]), heightMm: inch(r, [0.5, 0.75, 1]) }),
      weight: 3,
    },
    { material: 'alloy_steel', shape: (r) => ({ kind: 'round_bar', diameterMm: inch(r, [2, 3, 4]) }), weight: 2 },
  ],
  'CV-DBN': [
    {
      material: 'carbon_steel',
      shape: (r) => ({
        kind: 'round_tube',
        outsideDiameterMm: inch(r, [2, 3, 4.5]),
        wallMm: inch(r, [0.12, 0.19, 0.25]),
      }),
      weight: 5,
      bundle: 4,
    },
    {
      material: 'carbon_steel',
      shape: (r) => ({
        kind: 'rect_tube',
        widthMm: inch(r, [3, 4]),
        heightMm: inch(r, [2, 3]),
        wallMm: inch(r, [0.12, 0.19]),
      }),
      weight: 3,
      bundle: 3,
    },
    {
      material: 'stainless_steel',
      shape: (r) => ({ kind: 'round_tube', outsideDiameterMm: inch(r, [1.5, 2, 3]), wallMm: inch(r, [0.065, 0.12]) }),
      weight: 2,
      bundle: 3,
    },
  ],
  'CV-RTM': [
    { material: 'alloy_steel', shape: round(40, 220), weight: 3 },
    { material: 'tool_steel', shape: round(30, 160), weight: 2 },
    { material: 'carbon_steel', shape: round(30, 250), weight: 5 },
  ],
  'CV-HOU': [
    {
      material: 'carbon_steel',
      shape: (r) => {
        const d = inch(r, [8, 10, 12, 16]);
        return { kind: 'beam', depthMm: d, flangeWidthMm: d * 0.55, webThicknessMm: 8, flangeThicknessMm: 12 };
      },
      weight: 5,
    },
    {
      material: 'carbon_steel',
      shape: (r) => {
        const d = inch(r, [6, 8, 10]);
        return { kind: 'channel', depthMm: d, flangeWidthMm: d * 0.35, webThicknessMm: 7, flangeThicknessMm: 10 };
      },
      weight: 3,
    },
    {
      material: 'carbon_steel',
      shape: (r) => {
        const l = inch(r, [3, 4, 6]);
        return { kind: 'angle', legOnBedMm: l, legUpMm: l, thicknessMm: inch(r, [0.25, 0.375, 0.5]) };
      },
      weight: 2,
      bundle: 2,
    },
  ],
  'CV-MTY': [
    { material: 'carbon_steel', shape: round(25, 200), weight: 4 },
    { material: 'stainless_steel', shape: round(20, 120), weight: 2 },
    {
      material: 'aluminium',
      shape: (r) => ({
        kind: 'flat_bar',
        widthMm: Math.round(r.between(50, 200)),
        heightMm: Math.round(r.between(10, 50)),
      }),
      weight: 2,
    },
    {
      material: 'carbon_steel',
      shape: (r) => ({
        kind: 'round_tube',
        outsideDiameterMm: Math.round(r.between(40, 90)),
        wallMm: r.chance(0.5) ? 2 : 3,
      }),
      weight: 2,
      bundle: 3,
      thinWall: true,
    },
  ],
};

const NORMAL_REASONS: readonly (readonly [RemovalReason, number])[] = [
  ['worn_out', 80],
  ['tooth_strippage', 6],
  ['fatigue_crack', 4],
  ['broken', 3],
  ['crooked_cutting', 5],
  ['other', 2],
];
const EATER_REASONS: Record<(typeof EATERS)[string], readonly (readonly [RemovalReason, number])[]> = {
  too_fast: [
    ['worn_out', 70],
    ['crooked_cutting', 20],
    ['tooth_strippage', 10],
  ],
  too_coarse: [
    ['tooth_strippage', 45],
    ['worn_out', 45],
    ['broken', 10],
  ],
  over_tensioned: [
    ['fatigue_crack', 40],
    ['broken', 15],
    ['worn_out', 45],
  ],
};
/** The cause a technician confirmed, for some failed blades (each is a cause the diagnosis lists for the mode). */
const CONFIRMED: Partial<Record<RemovalReason, string>> = {
  tooth_strippage: 'teeth_in_work_low',
  fatigue_crack: 'tension_off',
  broken: 'feed_high',
  crooked_cutting: 'guides_worn',
};

/** Other stops: category, weight, median hours, planned. */
const OTHER_STOPS: readonly (readonly [StopCategory, number, number, boolean])[] = [
  ['mechanical', 4, 2.5, false],
  ['hydraulic', 2, 3, false],
  ['electrical', 2, 1.5, false],
  ['no_material_operator', 4, 1.2, false],
  ['planned_maintenance', 3, 4, true],
  ['other', 1, 1, false],
];

/** Catalogue prices are in US dollars; sites buy in their own currency (invented rates). */
const PER_USD: Record<string, number> = { USD: 1, CAD: 1.37, EUR: 0.92, MXN: 17.8 };

type Spec = { id: string; name: string; coarseTpi: number; fineTpi: number | null; priceUsdCents: number };

function specName(saw: SawRow, pitch: string, material: string): string {
  const imperial = saw.unit_system === 'imperial';
  const fmt = (mm: number) => (imperial ? `${Number((mm / 25.4).toFixed(3))} in` : `${Number(mm.toFixed(2))} mm`);
  return `${fmt(saw.band_width_mm)} × ${imperial ? Number((saw.band_thickness_mm / 25.4).toFixed(3)) + ' in' : fmt(saw.band_thickness_mm)} × ${fmt(saw.band_length_mm)} ${material} ${pitch}`;
}

/** Pitches per class: the usual one and a second (finer for tubes and thin sections, coarser for the eater). */
const PITCHES: Record<SawClass, { main: [number, number | null]; alt: [number, number | null] }> = {
  light: { main: [6, 10], alt: [8, 12] },
  mid: { main: [3, 4], alt: [5, 8] },
  heavy: { main: [2, 3], alt: [1.4, 2] },
  beam: { main: [3, 4], alt: [2, 3] },
  vertical: { main: [10, null], alt: [14, null] },
};
const pitchText = ([a, b]: [number, number | null]) => (b === null ? `${a} TPI` : `${a}/${b} TPI`);

type RunRow = {
  id: string;
  site_id: string;
  saw_id: string;
  blade_spec_id: string;
  stock_receipt_id: string | null;
  installed_at: Date;
  installed_by_id: string | null;
  tension_mpa: number | null;
  material_group: MaterialGroup;
  break_in_followed: boolean | null;
  cost_minor: number;
  currency: string;
  removed_at: Date | null;
  removed_by_id: string | null;
  removal_reason: RemovalReason | null;
  area_cut_mm2: number | null;
  cuts: number | null;
  area_source: 'entered' | 'cut_logs' | null;
  confirmed_cause: string | null;
  confirmed_cause_at: Date | null;
  confirmed_cause_by_id: string | null;
};
type StopRow = {
  id: string;
  site_id: string;
  saw_id: string;
  started_at: Date;
  ended_at: Date | null;
  category: StopCategory;
  planned: boolean;
  notes: string | null;
  created_by_id: string | null;
  ended_by_id: string | null;
};

async function insertAll(
  sequelize: Sequelize,
  transaction: Transaction,
  table: string,
  rows: Record<string, unknown>[],
) {
  for (let i = 0; i < rows.length; i += 1000)
    await sequelize.getQueryInterface().bulkInsert(table, rows.slice(i, i + 1000), { transaction });
}

/**
 * Loads the demo history into the saws the scenario just created, inside its transaction. Bulk inserts only;
 * a few thousand rows per table.
 */
export async function loadDemoHistory(sequelize: Sequelize, transaction: Transaction): Promise<void> {
  const saws = await sequelize.query<SawRow>(
    `SELECT s.id, s.site_id, s.asset_tag, s.kind, s.band_width_mm, s.band_thickness_mm, s.band_length_mm,
            s.band_speed_min_m_per_min, s.band_speed_max_m_per_min, s.retired_at,
            t.code AS site_code, t.currency, t.unit_system
       FROM saws s JOIN sites t ON t.id = s.site_id ORDER BY s.asset_tag`,
    { type: QueryTypes.SELECT, transaction },
  );
  const people = await sequelize.query<{ id: string; site_id: string | null; role: string }>(
    `SELECT id, site_id, role FROM users WHERE site_id IS NOT NULL ORDER BY email`,
    { type: QueryTypes.SELECT, transaction },
  );
  const peopleAt = (siteId: string) => people.filter((p) => p.site_id === siteId).map((p) => p.id);
  const end = DEMO_REFERENCE_DATE.getTime();
  const start = end - HISTORY_DAYS * DAY;

  // The fleet catalogue: two specs per band size in use (the usual pitch and a second one).
  const catalogue = generator('catalogue');
  const specsBySize = new Map<string, { main: Spec; alt: Spec }>();
  const specRows: Record<string, unknown>[] = [];
  for (const saw of saws) {
    const size = `${saw.band_width_mm}|${saw.band_thickness_mm}|${saw.band_length_mm}`;
    if (specsBySize.has(size)) continue;
    const cls = classOf(saw);
    const material = cls === 'vertical' ? 'carbon' : 'bimetal';
    const make = (pitch: [number, number | null]): Spec => {
      const priceUsdCents = Math.round(
        (saw.band_length_mm / 1000) * saw.band_width_mm * (material === 'carbon' ? 18 : 52),
      );
      const spec = {
        id: catalogue.uuid(),
        name: specName(saw, pitchText(pitch), material === 'carbon' ? 'carbon' : 'bi-metal'),
        coarseTpi: pitch[0],
        fineTpi: pitch[1],
        priceUsdCents,
      };
      specRows.push({
        id: spec.id,
        site_id: null,
        name: spec.name,
        width_mm: saw.band_width_mm,
        thickness_mm: saw.band_thickness_mm,
        length_mm: saw.band_length_mm,
        coarse_tpi: pitch[0],
        fine_tpi: pitch[1],
        tooth_form: pitch[0] <= 3 ? 'hook' : 'regular',
        tooth_set: cls === 'vertical' ? 'raker' : 'alternate',
        material,
        unit_cost_minor: priceUsdCents,
        currency: 'USD',
        supplier: 'Halvard Band Works',
      });
      return spec;
    };
    specsBySize.set(size, { main: make(PITCHES[cls].main), alt: make(PITCHES[cls].alt) });
  }
  await insertAll(sequelize, transaction, 'blade_specs', specRows);

  const runs: RunRow[] = [];
  const stops: StopRow[] = [];
  const cutLogs: Record<string, unknown>[] = [];

  for (const saw of saws) {
    const r = generator(saw.asset_tag);
    const cls = classOf(saw);
    const specs = specsBySize.get(`${saw.band_width_mm}|${saw.band_thickness_mm}|${saw.band_length_mm}`)!;
    const eater = EATERS[saw.asset_tag];
    const staff = peopleAt(saw.site_id);
    const who = () => (staff.length > 0 ? staff[Math.floor(r.next() * staff.length)]! : null);
    const sawEnd = saw.retired_at ? saw.retired_at.getTime() - DAY : end;
    const dailyArea = CUTTING[cls].rateMm2PerMin * 60 * CUTTING[cls].hoursPerDay;
    const jobs = JOBS[saw.site_code]!.filter((j) => cls !== 'vertical' || j.material !== 'aluminium');
    const keepsLogs = CUT_LOG_SITES.has(saw.site_code);
    const sawStops: StopRow[] = [];

    let t = start + r.between(0, 3) * DAY;
    for (;;) {
      const job = r.pick(jobs.map((j) => [j, j.weight] as const));
      // The coarse-pitch eater keeps its usual 3/4 band on thin-wall tube; other saws take the second pitch now and then.
      const spec = eater !== 'too_coarse' && r.chance(0.2) ? specs.alt : specs.main;
      const breakIn = r.chance(0.05) ? null : r.chance(saw.site_code === POOR_BREAK_IN_SITE ? 0.35 : 0.93);
      let lifeMm2 = r.logNormal(LIFE_MM2[job.material] * (cls === 'vertical' ? 0.15 : 1), 0.35);
      if (eater) lifeMm2 *= 0.6;
      if (breakIn === false) lifeMm2 *= 0.7;
      const reason = r.pick(eater ? EATER_REASONS[eater] : NORMAL_REASONS);
      if (reason !== 'worn_out') lifeMm2 *= r.between(0.2, 0.8);
      const lifeMs = (lifeMm2 / dailyArea) * DAY;
      const installedBy = who();
      const removedAt = t + lifeMs;
      const open = removedAt >= sawEnd && !saw.retired_at;
      const run: RunRow = {
        id: r.uuid(),
        site_id: saw.site_id,
        saw_id: saw.id,
        blade_spec_id: spec.id,
        stock_receipt_id: null,
        installed_at: new Date(t),
        installed_by_id: installedBy,
        // Within the printed range for the band's material (bi-metal 25,000–30,000 psi ≈ 172–207 MPa, carbon
        // 15,000–20,000 psi ≈ 103–138 MPa), except on the saw whose bands are over-tensioned.
        tension_mpa:
          cls === 'vertical'
            ? Math.round(r.between(110, 130))
            : Math.round(eater === 'over_tensioned' ? r.between(265, 290) : r.between(180, 204)),
        material_group: job.material,
        break_in_followed: breakIn,
        cost_minor: 0,
        currency: saw.currency,
        removed_at: null,
        removed_by_id: null,
        removal_reason: null,
        area_cut_mm2: null,
        cuts: null,
        area_source: null,
        confirmed_cause: null,
        confirmed_cause_at: null,
        confirmed_cause_by_id: null,
      };
      const until = open ? end - HOUR : Math.min(removedAt, sawEnd);
      let logged = { area: 0, cuts: 0 };
      if (keepsLogs && until > t)
        logged = makeCutLogs(
          r,
          saw,
          run,
          job,
          jobs,
          spec,
          t,
          until,
          open ? lifeMm2 * ((until - t) / lifeMs) : lifeMm2,
          cutLogs,
          eater,
        );
      if (!open) {
        const removed = Math.min(removedAt, sawEnd);
        run.removed_at = new Date(removed);
        run.removed_by_id = who();
        run.removal_reason = removed < removedAt ? 'worn_out' : reason;
        if (keepsLogs) {
          run.area_cut_mm2 = logged.area;
          run.cuts = logged.cuts;
          run.area_source = 'cut_logs';
        } else if (r.chance(0.9)) {
          run.area_cut_mm2 = Math.round(lifeMm2 / 100) * 100;
          run.area_source = 'entered';
          if (r.chance(0.5)) run.cuts = Math.round(lifeMm2 / r.between(3000, 9000));
        }
        const cause = CONFIRMED[run.removal_reason];
        if (cause && r.chance(0.35)) {
          run.confirmed_cause = eater === 'too_fast' && run.removal_reason === 'crooked_cutting' ? 'dull_band' : cause;
          run.confirmed_cause_at = new Date(removed + r.between(0.2, 3) * HOUR);
          run.confirmed_cause_by_id = run.removed_by_id;
        }
      }
      runs.push(run);
      if (open || removedAt >= sawEnd) break;
      // The blade change itself is a stop: planned for a worn blade, unplanned when it failed.
      const failed = run.removal_reason !== 'worn_out';
      const gap = (failed ? r.between(40, 150) : r.between(15, 45)) * MINUTE;
      sawStops.push({
        id: r.uuid(),
        site_id: saw.site_id,
        saw_id: saw.id,
        started_at: new Date(removedAt),
        ended_at: new Date(removedAt + gap),
        category: failed ? 'blade_failure' : 'blade_change',
        planned: !failed,
        notes: null,
        created_by_id: run.removed_by_id,
        ended_by_id: run.removed_by_id,
      });
      t = removedAt + gap;
    }

    // Other stops, about one every nine days; long ones at the site whose breakdowns drag on.
    const longStops = saw.site_code === LONG_STOPS_SITE;
    for (let s = start + r.between(1, 9) * DAY; s < sawEnd; s += r.logNormal(9, 0.6) * DAY) {
      const [category, , medianHours, planned] = r.pick(OTHER_STOPS.map((o) => [o, o[1]] as const));
      const breakdown = category === 'mechanical' || category === 'hydraulic' || category === 'electrical';
      const hours = r.logNormal(medianHours * (longStops && breakdown ? 7 : 1), 0.7);
      const by = who();
      sawStops.push({
        id: r.uuid(),
        site_id: saw.site_id,
        saw_id: saw.id,
        started_at: new Date(s),
        ended_at: new Date(s + Math.max(0.1, hours) * HOUR),
        category,
        planned,
        notes: null,
        created_by_id: by,
        ended_by_id: by,
      });
    }
    const down = DOWN_AT_REFERENCE[saw.asset_tag];
    if (down) {
      sawStops.push({
        id: r.uuid(),
        site_id: saw.site_id,
        saw_id: saw.id,
        started_at: new Date(end - down.hoursBefore * HOUR),
        ended_at: null,
        category: down.category,
        planned: false,
        notes: down.notes,
        created_by_id: who(),
        ended_by_id: null,
      });
    }
    // Stops of one saw never overlap, and all end by the reference date: keep them in time order and drop any
    // that would collide with the one before (the open stop at the end always stays).
    sawStops.sort((a, b) => a.started_at.getTime() - b.started_at.getTime() || (a.ended_at ? 0 : 1));
    let lastEnd = -Infinity;
    for (const stop of sawStops) {
      const isOpen = stop.ended_at === null;
      if (stop.started_at.getTime() < lastEnd) continue;
      if (!isOpen && stop.ended_at!.getTime() > (down ? end - down.hoursBefore * HOUR : end)) continue;
      stops.push(stop);
      lastEnd = isOpen ? Infinity : stop.ended_at!.getTime();
    }
  }

  const receipts = stockFor(runs, saws, specRows);
  await insertAll(sequelize, transaction, 'stock_receipts', receipts);
  await insertAll(sequelize, transaction, 'blade_runs', runs);
  await insertAll(sequelize, transaction, 'stops', stops);
  await insertAll(sequelize, transaction, 'cut_logs', cutLogs);
}

/** Cut logs across a run: the run's area split into batches of the site's jobs; returns what they add up to. */
function makeCutLogs(
  r: Rng,
  saw: SawRow,
  run: RunRow,
  job: Job,
  jobs: Job[],
  spec: Spec,
  from: number,
  until: number,
  areaMm2: number,
  out: Record<string, unknown>[],
  eater: (typeof EATERS)[string] | undefined,
): { area: number; cuts: number } {
  const n = Math.max(2, Math.min(10, Math.round((until - from) / DAY)));
  let area = 0;
  let cuts = 0;
  for (let i = 0; i < n; i++) {
    const j = i === 0 || r.chance(0.7) ? job : r.pick(jobs.map((x) => [x, x.weight] as const));
    // The eater with the coarse pitch cuts thin-wall tube (2–3 mm walls) more than anything else.
    const thinTube = jobs.find((x) => x.thinWall);
    const chosen = eater === 'too_coarse' && thinTube && r.chance(0.7) ? thinTube : j;
    const shape = chosen.shape(r);
    const pieceCount = chosen.bundle && r.chance(0.6) ? chosen.bundle : 1;
    const speed = recommendedBandSpeed(chosen.material);
    const mid = (speed.minMPerMin + speed.maxMPerMin) / 2;
    const bandSpeed = Math.min(
      saw.band_speed_max_m_per_min,
      Math.max(
        saw.band_speed_min_m_per_min,
        eater === 'too_fast' ? speed.maxMPerMin * r.between(1.2, 1.45) : mid * r.between(0.8, 1.15),
      ),
    );
    const figures = cutLogFigures({
      shape,
      pieceCount,
      piecesAcross: pieceCount,
      quantity: 1,
      materialGroup: chosen.material,
      bandSpeedMPerMin: bandSpeed,
      pitch:
        spec.fineTpi === null
          ? { kind: 'constant', tpi: spec.coarseTpi }
          : { kind: 'variable', coarseTpi: spec.coarseTpi, fineTpi: spec.fineTpi },
      saw: {
        id: saw.id,
        bandWidthMm: saw.band_width_mm,
        bandThicknessMm: saw.band_thickness_mm,
        bandLengthMm: saw.band_length_mm,
        bandSpeedMinMPerMin: saw.band_speed_min_m_per_min,
        bandSpeedMaxMPerMin: saw.band_speed_max_m_per_min,
      },
      bladeMaterial: classOf(saw) === 'vertical' ? 'carbon' : 'bimetal',
      unitSystem: saw.unit_system,
    });
    const quantity = Math.max(1, Math.min(10_000, Math.round(areaMm2 / n / figures.areaPerCutMm2)));
    const rate = CUTTING[classOf(saw)].rateMm2PerMin * r.between(0.8, 1.2);
    const cutTimeS = Math.min(86_400, Math.max(5, Math.round((figures.areaPerCutMm2 / rate) * 60)));
    const areaCut = figures.areaPerCutMm2 * quantity;
    area += areaCut;
    cuts += quantity;
    out.push({
      id: r.uuid(),
      site_id: saw.site_id,
      saw_id: saw.id,
      blade_run_id: run.id,
      cut_at: new Date(from + ((i + 0.5) / n) * (until - from)),
      shape: JSON.stringify(shape),
      piece_count: pieceCount,
      pieces_across: pieceCount,
      material_group: chosen.material,
      quantity,
      band_speed_m_per_min: Math.round(bandSpeed * 10) / 10,
      feed_mm_per_min: null,
      cut_time_s: cutTimeS,
      area_per_cut_mm2: figures.areaPerCutMm2,
      area_cut_mm2: areaCut,
      teeth_in_work_min: figures.teethInWorkMin,
      teeth_in_work_max: figures.teethInWorkMax,
      warnings: JSON.stringify(figures.warnings),
      notes: null,
      created_by_id: run.installed_by_id,
    });
  }
  return { area, cuts };
}

/**
 * Stock receipts that keep each site's shelves filled the way a buyer would: a first delivery before the
 * history starts, then a new one whenever fewer than about a month's blades are left. Every run draws from the
 * oldest receipt with blades left (first in, first out) at that receipt's cost, as the API does.
 */
function stockFor(runs: RunRow[], saws: SawRow[], specRows: Record<string, unknown>[]): Record<string, unknown>[] {
  const price = new Map(specRows.map((s) => [s.id as string, s.unit_cost_minor as number]));
  const specName = new Map(specRows.map((s) => [s.id as string, s.name as string]));
  const currencyOf = new Map(saws.map((s) => [s.site_id, s.currency]));
  const codeOf = new Map(saws.map((s) => [s.site_id, s.site_code]));
  const receipts: Record<string, unknown>[] = [];
  const groups = new Map<string, RunRow[]>();
  for (const run of runs) {
    const key = `${run.site_id}|${run.blade_spec_id}`;
    groups.set(key, [...(groups.get(key) ?? []), run]);
  }
  for (const [key, group] of groups) {
    const [siteId, specId] = key.split('|') as [string, string];
    // Seeded by names, not ids (site ids differ from load to load), so each shelf's history is stable.
    const r = generator(`stock ${codeOf.get(siteId)} ${specName.get(specId)}`);
    group.sort((a, b) => a.installed_at.getTime() - b.installed_at.getTime());
    const perMonth = (group.length / HISTORY_DAYS) * 30;
    const batch = Math.max(3, Math.ceil((perMonth * 1.5) / 5) * 5);
    const currency = currencyOf.get(siteId)!;
    const shelf: { id: string; left: number; cost: number }[] = [];
    const receive = (at: number) => {
      const years = (at - (DEMO_REFERENCE_DATE.getTime() - HISTORY_DAYS * DAY)) / (365 * DAY);
      const cost = Math.round(price.get(specId)! * PER_USD[currency]! * (1 + 0.03 * years) * r.between(0.97, 1.03));
      const receipt = { id: r.uuid(), left: batch, cost };
      shelf.push(receipt);
      receipts.push({
        id: receipt.id,
        site_id: siteId,
        blade_spec_id: specId,
        quantity: batch,
        unit_cost_minor: cost,
        currency,
        received_on: new Date(at).toISOString().slice(0, 10),
        reference: `DN-${Math.floor(r.between(10000, 99999))}`,
        notes: null,
        created_by_id: null,
        created_at: new Date(at),
        updated_at: new Date(at),
      });
    };
    receive(group[0]!.installed_at.getTime() - 7 * DAY);
    for (const run of group) {
      const onHand = shelf.reduce((s, x) => s + x.left, 0);
      if (onHand <= Math.max(1, perMonth)) receive(run.installed_at.getTime() - DAY);
      const from = shelf.find((x) => x.left > 0)!;
      from.left -= 1;
      run.stock_receipt_id = from.id;
      run.cost_minor = from.cost;
    }
  }
  return receipts;
}
