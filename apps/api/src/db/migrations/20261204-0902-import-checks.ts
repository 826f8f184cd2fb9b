import type { MigrationContext } from '../umzug.js';

/** Check sheets brought in from spreadsheets carry their import's id too, so an import of checks can be undone. */
export async function up({ sequelize }: MigrationContext): Promise<void> {
  await sequelize.query(`
    ALTER TABLE check_records ADD COLUMN import_batch_id uuid REFERENCES import_batches(id) ON DELETE RESTRICT;
    CREATE INDEX check_records_import_batch ON check_records (import_batch_id) WHERE import_batch_id IS NOT NULL;
  `);
}

export async function down({ sequelize }: MigrationContext): Promise<void> {
  await sequelize.query('ALTER TABLE check_records DROP COLUMN import_batch_id;');
}
