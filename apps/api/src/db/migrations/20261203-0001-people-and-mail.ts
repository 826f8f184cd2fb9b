import type { MigrationContext } from '../umzug.js';

/**
 * People and mail: invitations and password resets (single-use links whose secret is stored only as a
 * SHA-256 hash), retiring a site (it keeps its history), the record of every mail Kerfline sends, and each
 * person's choice of which optional mail they get. The job queue itself (pg-boss) keeps its own tables in the
 * `pgboss` schema, which pg-boss creates and migrates when it starts.
 */
export async function up({ sequelize }: MigrationContext): Promise<void> {
  await sequelize.query(`
    ALTER TABLE sites ADD COLUMN retired_at timestamptz;
    ALTER TABLE users ADD COLUMN password_changed_at timestamptz;

    CREATE TABLE invitations (
      id uuid PRIMARY KEY DEFAULT gen_random_uuid(),
      email text NOT NULL CHECK (email = lower(email) AND position('@' in email) > 1),
      name text CHECK (name IS NULL OR length(trim(name)) > 0),
      role text NOT NULL CHECK (role IN ('admin', 'manager', 'regional_lead', 'site_admin', 'technician')),
      site_id uuid REFERENCES sites(id) ON DELETE RESTRICT,
      region_id uuid REFERENCES regions(id) ON DELETE RESTRICT,
      managed_site_ids uuid[] NOT NULL DEFAULT '{}',
      all_sites boolean NOT NULL DEFAULT false,
      token_hash text NOT NULL CHECK (token_hash ~ '^[0-9a-f]{64}$'),
      expires_at timestamptz NOT NULL,
      invited_by uuid NOT NULL REFERENCES users(id) ON DELETE RESTRICT,
      sent_count integer NOT NULL DEFAULT 1 CHECK (sent_count >= 1),
      last_sent_at timestamptz NOT NULL DEFAULT now(),
      accepted_at timestamptz,
      accepted_user_id uuid REFERENCES users(id) ON DELETE RESTRICT,
      revoked_at timestamptz,
      revoked_by uuid REFERENCES users(id) ON DELETE RESTRICT,
      created_at timestamptz NOT NULL DEFAULT now(),
      updated_at timestamptz NOT NULL DEFAULT now(),
      CONSTRAINT invitations_home_site CHECK ((role IN ('site_admin', 'technician')) = (site_id IS NOT NULL)),
      CONSTRAINT invitations_region CHECK ((role = 'regional_lead') = (region_id IS NOT NULL)),
      CONSTRAINT invitations_all_sites CHECK (NOT all_sites OR role = 'manager'),
      CONSTRAINT invitations_accepted CHECK ((accepted_at IS NULL) = (accepted_user_id IS NULL)),
      CONSTRAINT invitations_revoked CHECK ((revoked_at IS NULL) = (revoked_by IS NULL)),
      CONSTRAINT invitations_one_ending CHECK (accepted_at IS NULL OR revoked_at IS NULL)
    );
    CREATE UNIQUE INDEX invitations_token_hash ON invitations (token_hash);
    -- One open invitation per address; an expired one is withdrawn when the address is invited again.
    CREATE UNIQUE INDEX invitations_open_email ON invitations (email) WHERE accepted_at IS NULL AND revoked_at IS NULL;
    CREATE INDEX invitations_site_created ON invitations (site_id, created_at DESC);

    CREATE TABLE password_resets (
      id uuid PRIMARY KEY DEFAULT gen_random_uuid(),
      user_id uuid NOT NULL REFERENCES users(id) ON DELETE RESTRICT,
      token_hash text NOT NULL CHECK (token_hash ~ '^[0-9a-f]{64}$'),
      expires_at timestamptz NOT NULL,
      used_at timestamptz,
      created_at timestamptz NOT NULL DEFAULT now()
    );
    CREATE UNIQUE INDEX password_resets_token_hash ON password_resets (token_hash);
    CREATE INDEX password_resets_open ON password_resets (user_id) WHERE used_at IS NULL;

    -- Every mail Kerfline sends, one row per message: who, what kind, how it went. dedupe_key makes a send
    -- happen at most once however many processes or retries try it (e.g. weekly_digest:<person>:2026-W49).
    CREATE TABLE mail_log (
      id uuid PRIMARY KEY DEFAULT gen_random_uuid(),
      kind text NOT NULL
        CHECK (kind IN ('invitation', 'password_reset', 'weekly_digest', 'monthly_summary', 'low_stock')),
      user_id uuid REFERENCES users(id) ON DELETE RESTRICT,
      invitation_id uuid REFERENCES invitations(id) ON DELETE RESTRICT,
      to_address text NOT NULL CHECK (position('@' in to_address) > 1),
      dedupe_key text NOT NULL CHECK (length(dedupe_key) > 0),
      -- What the worker needs to build the message; a link's secret only sealed, and dropped once sent.
      payload jsonb NOT NULL DEFAULT '{}',
      subject text,
      status text NOT NULL DEFAULT 'queued'
        CHECK (status IN ('queued', 'sending', 'retrying', 'sent', 'failed', 'skipped')),
      attempts integer NOT NULL DEFAULT 0 CHECK (attempts >= 0),
      last_error text,
      message_id text,
      sent_at timestamptz,
      created_at timestamptz NOT NULL DEFAULT now(),
      updated_at timestamptz NOT NULL DEFAULT now(),
      CONSTRAINT mail_log_sent_at CHECK ((status = 'sent') = (sent_at IS NOT NULL))
    );
    CREATE UNIQUE INDEX mail_log_dedupe_key ON mail_log (dedupe_key);
    CREATE INDEX mail_log_created ON mail_log (created_at DESC, id DESC);
    CREATE INDEX mail_log_user_created ON mail_log (user_id, created_at DESC);

    -- A person's choice for each optional kind of mail; no row means the kind's default (on).
    CREATE TABLE mail_preferences (
      user_id uuid NOT NULL REFERENCES users(id) ON DELETE CASCADE,
      kind text NOT NULL CHECK (kind IN ('weekly_digest', 'monthly_summary', 'low_stock')),
      enabled boolean NOT NULL,
      updated_at timestamptz NOT NULL DEFAULT now(),
      PRIMARY KEY (user_id, kind)
    );
  `);
}

export async function down({ sequelize }: MigrationContext): Promise<void> {
  await sequelize.query(`
    DROP TABLE mail_preferences, mail_log, password_resets, invitations;
    ALTER TABLE users DROP COLUMN password_changed_at;
    ALTER TABLE sites DROP COLUMN retired_at;
  `);
}
