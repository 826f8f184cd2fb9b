import type { MigrationContext } from '../umzug.js';

/**
 * Bringing legacy spreadsheet logs in. An import batch records who brought which file (name, size, SHA-256 of its
 * bytes) into which site, for what kind of record, with the counts and its state; the records it wrote carry its
 * id, so the whole import can be taken back out in one statement per table, and nothing else is touched. The batch
 * itself is never deleted: undoing it marks it undone. Rejected rows are kept with the batch (their cells and the
 * reason) for the download. A site's last mapping per kind is remembered for next time.
 */
export async function up({ sequelize }: MigrationContext): Promise<void> {
  await sequelize.query(`
    CREATE TABLE import_batches (
      id uuid PRIMARY KEY DEFAULT gen_random_uuid(),
      site_id uuid NOT NULL REFERENCES sites(id) ON DELETE RESTRICT,
      kind text NOT NULL CHECK (kind IN ('saws', 'blade_stock', 'blade_runs', 'stops', 'checks')),
      state text NOT NULL CHECK (state IN ('running', 'committed', 'failed', 'undone')),
      file_name text NOT NULL CHECK (length(file_name) BETWEEN 1 AND 255),
      file_bytes integer NOT NULL CHECK (file_bytes >= 0),
      content_sha256 text NOT NULL CHECK (content_sha256 ~ '^[0-9a-f]{64}$'),
      sheet text,
      plan jsonb NOT NULL,
      columns jsonb NOT NULL DEFAULT '[]'::jsonb,
      rows_total integer NOT NULL DEFAULT 0 CHECK (rows_total >= 0),
      rows_added integer NOT NULL DEFAULT 0 CHECK (rows_added >= 0),
      rows_present integer NOT NULL DEFAULT 0 CHECK (rows_present >= 0),
      rows_repeated integer NOT NULL DEFAULT 0 CHECK (rows_repeated >= 0),
      rows_rejected integer NOT NULL DEFAULT 0 CHECK (rows_rejected >= 0),
      error text,
      created_by_id uuid REFERENCES users(id) ON DELETE RESTRICT,
      created_at timestamptz NOT NULL DEFAULT now(),
      finished_at timestamptz,
      undone_at timestamptz,
      undone_by_id uuid REFERENCES users(id) ON DELETE RESTRICT,
      CONSTRAINT import_batches_undone CHECK ((state = 'undone') = (undone_at IS NOT NULL)),
      CONSTRAINT import_batches_failed CHECK (state <> 'failed' OR error IS NOT NULL)
    );
    CREATE INDEX import_batches_site_created ON import_batches (site_id, created_at DESC, id);
    CREATE INDEX import_batches_site_hash ON import_batches (site_id, content_sha256);

    CREATE TABLE import_rejects (
      batch_id uuid NOT NULL REFERENCES import_batches(id) ON DELETE CASCADE,
      row_number integer NOT NULL,
      cells jsonb NOT NULL,
      reason text NOT NULL,
      PRIMARY KEY (batch_id, row_number)
    );

    CREATE TABLE import_mappings (
      id uuid PRIMARY KEY DEFAULT gen_random_uuid(),
      site_id uuid NOT NULL REFERENCES sites(id) ON DELETE RESTRICT,
      kind text NOT NULL CHECK (kind IN ('saws', 'blade_stock', 'blade_runs', 'stops', 'checks')),
      memory jsonb NOT NULL,
      updated_by_id uuid REFERENCES users(id) ON DELETE RESTRICT,
      created_at timestamptz NOT NULL DEFAULT now(),
      updated_at timestamptz NOT NULL DEFAULT now(),
      CONSTRAINT import_mappings_site_kind UNIQUE (site_id, kind)
    );

    -- The import that wrote a record; NULL for records entered in Kerfline. Partial indexes: only imported rows.
    ALTER TABLE saws ADD COLUMN import_batch_id uuid REFERENCES import_batches(id) ON DELETE RESTRICT;
    ALTER TABLE stock_receipts ADD COLUMN import_batch_id uuid REFERENCES import_batches(id) ON DELETE RESTRICT;
    ALTER TABLE blade_runs ADD COLUMN import_batch_id uuid REFERENCES import_batches(id) ON DELETE RESTRICT;
    ALTER TABLE stops ADD COLUMN import_batch_id uuid REFERENCES import_batches(id) ON DELETE RESTRICT;
    CREATE INDEX saws_import_batch ON saws (import_batch_id) WHERE import_batch_id IS NOT NULL;
    CREATE INDEX stock_receipts_import_batch ON stock_receipts (import_batch_id) WHERE import_batch_id IS NOT NULL;
    CREATE INDEX blade_runs_import_batch ON blade_runs (import_batch_id) WHERE import_batch_id IS NOT NULL;
    CREATE INDEX stops_import_batch ON stops (import_batch_id) WHERE import_batch_id IS NOT NULL;
  `);
}

export async function down({ sequelize }: MigrationContext): Promise<void> {
  await sequelize.query(`
    ALTER TABLE stops DROP COLUMN import_batch_id;
    ALTER TABLE blade_runs DROP COLUMN import_batch_id;
    ALTER TABLE stock_receipts DROP COLUMN import_batch_id;
    ALTER TABLE saws DROP COLUMN import_batch_id;
    DROP TABLE import_mappings, import_rejects, import_batches;
  `);
}
