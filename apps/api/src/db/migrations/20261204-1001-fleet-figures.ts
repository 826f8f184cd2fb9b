import type { MigrationContext } from '../umzug.js';

/**
 * What the fleet screens need beyond the records: the reporting currency and the monthly rates into it, blade
 * budgets per site and month, and follow-ups (with their running history). Plus the index the per-saw figures
 * read finished blades through. The figures themselves are computed from the records on each request (no
 * rollup tables that could fall out of step with a correction); the indexes keep a month's figures to that
 * month's rows:
 * - runs put on: blade_runs (site_id, installed_at) and (saw_id, installed_at), already there;
 * - runs taken off: blade_runs (site_id, removed_at) already there, and (saw_id, removed_at) added here;
 * - stops overlapping a month: the exclusion constraint's GiST index on (saw_id, tstzrange(started_at, ended_at)).
 */
export async function up({ sequelize }: MigrationContext): Promise<void> {
  await sequelize.query(`
    -- One row: the currency fleet totals are shown in. No row: the currency most sites keep.
    CREATE TABLE reporting_currency (
      id boolean PRIMARY KEY DEFAULT true CHECK (id),
      currency char(3) NOT NULL CHECK (currency ~ '^[A-Z]{3}$'),
      set_by_id uuid REFERENCES users(id) ON DELETE RESTRICT,
      updated_at timestamptz NOT NULL DEFAULT now()
    );

    -- Units of the reporting currency one unit of \`currency\` bought in \`month\` (its first day).
    CREATE TABLE exchange_rates (
      id uuid PRIMARY KEY DEFAULT gen_random_uuid(),
      month date NOT NULL CHECK (extract(day FROM month) = 1),
      currency char(3) NOT NULL CHECK (currency ~ '^[A-Z]{3}$'),
      reporting_currency char(3) NOT NULL CHECK (reporting_currency ~ '^[A-Z]{3}$'),
      rate numeric(24, 12) NOT NULL CHECK (rate > 0),
      set_by_id uuid REFERENCES users(id) ON DELETE RESTRICT,
      created_at timestamptz NOT NULL DEFAULT now(),
      updated_at timestamptz NOT NULL DEFAULT now(),
      CONSTRAINT exchange_rates_other_currency CHECK (currency <> reporting_currency),
      CONSTRAINT exchange_rates_one_a_month UNIQUE (reporting_currency, currency, month)
    );

    -- A site's blade budget for a month, in the site's currency at the time it was set.
    CREATE TABLE budgets (
      id uuid PRIMARY KEY DEFAULT gen_random_uuid(),
      site_id uuid NOT NULL REFERENCES sites(id) ON DELETE RESTRICT,
      month date NOT NULL CHECK (extract(day FROM month) = 1),
      amount_minor bigint NOT NULL CHECK (amount_minor >= 0),
      currency char(3) NOT NULL CHECK (currency ~ '^[A-Z]{3}$'),
      set_by_id uuid REFERENCES users(id) ON DELETE RESTRICT,
      created_at timestamptz NOT NULL DEFAULT now(),
      updated_at timestamptz NOT NULL DEFAULT now(),
      CONSTRAINT budgets_one_a_month UNIQUE (site_id, month)
    );

    CREATE TABLE follow_ups (
      id uuid PRIMARY KEY DEFAULT gen_random_uuid(),
      site_id uuid NOT NULL,
      saw_id uuid NOT NULL,
      title text NOT NULL CHECK (length(trim(title)) > 0),
      -- What the outlier flag said when the follow-up was opened (null: opened without a flag).
      flag jsonb CHECK (flag IS NULL OR jsonb_typeof(flag) = 'object'),
      assignee_id uuid NOT NULL REFERENCES users(id) ON DELETE RESTRICT,
      due_on date NOT NULL,
      state text NOT NULL DEFAULT 'open' CHECK (state IN ('open', 'in_progress', 'done')),
      created_by_id uuid REFERENCES users(id) ON DELETE RESTRICT,
      created_at timestamptz NOT NULL DEFAULT now(),
      updated_at timestamptz NOT NULL DEFAULT now(),
      done_at timestamptz,
      CONSTRAINT follow_ups_saw_site FOREIGN KEY (saw_id, site_id) REFERENCES saws(id, site_id),
      CONSTRAINT follow_ups_done_at CHECK ((state = 'done') = (done_at IS NOT NULL)),
      CONSTRAINT follow_ups_id_site UNIQUE (id, site_id)
    );
    CREATE INDEX follow_ups_site_state_due ON follow_ups (site_id, state, due_on);
    CREATE INDEX follow_ups_saw_created ON follow_ups (saw_id, created_at DESC);
    CREATE INDEX follow_ups_assignee ON follow_ups (assignee_id) WHERE state <> 'done';

    -- The history of a follow-up: opened, state changes, notes, new person, new day. Never edited.
    CREATE TABLE follow_up_entries (
      id uuid PRIMARY KEY DEFAULT gen_random_uuid(),
      -- The order lines were written in, also within one change (one transaction shares its clock).
      seq bigint GENERATED ALWAYS AS IDENTITY,
      follow_up_id uuid NOT NULL,
      site_id uuid NOT NULL,
      kind text NOT NULL CHECK (kind IN ('opened', 'state', 'note', 'assigned', 'due')),
      text text NOT NULL,
      by_id uuid REFERENCES users(id) ON DELETE RESTRICT,
      created_at timestamptz NOT NULL DEFAULT now(),
      CONSTRAINT follow_up_entries_follow_up FOREIGN KEY (follow_up_id, site_id)
        REFERENCES follow_ups(id, site_id) ON DELETE CASCADE
    );
    CREATE INDEX follow_up_entries_follow_up_seq ON follow_up_entries (follow_up_id, seq DESC);

    -- A saw's finished blades in a period (per-saw blade life and cost per area).
    CREATE INDEX blade_runs_saw_removed ON blade_runs (saw_id, removed_at) WHERE removed_at IS NOT NULL;
  `);
}

export async function down({ sequelize }: MigrationContext): Promise<void> {
  await sequelize.query(`
    DROP INDEX blade_runs_saw_removed;
    DROP TABLE follow_up_entries, follow_ups, budgets, exchange_rates, reporting_currency;
  `);
}
