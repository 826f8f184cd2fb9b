import type { MigrationContext } from '../umzug.js';

/**
 * The audit trail: every create, change and delete of a site's records and settings, written in the same
 * transaction as the change itself, so a change without its entry (or the reverse) cannot be committed.
 * Entries are never updated or deleted; people are never deleted, so `actor_id` always names someone.
 */
export async function up({ sequelize }: MigrationContext): Promise<void> {
  await sequelize.query(`
    CREATE TABLE audit_entries (
      id uuid PRIMARY KEY DEFAULT gen_random_uuid(),
      at timestamptz NOT NULL DEFAULT now(),
      actor_id uuid REFERENCES users(id) ON DELETE RESTRICT,
      site_id uuid REFERENCES sites(id) ON DELETE RESTRICT,
      entity text NOT NULL CHECK (length(entity) > 0),
      entity_id text NOT NULL CHECK (length(entity_id) > 0),
      action text NOT NULL CHECK (action IN ('create', 'update', 'delete', 'retire', 'restore', 'undo')),
      before jsonb,
      after jsonb,
      CONSTRAINT audit_entries_shape CHECK (
        (action <> 'create' OR before IS NULL) AND (action NOT IN ('delete', 'undo') OR after IS NULL)
      )
    );
    CREATE INDEX audit_entries_site_at ON audit_entries (site_id, at DESC);
    CREATE INDEX audit_entries_entity ON audit_entries (entity, entity_id, at DESC);
  `);
}

export async function down({ sequelize }: MigrationContext): Promise<void> {
  await sequelize.query('DROP TABLE audit_entries;');
}
