/**
 * The large customer's fleet for the benchmarks, generated from a seed: 6 regions, 60 sites, 1 500 saws and five
 * years of history — about 750 000 blade runs, 1 000 000 stops, 300 000 recorded checks, and cut logs at the
 * sites that keep them — plus one person of each role with a known password. Every benchmark builds its data
 * here (`npm run bench:seed`, `bench-records.ts`, `bench-checks.ts`, `npm run bench`).
 *
 * Determinism: the data is written by set-based SQL on one connection after `setseed`, and every id is made from
 * the MD5 of a stable key (`pg_temp.bench_id`), so two builds of the same seed give the same rows and ids (only `created_at` differs). The history
 * ends at the build's `now()`, so "last 30 days" and "overdue" mean the same on any day the fleet is built.
 *
 * The shape of the fleet (invented, tuned to look like a real operation; the figures are the demo's own):
 * - three saw classes (mid-size horizontal bar saws, large horizontal saws, vertical saws) with their own blades;
 * - a blade lasts about 3–4 days of production and cuts 2–6 m² (our invented demo range), removed mostly worn out;
 *   one whose break-in was skipped (15 %, 60 % at poor sites and saws) cuts a fifth less;
 * - stops are short and mostly blade changes, shortages and planned maintenance, a few long breakdowns;
 * - three sites are poor (shorter blade life, dearer blades, more breakdowns, checks failed and overdue) and one
 *   saw in fifty is poor (blades broken or stripped early, frequent unplanned stops), so outliers exist;
 * - one site in five keeps cut logs (two per blade), and its runs' areas come from them;
 * - checks on a calendar are recorded about every three weeks a saw, so most fall due before they are done; the
 *   checks due at a blade change have been recorded in the last year only, at a third of the changes (a seventh at
 *   poor sites), each set within hours of the new blade going on, and one set in twenty (three in ten at poor
 *   sites) after the 8 h grace;
 * - a few saws are down now (an open stop) and every saw has a blade on;
 * - every site has a budget for each of the last 24 months, near the same month's spend a year before.
 */
import pg from 'pg';
import type { Sequelize } from 'sequelize';
import { performance } from 'node:perf_hooks';
import { createHash } from 'node:crypto';
import { seedSiteChecks } from '../modules/site-checks/seed-site-checks.js';
import { hashPassword } from '../security/passwords.js';
import { createMigrator } from './umzug.js';

/** The benchmark's sign-ins: one of each role; every password is BENCH_PASSWORD. */
export const BENCH_PASSWORD = 'fleet-bench-2026';
export const BENCH_USERS = {
  admin: 'ada.quarrel@bench.example',
  manager: 'mira.stelling@bench.example',
  regionalLead: 'owen.farrady@bench.example',
  siteAdmin: 'lena.brisk@bench.example',
  technician: 'rafe.tolley@bench.example',
} as const;

export type BenchFleetCounts = {
  sites: number;
  saws: number;
  bladeRuns: number;
  stops: number;
  checkRecords: number;
  cutLogs: number;
  seconds: number;
};

/** Sites whose blades die early (1-based site numbers) and the rule for poor saws (saw number modulo 50). */
export const POOR_SITES = [7, 23, 41];
const REGIONS = ['Northmarch', 'Estuary', 'Highfold', 'Saltplain', 'Copperline', 'Westreach'];
const TOWN_HEADS = ['Vard', 'Quel', 'Brin', 'Tass', 'Orm', 'Skel', 'Prae', 'Lum', 'Zeth', 'Corv'];
const TOWN_TAILS = ['mere', 'gate', 'hollow', 'rigg', 'ness', 'field'];

/** Tables the history goes into: their plain indexes are dropped for the load and built again afterwards. */
const HISTORY_TABLES = ['blade_runs', 'stops', 'check_records', 'cut_logs'];

const sql = String.raw;
const textArray = (client: pg.Client, values: string[]) =>
  `ARRAY[${values.map((v) => client.escapeLiteral(v)).join(', ')}]::text[]`;

/** The id of site n (1–60) of the benchmark fleet: every id is an MD5 of a stable key. */
export const siteId = (n: number) => uuidOfMd5(`site-${n}`);
function uuidOfMd5(key: string): string {
  const m = createHash('md5').update(key).digest('hex');
  const h = `${m.slice(0, 12)}4${m.slice(13, 16)}8${m.slice(17)}`;
  return `${h.slice(0, 8)}-${h.slice(8, 12)}-${h.slice(12, 16)}-${h.slice(16, 20)}-${h.slice(20)}`;
}

/**
 * Drops and rebuilds the schema of the database `url` points at (which must end in `_bench`), applies the
 * migrations and writes the fleet. `seed` in [-1, 1].
 */
export async function buildBenchFleet(
  sequelize: Sequelize,
  url: string,
  options: { seed?: number; log?: (line: string) => void } = {},
): Promise<BenchFleetCounts> {
  const log = options.log ?? (() => undefined);
  const database = new URL(url).pathname.slice(1);
  if (!/_bench$/.test(decodeURIComponent(database)))
    throw new Error(`The benchmark fleet goes only into a database whose name ends in _bench (got ${database})`);
  const t0 = performance.now();
  await sequelize.query('DROP SCHEMA public CASCADE; CREATE SCHEMA public;');
  await createMigrator(sequelize).up();
  const passwordHash = await hashPassword(BENCH_PASSWORD);

  const client = new pg.Client({ connectionString: url });
  await client.connect();
  const hash = client.escapeLiteral(passwordHash);
  const step = async (label: string, text: string) => {
    const t = performance.now();
    await client.query(text);
    log(`  ${label.padEnd(44)} ${((performance.now() - t) / 1000).toFixed(1).padStart(6)} s`);
  };
  try {
    await client.query(`SET synchronous_commit = off; SET maintenance_work_mem = '256MB'; SET work_mem = '64MB'`);
    await client.query('SELECT setseed($1)', [options.seed ?? 0.2026]);
    // A version-4-shaped UUID from the MD5 of a stable key (the API accepts only well-formed UUIDs).
    await client.query(`CREATE FUNCTION pg_temp.bench_id(key text) RETURNS uuid LANGUAGE sql IMMUTABLE
                          AS $$ SELECT overlay(overlay(md5(key) PLACING '4' FROM 13) PLACING '8' FROM 17)::uuid $$`);

    // Plain indexes (not those behind a constraint) are built once after the load instead of row by row.
    const { rows: plainIndexes } = await client.query<{ name: string; def: string }>(
      `SELECT i.indexrelid::regclass::text AS name, pg_get_indexdef(i.indexrelid) AS def
         FROM pg_index i
        WHERE i.indrelid = ANY ($1::regclass[]) AND NOT i.indisprimary
          AND NOT EXISTS (SELECT 1 FROM pg_constraint c WHERE c.conindid = i.indexrelid)`,
      [HISTORY_TABLES],
    );
    for (const index of plainIndexes) await client.query(`DROP INDEX ${index.name}`);
    // The monthly summary and each blade's first checks are built once after the load (rollup_rebuild,
    // blade_check_firsts_rebuild) rather than statement by statement.
    await client.query(
      `ALTER TABLE blade_runs DISABLE TRIGGER USER; ALTER TABLE stops DISABLE TRIGGER USER;
       ALTER TABLE check_records DISABLE TRIGGER USER`,
    );

    const sites = TOWN_HEADS.flatMap((head) => TOWN_TAILS.map((tail) => `${head}${tail}`));
    await step(
      'regions, sites, saws, blade specs, people',
      sql`
      INSERT INTO regions (id, name)
        SELECT pg_temp.bench_id('region-' || n), r FROM unnest(${textArray(client, REGIONS)}) WITH ORDINALITY AS x(r, n);
      INSERT INTO sites (id, region_id, code, name, city, time_zone, currency, unit_system, created_at)
        SELECT pg_temp.bench_id('site-' || n), pg_temp.bench_id('region-' || (1 + (n - 1) % 6)), 'F' || lpad(n::text, 2, '0'),
               town || CASE WHEN n % 3 = 0 THEN ' Bar Works' WHEN n % 3 = 1 THEN ' Service Centre' ELSE ' Fabrication' END,
               town, (ARRAY['Europe/Amsterdam', 'Europe/Berlin', 'Europe/London', 'America/Chicago', 'Europe/Paris',
                             'America/Toronto'])[1 + (n - 1) % 6],
               'EUR', CASE WHEN (n - 1) % 6 IN (3, 5) THEN 'imperial' ELSE 'metric' END, now() - interval '1830 days'
          FROM unnest(${textArray(client, sites)}) WITH ORDINALITY AS x(town, n);
      `,
    );
    await client.query(sql`
      -- Saw n of a site: classes by n (0–5 mid-size horizontal, 6–8 large horizontal, 9 vertical, by n mod 10).
      CREATE TEMP TABLE bench_saw AS
        SELECT pg_temp.bench_id('saw-' || s.n || '-' || g) AS id, pg_temp.bench_id('site-' || s.n) AS site_id, s.n AS site_no, g AS saw_no,
               (s.n - 1) * 25 + g AS fleet_no,
               CASE WHEN g % 10 < 6 THEN 'mid' WHEN g % 10 < 9 THEN 'large' ELSE 'vertical' END AS class,
               s.n IN (${POOR_SITES.join(', ')}) AS poor_site, ((s.n - 1) * 25 + g) % 50 = 17 AS poor_saw,
               s.n % 5 = 0 AS keeps_cut_logs
          FROM generate_series(1, 60) s(n) CROSS JOIN generate_series(1, 25) g;
      INSERT INTO saws (id, site_id, asset_tag, name, kind, make, model, head_feed, wheel_diameter_mm, centre_distance_mm,
                        band_width_mm, band_thickness_mm, band_length_mm, band_speed_min_m_per_min,
                        band_speed_max_m_per_min, capacity_round_mm, created_at)
        SELECT id, site_id, 'BS-' || lpad(saw_no::text, 2, '0'),
               CASE class WHEN 'mid' THEN 'Bar line ' WHEN 'large' THEN 'Billet saw ' ELSE 'Contour saw ' END || saw_no,
               CASE WHEN class = 'vertical' THEN 'vertical' ELSE 'horizontal' END,
               (ARRAY['Orrinvale', 'Brakkelund', 'Tavishorn'])[1 + fleet_no % 3],
               CASE class WHEN 'mid' THEN 'Longreach' WHEN 'large' THEN 'Bardstone' ELSE 'Quillmark' END,
               CASE WHEN class = 'mid' AND saw_no % 3 = 0 THEN 'gravity_spring' ELSE 'hydraulic' END,
               CASE class WHEN 'mid' THEN 455 WHEN 'large' THEN 560 ELSE 400 END,
               CASE class WHEN 'mid' THEN 1343 WHEN 'large' THEN 1665 ELSE 1200 END,
               CASE class WHEN 'mid' THEN 34 WHEN 'large' THEN 41 ELSE 27 END,
               CASE class WHEN 'mid' THEN 1.1 WHEN 'large' THEN 1.3 ELSE 0.9 END,
               CASE class WHEN 'mid' THEN 4115 WHEN 'large' THEN 5090 ELSE 3660 END,
               CASE class WHEN 'vertical' THEN 20 ELSE 18 END,
               CASE class WHEN 'mid' THEN 110 WHEN 'large' THEN 90 ELSE 120 END,
               CASE class WHEN 'mid' THEN 330 WHEN 'large' THEN 510 ELSE 250 END,
               now() - interval '1830 days'
          FROM bench_saw;
      -- Fleet-wide blades: two a class (a coarser and a finer pitch).
      CREATE TEMP TABLE bench_spec AS
        SELECT pg_temp.bench_id('spec-' || class || '-' || k) AS id, class, k, w, t, l, coarse, fine, cost
          FROM (VALUES ('mid', 1, 34, 1.1, 4115, 3, 4, 6200), ('mid', 2, 34, 1.1, 4115, 5, 8, 5900),
                       ('large', 1, 41, 1.3, 5090, 2, 3, 9400), ('large', 2, 41, 1.3, 5090, 3, 4, 9100),
                       ('vertical', 1, 27, 0.9, 3660, 6, 10, 4300), ('vertical', 2, 27, 0.9, 3660, 10, 14, 4500))
               AS v(class, k, w, t, l, coarse, fine, cost);
      INSERT INTO blade_specs (id, name, width_mm, thickness_mm, length_mm, coarse_tpi, fine_tpi, tooth_form,
                               tooth_set, material, unit_cost_minor, currency, supplier)
        SELECT id, w || ' x ' || t || ' x ' || l || ' bi-metal ' || coarse || '/' || fine, w, t, l, coarse, fine,
               CASE WHEN coarse < 4 THEN 'hook' ELSE 'regular' END, CASE WHEN coarse < 4 THEN 'raker' ELSE 'wavy' END,
               'bimetal', cost, 'EUR', 'Halden Strip Supply'
          FROM bench_spec;
      INSERT INTO users (id, email, name, role, password_hash, site_id, region_id, all_sites)
        VALUES (pg_temp.bench_id('user-admin'), '${BENCH_USERS.admin}', 'Ada Quarrel', 'admin', ${hash}, NULL, NULL, false),
               (pg_temp.bench_id('user-manager'), '${BENCH_USERS.manager}', 'Mira Stelling', 'manager', ${hash}, NULL, NULL, true),
               (pg_temp.bench_id('user-lead'), '${BENCH_USERS.regionalLead}', 'Owen Farrady', 'regional_lead', ${hash}, NULL,
                pg_temp.bench_id('region-1'), false),
               (pg_temp.bench_id('user-site-admin'), '${BENCH_USERS.siteAdmin}', 'Lena Brisk', 'site_admin', ${hash},
                pg_temp.bench_id('site-1'), NULL, false),
               (pg_temp.bench_id('user-technician'), '${BENCH_USERS.technician}', 'Rafe Tolley', 'technician', ${hash},
                pg_temp.bench_id('site-1'), NULL, false);
    `);
    // Each site's shipped list of checks, as a new site gets it.
    await sequelize.transaction(async (transaction) => {
      for (let n = 1; n <= 60; n += 1) await seedSiteChecks(siteId(n), transaction);
    });

    // Blade runs: each saw's runs follow each other over five years. A run's share of the time is drawn, then
    // the shares are scaled to fill the five years; the last run is the blade on now.
    await step(
      'blade runs',
      sql`
      CREATE TEMP TABLE bench_run_plan AS
        SELECT w.*, n,
               (1 + (n % 2))::int AS spec_k,
               (0.55 + random() * 0.9) * CASE WHEN w.poor_saw THEN 0.6 ELSE 1 END AS share,
               random() AS roll, random() AS roll2
          FROM (SELECT *, ((420 + (hashtext('runs' || fleet_no) & 127) * 100 / 127)
                         * CASE WHEN poor_saw THEN 2.2 WHEN poor_site THEN 1.6 ELSE 1 END)::int AS runs
                  FROM bench_saw) w
          CROSS JOIN LATERAL generate_series(0, w.runs - 1) n;
      INSERT INTO blade_runs (id, site_id, saw_id, blade_spec_id, installed_at, installed_by_id, tension_mpa,
                              material_group, break_in_followed, cost_minor, currency, removed_at, removal_reason,
                              area_cut_mm2, cuts, area_source)
        SELECT pg_temp.bench_id('run-' || fleet_no || '-' || n), site_id, id, pg_temp.bench_id('spec-' || class || '-' || spec_k),
               installed_at, CASE WHEN site_no = 1 THEN pg_temp.bench_id('user-technician') END,
               CASE WHEN roll2 < 0.7 THEN round((200 + roll2 * 80)::numeric, 0) END,
               (ARRAY['carbon_steel', 'carbon_steel', 'carbon_steel', 'alloy_steel', 'alloy_steel', 'stainless_steel',
                      'tool_steel', 'aluminium', 'cast_iron', 'copper_alloy'])[1 + (site_no + n) % 10],
               followed,
               round((SELECT cost FROM bench_spec p WHERE p.class = x.class AND p.k = x.spec_k)
                 * CASE WHEN poor_site THEN 1.25 ELSE 1 END)::int,
               'EUR', removed_at,
               CASE WHEN removed_at IS NULL THEN NULL
                    WHEN poor_saw THEN (ARRAY['broken', 'tooth_strippage', 'fatigue_crack', 'broken', 'crooked_cutting',
                                              'worn_out'])[1 + floor(roll * 6)::int]
                    WHEN roll < 0.62 THEN 'worn_out' WHEN roll < 0.74 THEN 'tooth_strippage'
                    WHEN roll < 0.82 THEN 'fatigue_crack' WHEN roll < (CASE WHEN poor_site THEN 0.95 ELSE 0.89 END) THEN 'broken'
                    WHEN roll < 0.96 THEN 'crooked_cutting' ELSE 'other' END,
               CASE WHEN removed_at IS NOT NULL AND NOT keeps_cut_logs
                    THEN round((2.0e6 + roll2 * 4.0e6) * share * CASE WHEN poor_saw THEN 0.45 WHEN poor_site THEN 0.6 ELSE 1 END
                         * CASE WHEN followed THEN 1 ELSE 0.8 END) END,
               CASE WHEN removed_at IS NOT NULL AND NOT keeps_cut_logs
                    THEN round((2.0e6 + roll2 * 4.0e6) * share / 6500 * CASE WHEN poor_saw THEN 0.45 WHEN poor_site THEN 0.6 ELSE 1 END
                         * CASE WHEN followed THEN 1 ELSE 0.8 END) END,
               CASE WHEN removed_at IS NOT NULL AND NOT keeps_cut_logs THEN 'entered' END
          FROM (SELECT p.*,
                       -- Break-in followed or not, from digits of roll that neither the reason nor the area uses;
                       -- a blade whose break-in was skipped cuts a fifth less (common practice, no source).
                       (p.roll * 9973 - floor(p.roll * 9973)) < CASE WHEN p.poor_saw OR p.poor_site THEN 0.4 ELSE 0.85 END
                         AS followed,
                       now() - interval '1826 days' + (sum(share) OVER w - share) / sum(share) OVER s * interval '1825 days'
                         AS installed_at,
                       CASE WHEN n < runs - 1 THEN now() - interval '1826 days'
                         + (sum(share) OVER w - 0.03 * share) / sum(share) OVER s * interval '1825 days' END AS removed_at
                  FROM bench_run_plan p
                WINDOW w AS (PARTITION BY fleet_no ORDER BY n), s AS (PARTITION BY fleet_no)) x;
      `,
    );

    // Stops: one in each of a saw's equal slots of the five years, never overlapping; a few saws down now.
    await step(
      'stops',
      sql`
      INSERT INTO stops (id, site_id, saw_id, started_at, ended_at, category, planned, notes)
        SELECT pg_temp.bench_id('stop-' || fleet_no || '-' || n), site_id, id, started_at,
               CASE WHEN n = stops - 1 AND fleet_no % 97 = 5 THEN NULL
                    ELSE started_at + least(slot * 0.45, minutes * interval '1 minute') END,
               category, category = 'planned_maintenance',
               CASE WHEN category = 'mechanical' AND roll < 0.01 THEN 'head feed cylinder reseal' END
          FROM (SELECT w.*, n, slot, roll,
                       now() - interval '1826 days' + n * slot + roll * slot * 0.5 AS started_at,
                       CASE WHEN roll < 0.30 THEN 'blade_change'
                            WHEN roll < (CASE WHEN poor_saw THEN 0.55 ELSE 0.36 END) THEN 'blade_failure'
                            WHEN roll < (CASE WHEN poor_saw OR poor_site THEN 0.72 ELSE 0.50 END) THEN 'mechanical'
                            WHEN roll < 0.60 THEN 'hydraulic' WHEN roll < 0.67 THEN 'electrical'
                            WHEN roll < 0.85 THEN 'no_material_operator' WHEN roll < 0.97 THEN 'planned_maintenance'
                            ELSE 'other' END AS category,
                       -- Mostly 10–40 minutes; one in twenty a breakdown of hours (longer at poor saws and sites).
                       CASE WHEN roll2 < (CASE WHEN poor_saw OR poor_site THEN 0.12 ELSE 0.05 END)
                            THEN 120 + roll2 * 8000 ELSE 10 + roll2 * 30 END AS minutes
                  FROM (SELECT *, ((600 + (hashtext('stops' || fleet_no) & 127) * 110 / 127)
                                 * CASE WHEN poor_saw THEN 1.8 WHEN poor_site THEN 1.4 ELSE 1 END)::int AS stops
                          FROM bench_saw) w
                  CROSS JOIN LATERAL (SELECT interval '1825 days' / w.stops AS slot) sl
                  CROSS JOIN LATERAL generate_series(0, w.stops - 1) n
                  CROSS JOIN LATERAL (SELECT random() AS roll, random() AS roll2 OFFSET 0 * n) r) x;
      `,
    );

    // Cut logs at the sites that keep them: two round-bar cuts a finished run; the run's area comes from them.
    await step(
      'cut logs',
      sql`
      INSERT INTO cut_logs (id, site_id, saw_id, blade_run_id, cut_at, shape, piece_count, pieces_across, material_group,
                            quantity, band_speed_m_per_min, feed_mm_per_min, cut_time_s, area_per_cut_mm2, area_cut_mm2,
                            teeth_in_work_min, teeth_in_work_max)
        SELECT pg_temp.bench_id('cut-' || r.id || '-' || k), r.site_id, r.saw_id, r.id,
               r.installed_at + (r.removed_at - r.installed_at) * (0.25 + 0.5 * (k - 1)),
               jsonb_build_object('kind', 'round_bar', 'diameterMm', d), 1, 1, r.material_group, q,
               60 + (q % 30), 25 + (q % 40), 60 + d, pi() * d * d / 4, pi() * d * d / 4 * q,
               greatest(3, d / 25.4 * 3 * 0.6), d / 25.4 * 3
          FROM blade_runs r
          JOIN bench_saw w ON w.id = r.saw_id AND w.keeps_cut_logs
          CROSS JOIN generate_series(1, 2) k
          CROSS JOIN LATERAL (SELECT (40 + floor(random() * 16) * 10)::int AS d,
                                     ((40 + floor(random() * 120)) * CASE WHEN r.break_in_followed IS FALSE THEN 0.8 ELSE 1 END)::int AS q
                              WHERE r.id IS NOT NULL AND k > 0) c
         WHERE r.removed_at IS NOT NULL;
      UPDATE blade_runs r SET area_cut_mm2 = c.area, cuts = c.cuts, area_source = 'cut_logs'
        FROM (SELECT blade_run_id, sum(area_cut_mm2) AS area, sum(quantity) AS cuts FROM cut_logs GROUP BY 1) c
       WHERE c.blade_run_id = r.id;
      `,
    );

    // A record's reading (or a condition's answers), its target and limit, and whether it passed, from a roll.
    const recordedValues = (passed: string, roll: string) => `
               CASE WHEN c.quantity = 'condition' THEN NULL WHEN ${passed} THEN 1 + ${roll} * 0.4 ELSE 1.6 + ${roll} END,
               CASE WHEN c.quantity = 'condition' THEN jsonb_build_object('reachesGullets', true, 'worn', NOT ${passed}) END,
               CASE WHEN c.quantity = 'condition' THEN NULL ELSE 1.2 END,
               CASE WHEN c.quantity = 'condition' THEN NULL ELSE 1.5 END,
               ${passed}, 'Generated for the benchmark'`;
    // Checks: each site's shipped list plus one of its own, periodic. The periodic ones: 86 records a saw over five
    // years, in turn, one in ten failed (one in three at poor sites, whose last six weeks are missing, so their
    // checks are overdue). The blade-change ones: in the last year, every one of them at a third of the blade
    // changes (a fifth on poor saws, a seventh at poor sites), while the blade is on; the set is late (8 h grace)
    // one time in twenty (three in ten at poor sites).
    await step(
      'checks',
      sql`
      INSERT INTO site_checks (id, site_id, name, quantity, target_rule, fixed_target, fixed_max, schedule,
                               interval_days, grace_hours, position, created_at)
        SELECT pg_temp.bench_id('check-feed-' || n), pg_temp.bench_id('site-' || n), 'Feed cylinder pressure', 'stress', 'fixed',
               4, 4.5, 'periodic', 7, 24, 6, now() - interval '1830 days'
          FROM generate_series(1, 60) n;
      UPDATE site_checks SET created_at = now() - interval '1830 days';
      INSERT INTO check_records (id, site_id, saw_id, site_check_id, checked_at, checked_by_id, target_rule, quantity,
                                 reading, answers, target, max_value, passed, explanation)
        SELECT pg_temp.bench_id('chk-' || w.fleet_no || '-' || n), w.site_id, w.id, c.id,
               now() - interval '1826 days' + n * (CASE WHEN w.poor_site THEN interval '20.7 days' ELSE interval '21.2 days' END)
                 + random() * interval '1 day',
               CASE WHEN w.site_no = 1 THEN pg_temp.bench_id('user-technician') END,
               c.target_rule, c.quantity,
               ${recordedValues('r.passed', 'r.jitter')}
          FROM bench_saw w
          CROSS JOIN generate_series(0, 85) n
          JOIN LATERAL (SELECT id, target_rule, quantity FROM site_checks sc
                         WHERE sc.site_id = w.site_id AND sc.schedule = 'periodic'
                         ORDER BY sc.position OFFSET (n % 3) LIMIT 1) c ON true
          CROSS JOIN LATERAL (SELECT random() > CASE WHEN w.poor_site THEN 0.33 WHEN w.poor_saw THEN 0.25 ELSE 0.1 END
                                       AS passed, random() AS jitter OFFSET 0 * n) r;
      CREATE TEMP TABLE bench_change AS
        SELECT r.id, r.site_id, r.saw_id, r.installed_at, r.removed_at, w.poor_site, w.poor_saw,
               random() AS pick, random() AS lateness
          FROM blade_runs r JOIN bench_saw w ON w.id = r.saw_id
         WHERE r.installed_at >= now() - interval '365 days'
         ORDER BY r.id;
      INSERT INTO check_records (id, site_id, saw_id, site_check_id, checked_at, checked_by_id, target_rule, quantity,
                                 reading, answers, target, max_value, passed, explanation)
        SELECT pg_temp.bench_id('chk-change-' || b.id || '-' || c.position), b.site_id, b.saw_id, c.id,
               -- While the blade is on: within 6 h of its start, or 9–29 h when late (never after it came off, nor now).
               GREATEST(b.installed_at, LEAST(
                 b.installed_at + CASE WHEN b.lateness < CASE WHEN b.poor_site THEN 0.3 ELSE 0.05 END
                                       THEN interval '9 hours' + v.roll * interval '20 hours'
                                       ELSE interval '10 minutes' + v.roll * interval '6 hours' END,
                 coalesce(b.removed_at, 'infinity'::timestamptz) - interval '1 minute', now())),
               NULL, c.target_rule, c.quantity,
               ${recordedValues('v.passed', 'v.roll')}
          FROM bench_change b
          JOIN site_checks c ON c.site_id = b.site_id AND c.schedule = 'blade_change'
          CROSS JOIN LATERAL (SELECT random() AS roll,
                                     random() > CASE WHEN b.poor_site THEN 0.2 ELSE 0.05 END AS passed
                               OFFSET 0 * c.position) v
         WHERE b.pick < CASE WHEN b.poor_site THEN 0.14 WHEN b.poor_saw THEN 0.2 ELSE 0.33 END
         ORDER BY b.id, c.position;
      `,
    );

    // Budgets: every site, each of the last 24 months (the one in progress included), set by the manager at the
    // same month's spend a year before, give or take (a poor site's are tighter, so it goes over more often).
    await step(
      'budgets',
      sql`
      INSERT INTO budgets (id, site_id, month, amount_minor, currency, set_by_id)
        SELECT pg_temp.bench_id('budget-' || s.code || '-' || to_char(m.month, 'YYYY-MM')), s.id, m.month,
               (round(coalesce(sp.spend, 0)
                      * CASE WHEN s.poor THEN 0.8 + random() * 0.25 ELSE 0.9 + random() * 0.3 END / 10000.0) * 10000)::bigint,
               s.currency, pg_temp.bench_id('user-manager')
          FROM (SELECT x.*, EXISTS (SELECT 1 FROM bench_saw w WHERE w.site_id = x.id AND w.poor_site) AS poor FROM sites x) s
          CROSS JOIN (SELECT (date_trunc('month', now() AT TIME ZONE 'UTC') - k * interval '1 month')::date AS month
                        FROM generate_series(0, 23) k) m
          LEFT JOIN (SELECT r.site_id, date_trunc('month', r.installed_at AT TIME ZONE z.time_zone)::date AS month,
                            sum(r.cost_minor) AS spend
                       FROM blade_runs r JOIN sites z ON z.id = r.site_id
                      GROUP BY 1, 2) sp ON sp.site_id = s.id AND sp.month = (m.month - interval '12 months')::date
         ORDER BY s.code, m.month;
      `,
    );

    const t = performance.now();
    for (const index of plainIndexes) await client.query(index.def);
    await client.query(
      `ALTER TABLE blade_runs ENABLE TRIGGER USER; ALTER TABLE stops ENABLE TRIGGER USER;
       ALTER TABLE check_records ENABLE TRIGGER USER`,
    );
    await step('monthly summary (rollup_rebuild)', 'SELECT rollup_rebuild()');
    await step('first checks (blade_check_firsts_rebuild)', 'SELECT blade_check_firsts_rebuild()');
    // VACUUM as autovacuum would have by now on a database five years old: counts read the indexes alone.
    await client.query('VACUUM (ANALYZE)');
    log(`  ${'indexes and statistics'.padEnd(44)} ${((performance.now() - t) / 1000).toFixed(1).padStart(6)} s`);

    const { rows } = await client.query<Record<keyof BenchFleetCounts, number>>(
      `SELECT (SELECT count(*) FROM sites)::int AS sites, (SELECT count(*) FROM saws)::int AS saws,
              (SELECT count(*) FROM blade_runs)::int AS "bladeRuns", (SELECT count(*) FROM stops)::int AS stops,
              (SELECT count(*) FROM check_records)::int AS "checkRecords", (SELECT count(*) FROM cut_logs)::int AS "cutLogs"`,
    );
    return { ...rows[0]!, seconds: (performance.now() - t0) / 1000 };
  } finally {
    await client.end();
  }
}

/** Whether the database already holds a full benchmark fleet (so the benchmarks can skip building it). */
export async function hasBenchFleet(sequelize: Sequelize): Promise<boolean> {
  if (!(await sequelize.getQueryInterface().tableExists('blade_runs'))) return false;
  const [row] = (await sequelize.query(
    `SELECT (SELECT count(*) FROM blade_runs) AS runs, (SELECT count(*) FROM check_records) AS checks,
            (SELECT count(*) FROM users WHERE email = :email) AS people`,
    { type: 'SELECT', replacements: { email: BENCH_USERS.manager } },
  )) as { runs: number; checks: number; people: number }[];
  return Number(row!.runs) >= 700_000 && Number(row!.checks) >= 290_000 && Number(row!.people) === 1;
}

/** Creates the benchmark database `name` on the cluster `adminUrl` points at, when it does not exist yet. */
export async function ensureBenchDatabase(adminUrl: string, name: string): Promise<void> {
  const admin = new pg.Client({ connectionString: adminUrl });
  await admin.connect();
  try {
    const found = await admin.query('SELECT 1 FROM pg_database WHERE datname = $1', [name]);
    if (found.rowCount === 0) await admin.query(`CREATE DATABASE "${name.replace(/"/g, '""')}"`);
  } finally {
    await admin.end();
  }
}
