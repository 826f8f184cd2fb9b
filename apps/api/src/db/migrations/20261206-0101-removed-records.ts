import type { MigrationContext } from '../umzug.js';

/**
 * Records a site admin removes to correct a mistaken entry (blade runs, stops, cut logs, photos, recorded checks)
 * leave the live tables and are kept here, whole, until someone puts them back. The live tables keep holding only
 * what counts, so their unique and exclusion constraints, stock levels and every SQL total stay right without a
 * "deleted" filter anyone could forget.
 *
 * `kept_row` is the live row as `to_jsonb` wrote it (column names as keys), so putting it back is
 * `jsonb_populate_record(NULL::<table>, kept_row)` with its own id. A later migration that adds a NOT NULL column
 * to one of these tables must add the column's value to the kept rows of that subject too.
 */
export async function up({ sequelize }: MigrationContext): Promise<void> {
  await sequelize.query(`
    CREATE TABLE removed_records (
      id uuid PRIMARY KEY DEFAULT gen_random_uuid(),
      site_id uuid NOT NULL REFERENCES sites(id) ON DELETE RESTRICT,
      subject text NOT NULL CHECK (subject IN ('BladeRun', 'Stop', 'CutLog', 'Photo', 'CheckRecord')),
      record_id uuid NOT NULL,
      -- The record's saw (a photo's: its parent's), for the list and its filter; saws are never deleted.
      saw_id uuid,
      -- When the recorded thing happened: put on, stopped, cut, checked, or the photo taken in.
      occurred_at timestamptz NOT NULL,
      kept_row jsonb NOT NULL CHECK (jsonb_typeof(kept_row) = 'object'),
      -- The photos removed with it (their rows; their bytes are in removed_photo_blobs).
      kept_photos jsonb NOT NULL DEFAULT '[]'::jsonb CHECK (jsonb_typeof(kept_photos) = 'array'),
      -- Live records that pointed at a removed run and lost the link: {"cutLogIds": [...], "checkRecordIds": [...]};
      -- putting the run back links those still unlinked again.
      relinks jsonb NOT NULL DEFAULT '{}'::jsonb CHECK (jsonb_typeof(relinks) = 'object'),
      reason text NOT NULL CHECK (length(btrim(reason)) BETWEEN 1 AND 300),
      removed_by_id uuid REFERENCES users(id) ON DELETE RESTRICT,
      removed_at timestamptz NOT NULL DEFAULT now(),
      CONSTRAINT removed_records_once UNIQUE (subject, record_id),
      CONSTRAINT removed_records_saw_site FOREIGN KEY (saw_id, site_id) REFERENCES saws(id, site_id)
    );
    CREATE INDEX removed_records_site_removed ON removed_records (site_id, removed_at DESC, id);
    CREATE INDEX removed_records_site_subject_removed ON removed_records (site_id, subject, removed_at DESC, id);
    CREATE INDEX removed_records_saw ON removed_records (saw_id, removed_at DESC) WHERE saw_id IS NOT NULL;

    CREATE TABLE removed_photo_blobs (
      photo_id uuid PRIMARY KEY,
      removed_record_id uuid NOT NULL REFERENCES removed_records(id) ON DELETE CASCADE,
      image bytea NOT NULL,
      thumbnail bytea NOT NULL,
      thumbnail_type text NOT NULL
    );
    CREATE INDEX removed_photo_blobs_record ON removed_photo_blobs (removed_record_id);
  `);
}

export async function down({ sequelize }: MigrationContext): Promise<void> {
  await sequelize.query('DROP TABLE removed_photo_blobs; DROP TABLE removed_records;');
}
