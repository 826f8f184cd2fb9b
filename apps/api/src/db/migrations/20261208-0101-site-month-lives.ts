import type { MigrationContext } from '../umzug.js';

/**
 * Each site's finished blades per site-local month, as sorted lists of their areas: all of them, those whose
 * break-in was followed and those where it was skipped. With the lists sorted, a month's median is the middle of
 * its list, and a longer period's median only sorts the few blades between the smallest and the largest of its
 * months' medians (fleet-figures.ts, "Medians").
 *
 * Kept from saw_month_runs (the per-saw summary, itself kept from the records in the writer's transaction) by
 * statement-level triggers, so it is never a cache either. The change is applied as a difference — the areas of
 * the saw-months a statement removed are taken out of the site's list (a multiset difference) and those it added
 * put in — on the site-month row as it stands when the row is locked, so two writers at one site in the same month
 * each apply their own difference and neither's is lost. A site-month whose blades are all gone keeps its row with
 * empty lists.
 *
 * Reads: fleet-figures.ts (listMedianCtes); the API's tests compare it with the lists built from saw_month_runs
 * after writes, imports and undo.
 */
/** Each site-month's areas in `rows` (rows shaped like saw_month_runs), sorted: all, break-in followed, skipped. */
export const fromRows = (rows: string) => `
  SELECT x.site_id, x.month,
         array_agg(x.v ORDER BY x.v) AS lives,
         coalesce(array_agg(x.v ORDER BY x.v) FILTER (WHERE x.k = 1), '{}') AS followed,
         coalesce(array_agg(x.v ORDER BY x.v) FILTER (WHERE x.k = 2), '{}') AS skipped
    FROM (SELECT r.site_id, r.month, l.v, 1 AS k FROM ${rows} r CROSS JOIN LATERAL unnest(r.life_followed) AS l(v)
          UNION ALL
          SELECT r.site_id, r.month, l.v, 2 FROM ${rows} r CROSS JOIN LATERAL unnest(r.life_skipped) AS l(v)
          UNION ALL
          SELECT r.site_id, r.month, l.v, 3 FROM ${rows} r CROSS JOIN LATERAL unnest(r.life_unrecorded) AS l(v)) x
   GROUP BY x.site_id, x.month`;

const takeOut = `
    UPDATE site_month_lives l
       SET lives = lives_without(l.lives, d.lives),
           followed = lives_without(l.followed, d.followed),
           skipped = lives_without(l.skipped, d.skipped)
      FROM (${fromRows('old_rows')}) d
     WHERE l.site_id = d.site_id AND l.month = d.month;`;

const putIn = `
    INSERT INTO site_month_lives AS l (site_id, month, lives, followed, skipped)
    ${fromRows('new_rows')}
    ON CONFLICT (site_id, month) DO UPDATE
       SET lives = lives_with(l.lives, excluded.lives),
           followed = lives_with(l.followed, excluded.followed),
           skipped = lives_with(l.skipped, excluded.skipped);`;

export async function up({ sequelize }: MigrationContext): Promise<void> {
  await sequelize.query(`
    CREATE TABLE site_month_lives (
      site_id uuid NOT NULL REFERENCES sites(id) ON DELETE CASCADE,
      month date NOT NULL CHECK (extract(day FROM month) = 1),
      lives double precision[] NOT NULL,
      followed double precision[] NOT NULL,
      skipped double precision[] NOT NULL,
      PRIMARY KEY (site_id, month)
    ) WITH (toast_tuple_target = 8160);
    -- Kept in the row and uncompressed up to a page: a month's list is read whole, and unpacking compressed
    -- lists cost more than reading the rows.
    ALTER TABLE site_month_lives ALTER COLUMN lives SET STORAGE MAIN, ALTER COLUMN followed SET STORAGE MAIN,
      ALTER COLUMN skipped SET STORAGE MAIN;

    -- A sorted list with some values added, and with some taken out (each once: a multiset difference).
    CREATE FUNCTION lives_with(kept double precision[], added double precision[]) RETURNS double precision[]
      LANGUAGE sql IMMUTABLE AS $fn$
        SELECT coalesce(array_agg(v ORDER BY v), '{}') FROM unnest(kept || added) AS v
      $fn$;
    CREATE FUNCTION lives_without(kept double precision[], gone double precision[]) RETURNS double precision[]
      LANGUAGE sql IMMUTABLE AS $fn$
        SELECT coalesce(array_agg(v ORDER BY v), '{}')
          FROM (SELECT unnest(kept) EXCEPT ALL SELECT unnest(gone)) AS x(v)
      $fn$;

    CREATE FUNCTION site_lives_changed() RETURNS trigger LANGUAGE plpgsql AS $fn$
    BEGIN
      IF TG_OP = 'INSERT' THEN
        ${putIn}
      ELSIF TG_OP = 'DELETE' THEN
        ${takeOut}
      ELSE
        ${takeOut}
        ${putIn}
      END IF;
      RETURN NULL;
    END
    $fn$;

    CREATE TRIGGER saw_month_runs_lives_insert AFTER INSERT ON saw_month_runs
      REFERENCING NEW TABLE AS new_rows FOR EACH STATEMENT EXECUTE FUNCTION site_lives_changed();
    CREATE TRIGGER saw_month_runs_lives_update AFTER UPDATE ON saw_month_runs
      REFERENCING OLD TABLE AS old_rows NEW TABLE AS new_rows FOR EACH STATEMENT EXECUTE FUNCTION site_lives_changed();
    CREATE TRIGGER saw_month_runs_lives_delete AFTER DELETE ON saw_month_runs
      REFERENCING OLD TABLE AS old_rows FOR EACH STATEMENT EXECUTE FUNCTION site_lives_changed();

    INSERT INTO site_month_lives (site_id, month, lives, followed, skipped)
    ${fromRows('saw_month_runs')};
  `);
}

export async function down({ sequelize }: MigrationContext): Promise<void> {
  await sequelize.query(`
    DROP TRIGGER saw_month_runs_lives_insert ON saw_month_runs;
    DROP TRIGGER saw_month_runs_lives_update ON saw_month_runs;
    DROP TRIGGER saw_month_runs_lives_delete ON saw_month_runs;
    DROP FUNCTION site_lives_changed(), lives_with(double precision[], double precision[]),
      lives_without(double precision[], double precision[]);
    DROP TABLE site_month_lives;
  `);
}
