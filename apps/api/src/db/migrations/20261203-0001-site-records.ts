import type { MigrationContext } from '../umzug.js';

/**
 * The records a site keeps: the blade-spec catalogue, blade stock (receipts and reorder levels), blade runs,
 * stops, cut logs and photos. The database guards the invariants no code path may break:
 * - every record carries its site, and a composite foreign key makes it equal its saw's site, so scoped reads
 *   filter on the row's own column;
 * - at most one open blade run and at most one open stop per saw (partial unique indexes), and neither runs nor
 *   stops of one saw overlap in time (exclusion constraints on tstzrange, with btree_gist for the uuid);
 * - a removal is never before its install, a stop never ends before it starts;
 * - a blade drawn from stock comes from a receipt of the same spec at the same site;
 * - money is integer minor units with its currency beside it.
 * A saw's stored status keeps only in_service or retired: "down" is derived from its open stop. Saws stored as
 * down get an open stop that says so.
 */
export async function up({ sequelize }: MigrationContext): Promise<void> {
  await sequelize.query(`
    CREATE EXTENSION IF NOT EXISTS btree_gist;

    ALTER TABLE saws ADD CONSTRAINT saws_id_site UNIQUE (id, site_id);

    CREATE TABLE blade_specs (
      id uuid PRIMARY KEY DEFAULT gen_random_uuid(),
      site_id uuid REFERENCES sites(id) ON DELETE RESTRICT,
      name text NOT NULL CHECK (length(trim(name)) > 0),
      width_mm double precision NOT NULL CHECK (width_mm > 0 AND width_mm <= 200),
      thickness_mm double precision NOT NULL CHECK (thickness_mm > 0 AND thickness_mm < width_mm),
      length_mm double precision NOT NULL CHECK (length_mm > 0 AND length_mm <= 30000),
      -- Constant pitch: fine_tpi NULL. Variable pitch: coarse < fine (e.g. 4/6 TPI).
      coarse_tpi double precision NOT NULL CHECK (coarse_tpi >= 0.5 AND coarse_tpi <= 32),
      fine_tpi double precision CHECK (fine_tpi > coarse_tpi AND fine_tpi <= 32),
      tooth_form text NOT NULL CHECK (tooth_form IN ('regular', 'hook', 'skip', 'other')),
      tooth_set text NOT NULL CHECK (tooth_set IN ('raker', 'wavy', 'alternate', 'other')),
      material text NOT NULL CHECK (material IN ('carbon', 'bimetal', 'carbide_tipped')),
      unit_cost_minor integer NOT NULL CHECK (unit_cost_minor >= 0),
      currency char(3) NOT NULL CHECK (currency ~ '^[A-Z]{3}$'),
      supplier text,
      archived boolean NOT NULL DEFAULT false,
      created_at timestamptz NOT NULL DEFAULT now(),
      updated_at timestamptz NOT NULL DEFAULT now()
    );
    -- One name per catalogue: the fleet's (site NULL) and each site's own.
    CREATE UNIQUE INDEX blade_specs_name ON blade_specs
      (coalesce(site_id, '00000000-0000-0000-0000-000000000000'::uuid), lower(name));
    CREATE INDEX blade_specs_site ON blade_specs (site_id);

    CREATE TABLE stock_receipts (
      id uuid PRIMARY KEY DEFAULT gen_random_uuid(),
      site_id uuid NOT NULL REFERENCES sites(id) ON DELETE RESTRICT,
      blade_spec_id uuid NOT NULL REFERENCES blade_specs(id) ON DELETE RESTRICT,
      quantity integer NOT NULL CHECK (quantity > 0 AND quantity <= 10000),
      unit_cost_minor integer NOT NULL CHECK (unit_cost_minor >= 0),
      currency char(3) NOT NULL CHECK (currency ~ '^[A-Z]{3}$'),
      received_on date NOT NULL,
      reference text,
      notes text,
      created_by_id uuid REFERENCES users(id) ON DELETE RESTRICT,
      created_at timestamptz NOT NULL DEFAULT now(),
      updated_at timestamptz NOT NULL DEFAULT now(),
      CONSTRAINT stock_receipts_id_site_spec UNIQUE (id, site_id, blade_spec_id)
    );
    CREATE INDEX stock_receipts_site_received ON stock_receipts (site_id, received_on DESC);
    CREATE INDEX stock_receipts_site_spec ON stock_receipts (site_id, blade_spec_id, received_on, created_at);

    -- Reorder settings per spec and site; a spec without a row uses Kerfline's starting values.
    CREATE TABLE stock_levels (
      id uuid PRIMARY KEY DEFAULT gen_random_uuid(),
      site_id uuid NOT NULL REFERENCES sites(id) ON DELETE RESTRICT,
      blade_spec_id uuid NOT NULL REFERENCES blade_specs(id) ON DELETE CASCADE,
      lead_time_days integer NOT NULL CHECK (lead_time_days >= 0 AND lead_time_days <= 365),
      safety_stock integer NOT NULL CHECK (safety_stock >= 0 AND safety_stock <= 10000),
      updated_by_id uuid REFERENCES users(id) ON DELETE RESTRICT,
      created_at timestamptz NOT NULL DEFAULT now(),
      updated_at timestamptz NOT NULL DEFAULT now(),
      CONSTRAINT stock_levels_site_spec UNIQUE (site_id, blade_spec_id)
    );

    CREATE TABLE blade_runs (
      id uuid PRIMARY KEY DEFAULT gen_random_uuid(),
      site_id uuid NOT NULL,
      saw_id uuid NOT NULL,
      blade_spec_id uuid NOT NULL REFERENCES blade_specs(id) ON DELETE RESTRICT,
      stock_receipt_id uuid,
      installed_at timestamptz NOT NULL,
      installed_by_id uuid REFERENCES users(id) ON DELETE RESTRICT,
      tension_mpa double precision CHECK (tension_mpa > 0 AND tension_mpa <= 600),
      material_group text CHECK (material_group IN
        ('carbon_steel', 'alloy_steel', 'stainless_steel', 'tool_steel', 'aluminium', 'copper_alloy', 'cast_iron')),
      break_in_followed boolean,
      install_notes text,
      cost_minor integer NOT NULL CHECK (cost_minor >= 0),
      currency char(3) NOT NULL CHECK (currency ~ '^[A-Z]{3}$'),
      removed_at timestamptz,
      removed_by_id uuid REFERENCES users(id) ON DELETE RESTRICT,
      removal_reason text CHECK (removal_reason IN
        ('worn_out', 'tooth_strippage', 'fatigue_crack', 'broken', 'crooked_cutting', 'other')),
      area_cut_mm2 double precision CHECK (area_cut_mm2 >= 0 AND area_cut_mm2 <= 1e9),
      cuts integer CHECK (cuts >= 0 AND cuts <= 1000000),
      area_source text CHECK (area_source IN ('entered', 'cut_logs')),
      removal_notes text,
      confirmed_cause text,
      confirmed_cause_at timestamptz,
      confirmed_cause_by_id uuid REFERENCES users(id) ON DELETE RESTRICT,
      created_at timestamptz NOT NULL DEFAULT now(),
      updated_at timestamptz NOT NULL DEFAULT now(),
      CONSTRAINT blade_runs_saw_site FOREIGN KEY (saw_id, site_id) REFERENCES saws(id, site_id),
      CONSTRAINT blade_runs_receipt FOREIGN KEY (stock_receipt_id, site_id, blade_spec_id)
        REFERENCES stock_receipts(id, site_id, blade_spec_id),
      CONSTRAINT blade_runs_removed_after_installed CHECK (removed_at IS NULL OR removed_at >= installed_at),
      CONSTRAINT blade_runs_removal_complete CHECK ((removed_at IS NULL) = (removal_reason IS NULL)),
      CONSTRAINT blade_runs_cause_after_removal CHECK (confirmed_cause IS NULL OR removed_at IS NOT NULL),
      CONSTRAINT blade_runs_cause_complete CHECK ((confirmed_cause IS NULL) = (confirmed_cause_at IS NULL)),
      CONSTRAINT blade_runs_id_site UNIQUE (id, site_id),
      CONSTRAINT blade_runs_id_saw UNIQUE (id, saw_id),
      -- One blade on a saw at a time: runs of one saw never overlap (an open run reaches to infinity).
      CONSTRAINT blade_runs_no_overlap EXCLUDE USING gist
        (saw_id WITH =, tstzrange(installed_at, removed_at, '[)') WITH &&)
    );
    -- At most one open run per saw, enforced here and not only by code; also finds the blade on a saw fast.
    CREATE UNIQUE INDEX blade_runs_one_open_per_saw ON blade_runs (saw_id) WHERE removed_at IS NULL;
    CREATE INDEX blade_runs_site_installed ON blade_runs (site_id, installed_at DESC, id);
    CREATE INDEX blade_runs_saw_installed ON blade_runs (saw_id, installed_at DESC);
    CREATE INDEX blade_runs_site_removed ON blade_runs (site_id, removed_at DESC) WHERE removed_at IS NOT NULL;
    CREATE INDEX blade_runs_site_reason_installed ON blade_runs (site_id, removal_reason, installed_at DESC)
      WHERE removed_at IS NOT NULL;
    CREATE INDEX blade_runs_site_spec_installed ON blade_runs (site_id, blade_spec_id, installed_at);
    CREATE INDEX blade_runs_receipt ON blade_runs (stock_receipt_id) WHERE stock_receipt_id IS NOT NULL;

    CREATE TABLE stops (
      id uuid PRIMARY KEY DEFAULT gen_random_uuid(),
      site_id uuid NOT NULL,
      saw_id uuid NOT NULL,
      started_at timestamptz NOT NULL,
      ended_at timestamptz,
      category text NOT NULL CHECK (category IN ('blade_change', 'blade_failure', 'mechanical', 'hydraulic',
        'electrical', 'no_material_operator', 'planned_maintenance', 'other')),
      planned boolean NOT NULL DEFAULT false,
      notes text,
      created_by_id uuid REFERENCES users(id) ON DELETE RESTRICT,
      ended_by_id uuid REFERENCES users(id) ON DELETE RESTRICT,
      created_at timestamptz NOT NULL DEFAULT now(),
      updated_at timestamptz NOT NULL DEFAULT now(),
      CONSTRAINT stops_saw_site FOREIGN KEY (saw_id, site_id) REFERENCES saws(id, site_id),
      CONSTRAINT stops_end_after_start CHECK (ended_at IS NULL OR ended_at > started_at),
      CONSTRAINT stops_no_overlap EXCLUDE USING gist
        (saw_id WITH =, tstzrange(started_at, ended_at, '[)') WITH &&)
    );
    -- The open stop of a saw makes it "down": one at most, found through this index by the saw list.
    CREATE UNIQUE INDEX stops_one_open_per_saw ON stops (saw_id) WHERE ended_at IS NULL;
    CREATE INDEX stops_site_started ON stops (site_id, started_at DESC, id);
    CREATE INDEX stops_saw_started ON stops (saw_id, started_at DESC);
    CREATE INDEX stops_site_category_started ON stops (site_id, category, started_at DESC);

    CREATE TABLE cut_logs (
      id uuid PRIMARY KEY DEFAULT gen_random_uuid(),
      site_id uuid NOT NULL,
      saw_id uuid NOT NULL,
      blade_run_id uuid,
      cut_at timestamptz NOT NULL,
      shape jsonb NOT NULL CHECK (jsonb_typeof(shape) = 'object' AND shape ? 'kind'),
      piece_count integer NOT NULL CHECK (piece_count >= 1 AND piece_count <= 500),
      pieces_across integer NOT NULL CHECK (pieces_across >= 1 AND pieces_across <= piece_count),
      material_group text NOT NULL CHECK (material_group IN
        ('carbon_steel', 'alloy_steel', 'stainless_steel', 'tool_steel', 'aluminium', 'copper_alloy', 'cast_iron')),
      quantity integer NOT NULL CHECK (quantity >= 1 AND quantity <= 10000),
      band_speed_m_per_min double precision CHECK (band_speed_m_per_min > 0 AND band_speed_m_per_min <= 5000),
      feed_mm_per_min double precision CHECK (feed_mm_per_min > 0 AND feed_mm_per_min <= 5000),
      cut_time_s double precision CHECK (cut_time_s > 0 AND cut_time_s <= 86400),
      area_per_cut_mm2 double precision NOT NULL CHECK (area_per_cut_mm2 > 0),
      area_cut_mm2 double precision NOT NULL CHECK (area_cut_mm2 > 0),
      teeth_in_work_min double precision CHECK (teeth_in_work_min >= 0),
      teeth_in_work_max double precision CHECK (teeth_in_work_max >= teeth_in_work_min),
      warnings jsonb NOT NULL DEFAULT '[]'::jsonb,
      notes text,
      created_by_id uuid REFERENCES users(id) ON DELETE RESTRICT,
      created_at timestamptz NOT NULL DEFAULT now(),
      CONSTRAINT cut_logs_saw_site FOREIGN KEY (saw_id, site_id) REFERENCES saws(id, site_id),
      -- A cut log's run is a run of the same saw; deleting the run keeps the log without it.
      CONSTRAINT cut_logs_run_saw FOREIGN KEY (blade_run_id, saw_id) REFERENCES blade_runs(id, saw_id)
        ON DELETE SET NULL (blade_run_id)
    );
    CREATE INDEX cut_logs_site_cut ON cut_logs (site_id, cut_at DESC, id);
    CREATE INDEX cut_logs_saw_cut ON cut_logs (saw_id, cut_at DESC);
    CREATE INDEX cut_logs_run ON cut_logs (blade_run_id) WHERE blade_run_id IS NOT NULL;

    -- Photo metadata; the bytes live in photo_blobs so lists never read them.
    CREATE TABLE photos (
      id uuid PRIMARY KEY DEFAULT gen_random_uuid(),
      site_id uuid NOT NULL REFERENCES sites(id) ON DELETE RESTRICT,
      blade_run_id uuid,
      content_type text NOT NULL CHECK (content_type IN ('image/jpeg', 'image/png', 'image/webp')),
      byte_size integer NOT NULL CHECK (byte_size > 0 AND byte_size <= 10485760),
      width_px integer NOT NULL CHECK (width_px > 0),
      height_px integer NOT NULL CHECK (height_px > 0),
      caption text,
      uploaded_by_id uuid REFERENCES users(id) ON DELETE RESTRICT,
      created_at timestamptz NOT NULL DEFAULT now(),
      CONSTRAINT photos_run_site FOREIGN KEY (blade_run_id, site_id) REFERENCES blade_runs(id, site_id)
        ON DELETE CASCADE,
      -- Attached to exactly one record (checks will be the second kind).
      CONSTRAINT photos_one_parent CHECK (num_nonnulls(blade_run_id) = 1)
    );
    CREATE INDEX photos_run ON photos (blade_run_id, created_at) WHERE blade_run_id IS NOT NULL;

    CREATE TABLE photo_blobs (
      photo_id uuid PRIMARY KEY REFERENCES photos(id) ON DELETE CASCADE,
      image bytea NOT NULL,
      thumbnail bytea NOT NULL,
      thumbnail_type text NOT NULL
    );

    -- "Down" is derived from an open stop from now on: saws stored as down get one, dated when they were last
    -- changed (the best the old record knows), and become in service in the stored column.
    INSERT INTO stops (site_id, saw_id, started_at, category, planned, notes)
      SELECT site_id, id, least(updated_at, now()), 'other', false,
             'Marked down before stops were recorded; the start is when the saw was last changed.'
        FROM saws WHERE status = 'down';
    UPDATE saws SET status = 'in_service' WHERE status = 'down';
    ALTER TABLE saws DROP CONSTRAINT saws_status_check;
    ALTER TABLE saws ADD CONSTRAINT saws_status_check CHECK (status IN ('in_service', 'retired'));
  `);
}

export async function down({ sequelize }: MigrationContext): Promise<void> {
  await sequelize.query(`
    ALTER TABLE saws DROP CONSTRAINT saws_status_check;
    ALTER TABLE saws ADD CONSTRAINT saws_status_check CHECK (status IN ('in_service', 'down', 'retired'));
    UPDATE saws SET status = 'down' WHERE status = 'in_service'
      AND EXISTS (SELECT 1 FROM stops WHERE stops.saw_id = saws.id AND stops.ended_at IS NULL);
    DROP TABLE photo_blobs, photos, cut_logs, stops, blade_runs, stock_levels, stock_receipts, blade_specs;
    ALTER TABLE saws DROP CONSTRAINT saws_id_site;
  `);
}
