import type { MigrationContext } from '../umzug.js';

/**
 * blade_check_firsts: for each blade run and each check recorded while that blade was on its saw, the first such
 * record's time. Practice compared reads it to judge the checks due at each blade change (done by the first record
 * while the blade was on), instead of finding, for a year of the fleet's 36 000 records, the blade on at each one.
 *
 * "While the blade was on" is by time, as practice has always read it: installed_at ≤ checked_at < removed_at (or
 * still on). A blade taken off the moment it went on holds no record. This is not check_records.blade_run_id,
 * which keeps the blade a record was judged against when it was written and is history, not kept in step.
 *
 * Never a cache: statement-level triggers recompute, in the writer's transaction, the rows of every blade a
 * statement could change: the blades at the times of the check records it wrote, moved or removed, and the blade
 * runs it put on, moved or removed. Writers of one saw take turns on it (rollup_lock_saws, the monthly summary's
 * per-saw lock, in saw order), and each recompute is a fresh statement, so under READ COMMITTED it sees what the
 * other committed. `blade_check_firsts_rebuild()` recomputes everything (after a bulk load with the triggers off);
 * the API's tests compare the kept rows with a rebuild after writes, imports and undo.
 *
 * Also: blade_runs_saw_installed carries the columns practice reads of each blade, so a year of a fleet's blades
 * is read from the index alone.
 */
export async function up({ sequelize }: MigrationContext): Promise<void> {
  await sequelize.query(`
    CREATE TABLE blade_check_firsts (
      -- A blade run's rows go with it (the triggers remove them too; this also holds for TRUNCATE … CASCADE).
      blade_run_id uuid NOT NULL REFERENCES blade_runs(id) ON DELETE CASCADE,
      site_check_id uuid NOT NULL,
      saw_id uuid NOT NULL,
      site_id uuid NOT NULL,
      first_at timestamptz NOT NULL,
      -- The blade's own times, kept with it (a change of them recomputes the blade's rows).
      installed_at timestamptz NOT NULL,
      removed_at timestamptz,
      PRIMARY KEY (blade_run_id, site_check_id)
    );
    -- A saw's first records over a span of time (the blades of a period), read from the index alone.
    CREATE INDEX blade_check_firsts_saw_first ON blade_check_firsts (saw_id, first_at)
      INCLUDE (site_check_id, blade_run_id, site_id, installed_at, removed_at);

    CREATE FUNCTION blade_check_firsts_refresh(run_ids uuid[]) RETURNS void LANGUAGE plpgsql AS $fn$
    BEGIN
      DELETE FROM blade_check_firsts WHERE blade_run_id = ANY (run_ids);
      INSERT INTO blade_check_firsts (blade_run_id, site_check_id, saw_id, site_id, first_at, installed_at, removed_at)
        SELECT r.id, k.site_check_id, r.saw_id, k.site_id, min(k.checked_at), r.installed_at, r.removed_at
          FROM blade_runs r
          JOIN check_records k ON k.saw_id = r.saw_id AND k.checked_at >= r.installed_at
               AND k.checked_at < coalesce(r.removed_at, 'infinity'::timestamptz)
         WHERE r.id = ANY (run_ids)
         GROUP BY r.id, k.site_check_id, r.saw_id, k.site_id, r.installed_at, r.removed_at;
    END
    $fn$;

    -- The blade on a saw at a time, if any (a blade taken off the moment it went on holds no time).
    CREATE FUNCTION blade_check_firsts_blade_at(saw uuid, at timestamptz) RETURNS uuid LANGUAGE sql STABLE AS $fn$
      -- The latest blade put on by then (blades on a saw never overlap), if it was still on.
      SELECT last.id FROM (
        SELECT b.id, b.removed_at FROM blade_runs b
         WHERE b.saw_id = saw AND b.installed_at <= at AND b.removed_at IS DISTINCT FROM b.installed_at
         ORDER BY b.installed_at DESC LIMIT 1) last
       WHERE at < coalesce(last.removed_at, 'infinity'::timestamptz)
    $fn$;

    -- Records written, moved or removed: the blades on at their old and new times.
    CREATE FUNCTION blade_check_firsts_records_changed() RETURNS trigger LANGUAGE plpgsql AS $fn$
    DECLARE
      saws uuid[];
      times timestamptz[];
      run_ids uuid[];
    BEGIN
      IF TG_OP = 'INSERT' THEN
        SELECT array_agg(saw_id), array_agg(checked_at) INTO saws, times FROM new_rows;
      ELSIF TG_OP = 'DELETE' THEN
        SELECT array_agg(saw_id), array_agg(checked_at) INTO saws, times FROM old_rows;
      ELSE
        -- Only a change of saw, check or time can move a first record (a foreign key's clean-up changes none).
        SELECT array_agg(t.saw_id), array_agg(t.at) INTO saws, times
          FROM new_rows n JOIN old_rows o ON o.id = n.id
         CROSS JOIN LATERAL (VALUES (n.saw_id, n.checked_at), (o.saw_id, o.checked_at)) AS t(saw_id, at)
         WHERE (n.saw_id, n.site_check_id, n.checked_at) IS DISTINCT FROM (o.saw_id, o.site_check_id, o.checked_at);
      END IF;
      IF saws IS NOT NULL THEN
        PERFORM rollup_lock_saws(saws);
        -- A fresh statement after the lock: it sees the blades another writer of these saws committed.
        SELECT array_agg(DISTINCT b.run_id) INTO run_ids
          FROM (SELECT DISTINCT saw_id, at FROM unnest(saws, times) AS u(saw_id, at)) u
         CROSS JOIN LATERAL (SELECT blade_check_firsts_blade_at(u.saw_id, u.at) AS run_id) b
         WHERE b.run_id IS NOT NULL;
        IF run_ids IS NOT NULL THEN
          PERFORM blade_check_firsts_refresh(run_ids);
        END IF;
      END IF;
      RETURN NULL;
    END
    $fn$;

    -- Blade runs put on, moved or removed: their own rows (those removed come out and nothing goes back).
    CREATE FUNCTION blade_check_firsts_runs_changed() RETURNS trigger LANGUAGE plpgsql AS $fn$
    DECLARE
      saw_ids uuid[];
      run_ids uuid[];
    BEGIN
      IF TG_OP = 'INSERT' THEN
        SELECT array_agg(DISTINCT saw_id), array_agg(id) INTO saw_ids, run_ids FROM new_rows;
      ELSIF TG_OP = 'DELETE' THEN
        SELECT array_agg(DISTINCT saw_id), array_agg(id) INTO saw_ids, run_ids FROM old_rows;
      ELSE
        -- Only a change of saw or times moves which records a blade held (and a saw's lock covers both saws).
        SELECT array_agg(DISTINCT t.saw_id), array_agg(DISTINCT n.id) INTO saw_ids, run_ids
          FROM new_rows n JOIN old_rows o ON o.id = n.id
         CROSS JOIN LATERAL (VALUES (n.saw_id), (o.saw_id)) AS t(saw_id)
         WHERE (n.saw_id, n.installed_at, n.removed_at) IS DISTINCT FROM (o.saw_id, o.installed_at, o.removed_at);
      END IF;
      IF run_ids IS NOT NULL THEN
        PERFORM rollup_lock_saws(saw_ids);
        PERFORM blade_check_firsts_refresh(run_ids);
      END IF;
      RETURN NULL;
    END
    $fn$;

    CREATE FUNCTION blade_check_firsts_rebuild() RETURNS void LANGUAGE plpgsql AS $fn$
    BEGIN
      TRUNCATE blade_check_firsts;
      INSERT INTO blade_check_firsts (blade_run_id, site_check_id, saw_id, site_id, first_at, installed_at, removed_at)
        SELECT r.id, k.site_check_id, r.saw_id, k.site_id, min(k.checked_at), r.installed_at, r.removed_at
          FROM blade_runs r
          JOIN check_records k ON k.saw_id = r.saw_id AND k.checked_at >= r.installed_at
               AND k.checked_at < coalesce(r.removed_at, 'infinity'::timestamptz)
         GROUP BY r.id, k.site_check_id, r.saw_id, k.site_id, r.installed_at, r.removed_at;
    END
    $fn$;

    CREATE TRIGGER check_records_firsts_insert AFTER INSERT ON check_records
      REFERENCING NEW TABLE AS new_rows FOR EACH STATEMENT EXECUTE FUNCTION blade_check_firsts_records_changed();
    CREATE TRIGGER check_records_firsts_update AFTER UPDATE ON check_records
      REFERENCING OLD TABLE AS old_rows NEW TABLE AS new_rows
      FOR EACH STATEMENT EXECUTE FUNCTION blade_check_firsts_records_changed();
    CREATE TRIGGER check_records_firsts_delete AFTER DELETE ON check_records
      REFERENCING OLD TABLE AS old_rows FOR EACH STATEMENT EXECUTE FUNCTION blade_check_firsts_records_changed();
    CREATE TRIGGER blade_runs_firsts_insert AFTER INSERT ON blade_runs
      REFERENCING NEW TABLE AS new_rows FOR EACH STATEMENT EXECUTE FUNCTION blade_check_firsts_runs_changed();
    CREATE TRIGGER blade_runs_firsts_update AFTER UPDATE ON blade_runs
      REFERENCING OLD TABLE AS old_rows NEW TABLE AS new_rows
      FOR EACH STATEMENT EXECUTE FUNCTION blade_check_firsts_runs_changed();
    CREATE TRIGGER blade_runs_firsts_delete AFTER DELETE ON blade_runs
      REFERENCING OLD TABLE AS old_rows FOR EACH STATEMENT EXECUTE FUNCTION blade_check_firsts_runs_changed();

    SELECT blade_check_firsts_rebuild();

    DROP INDEX blade_runs_saw_installed;
    CREATE INDEX blade_runs_saw_installed ON blade_runs (saw_id, installed_at DESC)
      INCLUDE (removed_at, area_cut_mm2, id, site_id);
  `);
}

export async function down({ sequelize }: MigrationContext): Promise<void> {
  await sequelize.query(`
    DROP TRIGGER check_records_firsts_insert ON check_records;
    DROP TRIGGER check_records_firsts_update ON check_records;
    DROP TRIGGER check_records_firsts_delete ON check_records;
    DROP TRIGGER blade_runs_firsts_insert ON blade_runs;
    DROP TRIGGER blade_runs_firsts_update ON blade_runs;
    DROP TRIGGER blade_runs_firsts_delete ON blade_runs;
    DROP FUNCTION blade_check_firsts_records_changed(), blade_check_firsts_runs_changed(),
      blade_check_firsts_refresh(uuid[]), blade_check_firsts_rebuild(), blade_check_firsts_blade_at(uuid, timestamptz);
    DROP TABLE blade_check_firsts;
    DROP INDEX blade_runs_saw_installed;
    CREATE INDEX blade_runs_saw_installed ON blade_runs (saw_id, installed_at DESC);
  `);
}
