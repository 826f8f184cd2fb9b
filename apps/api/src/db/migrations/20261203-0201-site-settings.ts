import type { MigrationContext } from '../umzug.js';

/**
 * Site settings: one row per site and setting a site has changed from Kerfline's shipped value. No row means
 * the shipped value (which a release may refine); a row holds the site's own value as a JSON object of the
 * setting's numbers, who last set it and when. Every change is also in the audit trail.
 */
export async function up({ sequelize }: MigrationContext): Promise<void> {
  await sequelize.query(`
    CREATE TABLE site_settings (
      id uuid PRIMARY KEY DEFAULT gen_random_uuid(),
      site_id uuid NOT NULL REFERENCES sites(id) ON DELETE RESTRICT,
      key text NOT NULL CHECK (key ~ '^[a-z0-9_]+(\\.[a-z0-9_]+)*$'),
      value jsonb NOT NULL CHECK (jsonb_typeof(value) = 'object'),
      changed_by uuid NOT NULL REFERENCES users(id) ON DELETE RESTRICT,
      changed_at timestamptz NOT NULL DEFAULT now(),
      -- One value per site and setting; the index also serves "this site's settings".
      CONSTRAINT site_settings_site_key UNIQUE (site_id, key)
    );
  `);
}

export async function down({ sequelize }: MigrationContext): Promise<void> {
  await sequelize.query('DROP TABLE site_settings;');
}
