import type { MigrationContext } from '../umzug.js';

/**
 * Newest-first lists across every site (an operations manager, an admin) or a region (a regional lead) had only
 * per-site and per-saw indexes: PostgreSQL read and sorted every run or stop of the fleet to return a page of
 * 100 (0.8 s for the blade runs of the large customer's fleet). With the time first, the page is the index's
 * first entries that pass the scope. Measured with `npm run bench` (DEVELOPERS.md, "Scale").
 */
export async function up({ sequelize }: MigrationContext): Promise<void> {
  await sequelize.query(`
    CREATE INDEX blade_runs_installed ON blade_runs (installed_at DESC, id);
    CREATE INDEX stops_started ON stops (started_at DESC, id);
    CREATE INDEX check_records_checked ON check_records (checked_at DESC, id);
    CREATE INDEX cut_logs_cut ON cut_logs (cut_at DESC, id);
  `);
}

export async function down({ sequelize }: MigrationContext): Promise<void> {
  await sequelize.query(`DROP INDEX blade_runs_installed, stops_started, check_records_checked, cut_logs_cut;`);
}
