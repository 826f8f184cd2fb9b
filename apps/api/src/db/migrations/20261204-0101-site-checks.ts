import type { MigrationContext } from '../umzug.js';

/**
 * The shipped list as it stood when this migration was written (the domain's `defaultSiteChecks()`), kept here
 * as a copy so the migration gives the same result whatever the list becomes later.
 */
export const SHIPPED_LIST = [
  [
    'Guide bearing clearance',
    'Opening of the guides across the band, with feeler gauges',
    'length',
    'guide_clearance',
    'blade_change',
    null,
    8,
  ],
  [
    'Band tracking',
    'How far the tooth edge stands off the front of the wheel face',
    'length',
    'tracking',
    'blade_change',
    null,
    8,
  ],
  [
    'Band tension',
    'Stress in the band, read on a band tension meter',
    'stress',
    'band_tension',
    'blade_change',
    null,
    8,
  ],
  [
    'Chip brush',
    'Whether the brush reaches into the gullets, and whether it is worn',
    'condition',
    'chip_brush',
    'blade_change',
    null,
    8,
  ],
  [
    'Head down-force',
    'Spring-balance reading over the last inch of head travel (gravity- or spring-fed heads)',
    'force',
    'feed_pressure',
    'periodic',
    30,
    24,
  ],
  [
    'Guide and pressure bearing wear',
    'Largest gap under a straightedge laid across each bearing face',
    'length',
    'bearing_wear',
    'periodic',
    30,
    24,
  ],
] as const;

/**
 * Each site's own list of maintenance checks, the checks recorded against it, and photos of a check.
 *
 * - `site_checks`: a check on a site's list — what it measures, its quantity, how its target is found (one of the
 *   trade's rules, whose limits are the site's settings, or a fixed target with limits), and when it falls due
 *   (at each blade change, or every `interval_days`), with the grace before it counts as overdue. A retired check
 *   stays with its records; a check with records cannot be deleted (the foreign key from `check_records`).
 * - `check_records`: one reading (SI) or a condition's answers, with the target, limits and basis used and the
 *   verdict worked out on the server, on a saw of the same site and the blade run on it.
 * - Every site existing now gets the shipped list; sites created later get it from the service that creates them.
 *
 * The due and overdue lists are computed in SQL per saw and check (`modules/site-checks/check-status.ts`): the
 * last record of a check on a saw is one index probe on `check_records (saw_id, site_check_id, checked_at DESC)`,
 * the blade on the saw one on `blade_runs_one_open_per_saw`, and a site's active checks one on
 * `site_checks_site_active`.
 */
export async function up({ sequelize }: MigrationContext): Promise<void> {
  await sequelize.query(`
    CREATE TABLE site_checks (
      id uuid PRIMARY KEY DEFAULT gen_random_uuid(),
      site_id uuid NOT NULL REFERENCES sites(id) ON DELETE RESTRICT,
      name text NOT NULL CHECK (length(trim(name)) > 0),
      measures text,
      quantity text NOT NULL CHECK (quantity IN ('length', 'force', 'stress', 'condition')),
      target_rule text NOT NULL CHECK (target_rule IN ('guide_clearance', 'tracking', 'feed_pressure',
        'bearing_wear', 'band_tension', 'chip_brush', 'fixed')),
      -- Fixed targets only, in the quantity's SI unit (mm, N, MPa); rule targets read the site's settings.
      fixed_target double precision,
      fixed_min double precision,
      fixed_max double precision,
      schedule text NOT NULL CHECK (schedule IN ('blade_change', 'periodic')),
      interval_days integer CHECK (interval_days BETWEEN 1 AND 3650),
      grace_hours double precision NOT NULL CHECK (grace_hours >= 0 AND grace_hours <= 720),
      position integer NOT NULL DEFAULT 0 CHECK (position >= 0),
      retired_at timestamptz,
      updated_by_id uuid REFERENCES users(id) ON DELETE RESTRICT,
      created_at timestamptz NOT NULL DEFAULT now(),
      updated_at timestamptz NOT NULL DEFAULT now(),
      CONSTRAINT site_checks_id_site UNIQUE (id, site_id),
      CONSTRAINT site_checks_interval CHECK ((schedule = 'periodic') = (interval_days IS NOT NULL)),
      CONSTRAINT site_checks_fixed CHECK (CASE WHEN target_rule = 'fixed'
        THEN quantity <> 'condition' AND fixed_target IS NOT NULL AND num_nonnulls(fixed_min, fixed_max) > 0
             AND (fixed_min IS NULL OR fixed_min <= fixed_target) AND (fixed_max IS NULL OR fixed_target <= fixed_max)
        ELSE num_nonnulls(fixed_target, fixed_min, fixed_max) = 0 END)
    );
    -- One active check of a name per site; a retired one may share it.
    CREATE UNIQUE INDEX site_checks_site_name ON site_checks (site_id, lower(name)) WHERE retired_at IS NULL;
    CREATE INDEX site_checks_site_active ON site_checks (site_id, position) WHERE retired_at IS NULL;

    CREATE TABLE check_records (
      id uuid PRIMARY KEY DEFAULT gen_random_uuid(),
      site_id uuid NOT NULL,
      saw_id uuid NOT NULL,
      site_check_id uuid NOT NULL,
      blade_run_id uuid,
      checked_at timestamptz NOT NULL,
      checked_by_id uuid REFERENCES users(id) ON DELETE RESTRICT,
      -- What the check was when it was recorded: a later change of the list does not rewrite history.
      target_rule text NOT NULL,
      quantity text NOT NULL CHECK (quantity IN ('length', 'force', 'stress', 'condition')),
      reading double precision,
      answers jsonb CHECK (answers IS NULL OR jsonb_typeof(answers) = 'object'),
      target double precision,
      min_value double precision,
      max_value double precision,
      passed boolean NOT NULL,
      basis jsonb,
      explanation text NOT NULL,
      notes text,
      created_at timestamptz NOT NULL DEFAULT now(),
      CONSTRAINT check_records_saw_site FOREIGN KEY (saw_id, site_id) REFERENCES saws(id, site_id),
      -- A check with records is never deleted: retire it instead.
      CONSTRAINT check_records_check_site FOREIGN KEY (site_check_id, site_id) REFERENCES site_checks(id, site_id)
        ON DELETE RESTRICT,
      CONSTRAINT check_records_run_saw FOREIGN KEY (blade_run_id, saw_id) REFERENCES blade_runs(id, saw_id)
        ON DELETE SET NULL (blade_run_id),
      CONSTRAINT check_records_reading CHECK (CASE WHEN quantity = 'condition'
        THEN answers IS NOT NULL AND reading IS NULL ELSE reading IS NOT NULL AND answers IS NULL END),
      CONSTRAINT check_records_id_site UNIQUE (id, site_id)
    );
    -- The last record of a check on a saw, for the due rule: one probe, read from the index alone.
    CREATE INDEX check_records_saw_check_checked ON check_records (saw_id, site_check_id, checked_at DESC, id DESC)
      INCLUDE (passed);
    CREATE INDEX check_records_site_checked ON check_records (site_id, checked_at DESC, id);
    -- A saw's timeline, newest first, paged by (checked_at, id).
    CREATE INDEX check_records_saw_checked ON check_records (saw_id, checked_at DESC, id DESC);
    CREATE INDEX check_records_check ON check_records (site_check_id);
    CREATE INDEX check_records_run ON check_records (blade_run_id) WHERE blade_run_id IS NOT NULL;

    ALTER TABLE photos ADD COLUMN check_record_id uuid;
    ALTER TABLE photos ADD CONSTRAINT photos_check_site FOREIGN KEY (check_record_id, site_id)
      REFERENCES check_records(id, site_id) ON DELETE CASCADE;
    ALTER TABLE photos DROP CONSTRAINT photos_one_parent;
    ALTER TABLE photos ADD CONSTRAINT photos_one_parent CHECK (num_nonnulls(blade_run_id, check_record_id) = 1);
    CREATE INDEX photos_check ON photos (check_record_id, created_at) WHERE check_record_id IS NOT NULL;
  `);

  // Every site existing now starts from the shipped list.
  for (const [
    position,
    [name, measures, quantity, targetRule, schedule, intervalDays, graceHours],
  ] of SHIPPED_LIST.entries()) {
    await sequelize.query(
      `INSERT INTO site_checks (site_id, name, measures, quantity, target_rule, schedule, interval_days, grace_hours,
                                position)
       SELECT id, :name, :measures, :quantity, :targetRule, :schedule, :intervalDays, :graceHours, :position
         FROM sites`,
      { replacements: { name, measures, quantity, targetRule, schedule, intervalDays, graceHours, position } },
    );
  }
}

export async function down({ sequelize }: MigrationContext): Promise<void> {
  await sequelize.query(`
    DELETE FROM photos WHERE check_record_id IS NOT NULL;
    ALTER TABLE photos DROP CONSTRAINT photos_one_parent;
    ALTER TABLE photos ADD CONSTRAINT photos_one_parent CHECK (num_nonnulls(blade_run_id) = 1);
    ALTER TABLE photos DROP COLUMN check_record_id;
    DROP TABLE check_records, site_checks;
  `);
}
