import type { MigrationContext } from '../umzug.js';

/**
 * How each saw's head is fed: by gravity held back by a spring (`gravity_spring`) or by a hydraulic cylinder.
 * The spring-balance head-force check applies only to the first. Saws already recorded count as hydraulic, as
 * most production saws are; a site admin corrects the few that are not.
 */
export async function up({ sequelize }: MigrationContext): Promise<void> {
  await sequelize.query(`
    ALTER TABLE saws
      ADD COLUMN head_feed text NOT NULL DEFAULT 'hydraulic' CHECK (head_feed IN ('gravity_spring', 'hydraulic'));
  `);
}

export async function down({ sequelize }: MigrationContext): Promise<void> {
  await sequelize.query('ALTER TABLE saws DROP COLUMN head_feed;');
}
