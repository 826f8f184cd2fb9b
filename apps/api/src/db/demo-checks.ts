import { QueryTypes, type Sequelize, type Transaction } from 'sequelize';
import type { BladeMaterial, HeadFeed } from '@kerfline/domain/checks/schema';
import type { UnitSystem } from '@kerfline/domain/sites/schema';
import type { EffectiveSettings } from '@kerfline/domain/settings/effective';
import { effectiveSetting, settingValue } from '@kerfline/domain/settings/effective';
import { judgeCheckReading, type CheckBlade, type TargetedCheck } from '@kerfline/domain/site-checks/evaluate';
import type { CheckScheduleName, CheckTargetRule } from '@kerfline/domain/site-checks/schema';
import type { FigureBasis } from '@kerfline/domain/figures/basis';
import { lbfToN, psiToPa } from '@kerfline/domain/units/units';
import { siteEffectiveSettings } from '../modules/records/record-support.js';
import { DEMO_REFERENCE_DATE, EATERS, POOR_BREAK_IN_SITE, generator } from './demo-history.js';

/*
 * Two years of invented maintenance checks for the demo saws, from the seeded generator against the fixed
 * reference date, so every load is the same. Most checks are done on time and pass. Riverbend (the site that
 * skips break-in) is also late with its checks and skips some; the saws that eat blades show a few guide
 * openings set tighter than the band; the over-tensioned saw's tension checks fail. At the reference date a few
 * checks are due (blades put on in the last hours) and a few overdue (Riverbend's). Every target and verdict is
 * worked out by the domain, as the API does when a check is recorded.
 */

const DAY = 86_400_000;
const HOUR = 3_600_000;
const HISTORY_DAYS = 730;

const psiInMPa = (psi: number) => psiToPa(psi) / 1e6;

/**
 * Hammerfield keeps one check of its own: the feed cylinder's pressure, on a fixed target its admin typed in psi
 * (invented: 500 psi, 450–550 passes).
 */
const OWN_CHECK = {
  site: 'CV-HAM',
  by: 'ines.carvalho@corvane.example',
  name: 'Feed cylinder pressure',
  measures: 'Gauge on the feed valve, head lowering through air',
  fixedTarget: psiInMPa(500),
  fixedMin: psiInMPa(450),
  fixedMax: psiInMPa(550),
  intervalDays: 14,
};

type SawRow = {
  id: string;
  site_id: string;
  asset_tag: string;
  site_code: string;
  unit_system: UnitSystem;
  head_feed: HeadFeed;
  band_thickness_mm: number;
  band_width_mm: number;
  retired_at: Date | null;
};
type RunRow = {
  id: string;
  saw_id: string;
  installed_at: Date;
  removed_at: Date | null;
  tension_mpa: number | null;
  thickness_mm: number;
  width_mm: number;
  material: BladeMaterial;
};
type CheckRow = TargetedCheck & {
  id: string;
  site_id: string;
  name: string;
  schedule: CheckScheduleName;
  interval_days: number | null;
  grace_hours: number;
  updated_at: Date;
  updated_by_name: string | null;
};

async function insertAll(sequelize: Sequelize, transaction: Transaction, rows: Record<string, unknown>[]) {
  for (let i = 0; i < rows.length; i += 1000)
    await sequelize.getQueryInterface().bulkInsert('check_records', rows.slice(i, i + 1000), { transaction });
}

/**
 * Loads the demo's checks inside the scenario's transaction, after its history: every site already has the
 * shipped list (given when it was made); saws and lists count from before the history starts.
 */
export async function loadDemoChecks(sequelize: Sequelize, transaction: Transaction): Promise<void> {
  const q = <T extends object>(sql: string, replacements: Record<string, unknown> = {}) =>
    sequelize.query<T>(sql, { replacements, type: QueryTypes.SELECT, transaction });
  const end = DEMO_REFERENCE_DATE.getTime();
  const start = end - HISTORY_DAYS * DAY;
  const since = new Date(start - 7 * DAY);
  await sequelize.query(
    `UPDATE saws SET created_at = :since; UPDATE site_checks SET created_at = :since, updated_at = :since`,
    {
      replacements: { since },
      transaction,
    },
  );
  const [owner] = await q<{ id: string; site_id: string }>(`SELECT id, site_id FROM users WHERE email = :email`, {
    email: OWN_CHECK.by,
  });
  await sequelize.query(
    `INSERT INTO site_checks (site_id, name, measures, quantity, target_rule, fixed_target, fixed_min, fixed_max, schedule,
                              interval_days, grace_hours, position, updated_by_id, created_at, updated_at)
     VALUES (:siteId, :name, :measures, 'stress', 'fixed', :fixedTarget, :fixedMin, :fixedMax, 'periodic', :intervalDays,
             24, 6, :by, :since, :since)`,
    { replacements: { ...OWN_CHECK, siteId: owner!.site_id, by: owner!.id, since }, transaction },
  );

  const saws = await q<SawRow>(
    `SELECT s.id, s.site_id, s.asset_tag, t.code AS site_code, t.unit_system, s.head_feed, s.band_thickness_mm,
            s.band_width_mm, s.retired_at
       FROM saws s JOIN sites t ON t.id = s.site_id ORDER BY s.asset_tag`,
  );
  const runs = await q<RunRow>(
    `SELECT r.id, r.saw_id, r.installed_at, r.removed_at, r.tension_mpa, b.thickness_mm, b.width_mm, b.material
       FROM blade_runs r JOIN blade_specs b ON b.id = r.blade_spec_id ORDER BY r.saw_id, r.installed_at`,
  );
  const checks = await q<CheckRow>(
    `SELECT c.id, c.site_id, c.name, c.target_rule AS "targetRule", c.quantity, c.fixed_target AS "fixedTarget",
            c.fixed_min AS "fixedMin", c.fixed_max AS "fixedMax", c.schedule, c.interval_days, c.grace_hours,
            c.updated_at, u.name AS updated_by_name
       FROM site_checks c LEFT JOIN users u ON u.id = c.updated_by_id WHERE c.retired_at IS NULL ORDER BY c.position`,
  );
  const people = await q<{ id: string; site_id: string }>(
    `SELECT id, site_id FROM users WHERE site_id IS NOT NULL AND role IN ('technician', 'site_admin') ORDER BY email`,
  );
  // A site's own settings apply from the day they were changed; before that, Kerfline's shipped values.
  const settingsOf = new Map<string, { settings: EffectiveSettings; from: Map<string, number> }>();
  for (const siteId of new Set(saws.map((s) => s.site_id))) {
    const settings = await siteEffectiveSettings(siteId, transaction);
    settingsOf.set(siteId, {
      settings,
      from: new Map(Object.values(settings).map((s) => [s.key, new Date(s.changedAt!).getTime()])),
    });
  }
  const settingsAt = (siteId: string, at: number): EffectiveSettings => {
    const own = settingsOf.get(siteId)!;
    return Object.fromEntries(Object.entries(own.settings).filter(([key]) => (own.from.get(key) ?? Infinity) <= at));
  };

  const rows: Record<string, unknown>[] = [];
  for (const saw of saws) {
    const r = generator(`checks ${saw.asset_tag}`);
    const staff = people.filter((p) => p.site_id === saw.site_id).map((p) => p.id);
    const who = () => (staff.length > 0 ? staff[Math.floor(r.next() * staff.length)]! : null);
    const poor = saw.site_code === POOR_BREAK_IN_SITE;
    const eater = EATERS[saw.asset_tag];
    const sawEnd = saw.retired_at ? saw.retired_at.getTime() - DAY : end;
    const sawRuns = runs.filter((x) => x.saw_id === saw.id);
    const siteChecks = checks.filter((c) => c.site_id === saw.site_id);
    const bladeAt = (at: number) =>
      sawRuns.find((x) => x.installed_at.getTime() <= at && (x.removed_at === null || x.removed_at.getTime() > at)) ??
      null;

    const record = (check: CheckRow, at: number, run: RunRow | null, reading: number | null, answers?: object) => {
      if (at >= Math.min(sawEnd, end)) return;
      const settings = settingsAt(saw.site_id, at);
      const blade: CheckBlade | null = run
        ? { thicknessMm: run.thickness_mm, widthMm: run.width_mm, material: run.material }
        : null;
      const fixedBasis: FigureBasis = {
        kind: 'site_setting',
        settingKey: `site_check.${check.id}`,
        changedByName: check.updated_by_name,
        changedAt: check.updated_at.toISOString(),
        note: 'Set on your site’s list of checks',
      };
      const judged = judgeCheckReading(
        check,
        { bandThicknessMm: saw.band_thickness_mm, bandWidthMm: saw.band_width_mm, headFeed: saw.head_feed },
        blade,
        { reading, answers: (answers ?? null) as never },
        { system: saw.unit_system, settings, fixedBasis },
      );
      if (!judged.ok) return;
      rows.push({
        id: r.uuid(),
        site_id: saw.site_id,
        saw_id: saw.id,
        site_check_id: check.id,
        blade_run_id: run?.id ?? null,
        checked_at: new Date(at),
        checked_by_id: who(),
        target_rule: check.targetRule,
        quantity: check.quantity,
        reading: check.quantity === 'condition' ? null : reading,
        answers: answers ? JSON.stringify(answers) : null,
        target: judged.result.target,
        min_value: judged.result.min,
        max_value: judged.result.max,
        passed: judged.result.passed,
        basis: judged.result.basis ? JSON.stringify(judged.result.basis) : null,
        explanation: judged.result.explanation,
        notes: null,
        created_at: new Date(at),
      });
    };

    // At each blade change: mostly within the shift; Riverbend late (or not at all) much more often.
    for (const run of sawRuns) {
      const on = run.installed_at.getTime();
      const off = Math.min(run.removed_at?.getTime() ?? end, sawEnd);
      const settings = settingsAt(saw.site_id, on);
      for (const check of siteChecks.filter((c) => c.schedule === 'blade_change')) {
        if (r.chance(poor ? 0.12 : 0.02)) continue;
        const late = r.chance(poor ? 0.35 : 0.03);
        const at = on + (late ? r.between(9, 60) : r.between(0.2, 6)) * HOUR;
        if (at >= off) continue;
        const reading = bladeChangeReading(check.targetRule, run, settings, r, eater);
        if (check.targetRule === 'chip_brush')
          record(check, at, run, null, { reachesGullets: !r.chance(0.03), worn: r.chance(0.04) });
        else record(check, at, run, reading);
      }
    }

    // Every so many days: on time (a little early) at most sites, well late at Riverbend.
    for (const check of siteChecks.filter((c) => c.schedule === 'periodic')) {
      if (check.targetRule === 'feed_pressure' && saw.head_feed === 'hydraulic') continue;
      const interval = (check.interval_days ?? 30) * DAY;
      for (let at = start + r.between(0, 1) * interval; at < Math.min(sawEnd, end);) {
        const reading =
          check.targetRule === 'bearing_wear'
            ? r.chance(0.06)
              ? r.between(0.03, 0.07)
              : r.between(0, 0.02)
            : check.targetRule === 'feed_pressure'
              ? lbfToN(r.chance(0.05) ? r.between(8.5, 11) : r.between(3, 7.5))
              : // The site's own fixed check: around its target, now and then off.
                (check.fixedTarget ?? 0) + psiInMPa(r.chance(0.05) ? 70 : r.between(-40, 40));
        record(check, at, bladeAt(at), reading);
        at += interval * (poor ? r.between(1.05, 1.7) : r.between(0.85, 1.0));
      }
    }
  }
  await insertAll(sequelize, transaction, rows);
}

/** A reading at a blade change: near the target for the band, with the demo's faults where the story has them. */
function bladeChangeReading(
  rule: CheckTargetRule,
  run: RunRow,
  settings: EffectiveSettings,
  r: ReturnType<typeof generator>,
  eater: string | undefined,
): number {
  if (rule === 'guide_clearance') {
    const guide = effectiveSetting(settings, 'guide_clearance');
    const target = run.thickness_mm + settingValue(guide, 'extraClearanceMm');
    // The blade eaters' guides are now and then set tighter than the band itself.
    if (eater && r.chance(0.18)) return run.thickness_mm - r.between(0.005, 0.03);
    if (r.chance(0.03)) return target + settingValue(guide, 'toleranceMm') + r.between(0.005, 0.03);
    return target + r.between(0, 0.9) * settingValue(guide, 'toleranceMm');
  }
  if (rule === 'tracking') {
    const tracking = effectiveSetting(settings, 'tracking');
    const scaled = Math.min(
      settingValue(tracking, 'maxOverhangMm'),
      Math.max(settingValue(tracking, 'minOverhangMm'), run.width_mm / 8),
    );
    const tolerance = settingValue(tracking, 'toleranceMm');
    return scaled + (r.chance(0.03) ? tolerance * r.between(1.2, 2) : tolerance * r.between(-0.9, 0.9));
  }
  // Band tension: the meter reads about what was set on the run.
  return Math.max(10, (run.tension_mpa ?? 200) + r.between(-4, 4));
}
