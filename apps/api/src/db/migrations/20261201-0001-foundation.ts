import type { MigrationContext } from '../umzug.js';

/**
 * Regions, sites, people and saws, plus the session table. Invariants live here as constraints so no code
 * path can break them: a site admin or technician always has a home site, a retired saw always has a date,
 * an asset tag is unique within its site.
 */
export async function up({ sequelize }: MigrationContext): Promise<void> {
  await sequelize.query(`
    CREATE TABLE regions (
      id uuid PRIMARY KEY DEFAULT gen_random_uuid(),
      name text NOT NULL UNIQUE CHECK (length(trim(name)) > 0),
      created_at timestamptz NOT NULL DEFAULT now(),
      updated_at timestamptz NOT NULL DEFAULT now()
    );

    CREATE TABLE sites (
      id uuid PRIMARY KEY DEFAULT gen_random_uuid(),
      region_id uuid NOT NULL REFERENCES regions(id) ON DELETE RESTRICT,
      code text NOT NULL UNIQUE CHECK (code ~ '^[A-Z0-9-]+$'),
      name text NOT NULL CHECK (length(trim(name)) > 0),
      city text,
      time_zone text NOT NULL,
      currency char(3) NOT NULL CHECK (currency ~ '^[A-Z]{3}$'),
      unit_system text NOT NULL CHECK (unit_system IN ('metric', 'imperial')),
      created_at timestamptz NOT NULL DEFAULT now(),
      updated_at timestamptz NOT NULL DEFAULT now()
    );
    CREATE INDEX sites_region_id ON sites (region_id);

    CREATE TABLE users (
      id uuid PRIMARY KEY DEFAULT gen_random_uuid(),
      email text NOT NULL CHECK (email = lower(email) AND position('@' in email) > 1),
      name text NOT NULL CHECK (length(trim(name)) > 0),
      role text NOT NULL CHECK (role IN ('admin', 'manager', 'regional_lead', 'site_admin', 'technician')),
      password_hash text NOT NULL,
      site_id uuid REFERENCES sites(id) ON DELETE RESTRICT,
      region_id uuid REFERENCES regions(id) ON DELETE RESTRICT,
      all_sites boolean NOT NULL DEFAULT false,
      active boolean NOT NULL DEFAULT true,
      created_at timestamptz NOT NULL DEFAULT now(),
      updated_at timestamptz NOT NULL DEFAULT now(),
      CONSTRAINT users_home_site CHECK ((role IN ('site_admin', 'technician')) = (site_id IS NOT NULL)),
      CONSTRAINT users_region CHECK ((role = 'regional_lead') = (region_id IS NOT NULL)),
      CONSTRAINT users_all_sites CHECK (NOT all_sites OR role = 'manager')
    );
    CREATE UNIQUE INDEX users_email ON users (email);
    CREATE INDEX users_site_id ON users (site_id);

    -- Sites assigned to a manager (ignored when all_sites is true).
    CREATE TABLE user_sites (
      user_id uuid NOT NULL REFERENCES users(id) ON DELETE CASCADE,
      site_id uuid NOT NULL REFERENCES sites(id) ON DELETE CASCADE,
      PRIMARY KEY (user_id, site_id)
    );
    CREATE INDEX user_sites_site_id ON user_sites (site_id);

    CREATE TABLE saws (
      id uuid PRIMARY KEY DEFAULT gen_random_uuid(),
      site_id uuid NOT NULL REFERENCES sites(id) ON DELETE RESTRICT,
      asset_tag text NOT NULL CHECK (length(trim(asset_tag)) > 0),
      name text NOT NULL CHECK (length(trim(name)) > 0),
      kind text NOT NULL CHECK (kind IN ('horizontal', 'vertical')),
      make text,
      model text,
      wheel_diameter_mm double precision NOT NULL CHECK (wheel_diameter_mm > 0),
      centre_distance_mm double precision NOT NULL CHECK (centre_distance_mm > 0),
      band_width_mm double precision NOT NULL CHECK (band_width_mm > 0),
      band_thickness_mm double precision NOT NULL CHECK (band_thickness_mm > 0 AND band_thickness_mm < band_width_mm),
      band_length_mm double precision NOT NULL CHECK (band_length_mm > 0),
      band_speed_min_m_per_min double precision NOT NULL CHECK (band_speed_min_m_per_min > 0),
      band_speed_max_m_per_min double precision NOT NULL CHECK (band_speed_max_m_per_min >= band_speed_min_m_per_min),
      capacity_round_mm double precision CHECK (capacity_round_mm > 0),
      capacity_rect_width_mm double precision CHECK (capacity_rect_width_mm > 0),
      capacity_rect_height_mm double precision CHECK (capacity_rect_height_mm > 0),
      status text NOT NULL DEFAULT 'in_service' CHECK (status IN ('in_service', 'down', 'retired')),
      retired_at timestamptz,
      created_at timestamptz NOT NULL DEFAULT now(),
      updated_at timestamptz NOT NULL DEFAULT now(),
      CONSTRAINT saws_retired_at CHECK ((status = 'retired') = (retired_at IS NOT NULL)),
      CONSTRAINT saws_asset_tag_per_site UNIQUE (site_id, asset_tag)
    );
    CREATE INDEX saws_site_status ON saws (site_id, status);

    -- express-session store (connect-pg-simple's layout): the API keeps no session state in memory.
    CREATE TABLE sessions (
      sid varchar NOT NULL PRIMARY KEY,
      sess json NOT NULL,
      expire timestamp(6) NOT NULL
    );
    CREATE INDEX sessions_expire ON sessions (expire);

    -- Sign-in attempt counters shared by every API process behind a load balancer.
    CREATE TABLE rate_limit_hits (
      key text PRIMARY KEY,
      hits integer NOT NULL,
      reset_at timestamptz NOT NULL
    );
  `);
}

export async function down({ sequelize }: MigrationContext): Promise<void> {
  await sequelize.query(`DROP TABLE rate_limit_hits, sessions, saws, user_sites, users, sites, regions;`);
}
