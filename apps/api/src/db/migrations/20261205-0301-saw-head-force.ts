import type { MigrationContext } from '../umzug.js';

/**
 * A saw's own spring-balance limits on head down-force (N, over the last inch of travel): the greatest it may
 * read, and the least below which the head is not feeding. Null means the site's `head_force` setting, so saws
 * already recorded keep the site's figures. The database refuses a negative least, a greatest of 0 or less, and
 * a least above the greatest, whatever path writes the row.
 */
export async function up({ sequelize }: MigrationContext): Promise<void> {
  await sequelize.query(`
    ALTER TABLE saws
      ADD COLUMN min_head_force_n double precision CHECK (min_head_force_n >= 0),
      ADD COLUMN max_head_force_n double precision CHECK (max_head_force_n > 0),
      ADD CONSTRAINT saws_head_force_order CHECK (min_head_force_n IS NULL OR max_head_force_n IS NULL
        OR min_head_force_n <= max_head_force_n);
  `);
}

export async function down({ sequelize }: MigrationContext): Promise<void> {
  await sequelize.query(
    'ALTER TABLE saws DROP CONSTRAINT saws_head_force_order, DROP COLUMN min_head_force_n, DROP COLUMN max_head_force_n;',
  );
}
