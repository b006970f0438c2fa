import { sql, type Kysely } from "kysely";

// Sessions kept on the server, so a sign-out, a user turned off or the office ending a user's or a
// tablet's sessions ends them at once (the signed cookie alone would stay good until it expires).
// Sign-in waits: the attempts carry the shop of the account tried (so the office sees its own),
// and the office's clearing of a wait is a row of its own (nothing recorded is deleted). Outbox
// hand-overs: the unsent work of a tablet whose session the office ended, kept as it arrived.
export async function up(db: Kysely<unknown>): Promise<void> {
  await sql`
    CREATE TABLE sessions (
      id uuid PRIMARY KEY DEFAULT gen_random_uuid(),
      user_id uuid NOT NULL REFERENCES users(id),
      shop_id uuid NOT NULL REFERENCES shops(id),
      device_id text CHECK (device_id IS NULL OR length(device_id) BETWEEN 1 AND 64),
      client_address text NOT NULL DEFAULT '',
      user_agent text NOT NULL DEFAULT '',
      started_at timestamptz NOT NULL DEFAULT now(),
      last_seen_at timestamptz NOT NULL DEFAULT now(),
      idle_seconds integer NOT NULL CHECK (idle_seconds > 0),
      expires_at timestamptz NOT NULL,
      absolute_expires_at timestamptz NOT NULL,
      ended_at timestamptz,
      ended_reason text CHECK (ended_reason IN ('signed-out', 'ended-by-office', 'tablet-ended-by-office', 'user-turned-off')),
      ended_by uuid REFERENCES users(id),
      CONSTRAINT sessions_end_whole CHECK ((ended_at IS NULL) = (ended_reason IS NULL))
    );
    CREATE INDEX sessions_open_user_idx ON sessions (user_id) WHERE ended_at IS NULL;
    CREATE INDEX sessions_open_device_idx ON sessions (shop_id, device_id) WHERE ended_at IS NULL;

    ALTER TABLE sign_in_attempts ADD COLUMN shop_id uuid REFERENCES shops(id);
    CREATE INDEX sign_in_attempts_shop_idx ON sign_in_attempts (shop_id, at);

    CREATE TABLE sign_in_waits_cleared (
      id bigserial PRIMARY KEY,
      key text NOT NULL,
      shop_id uuid NOT NULL REFERENCES shops(id),
      cleared_by uuid NOT NULL REFERENCES users(id),
      cleared_at timestamptz NOT NULL DEFAULT now()
    );
    CREATE INDEX sign_in_waits_cleared_key_idx ON sign_in_waits_cleared (key, cleared_at);
    CREATE TRIGGER sign_in_waits_cleared_append_only BEFORE UPDATE OR DELETE ON sign_in_waits_cleared
      FOR EACH ROW EXECUTE FUNCTION benchtag_refuse_change();

    CREATE TABLE outbox_handovers (
      id uuid PRIMARY KEY DEFAULT gen_random_uuid(),
      shop_id uuid NOT NULL REFERENCES shops(id),
      user_id uuid NOT NULL REFERENCES users(id),
      session_id uuid NOT NULL REFERENCES sessions(id),
      device_id text NOT NULL,
      entry_count integer NOT NULL CHECK (entry_count >= 0),
      photos_left jsonb NOT NULL DEFAULT '[]',
      entries jsonb NOT NULL,
      received_at timestamptz NOT NULL DEFAULT now()
    );
    CREATE INDEX outbox_handovers_shop_idx ON outbox_handovers (shop_id, received_at);
    CREATE TRIGGER outbox_handovers_append_only BEFORE UPDATE OR DELETE ON outbox_handovers
      FOR EACH ROW EXECUTE FUNCTION benchtag_refuse_change();
  `.execute(db);
}

export async function down(db: Kysely<unknown>): Promise<void> {
  await sql`
    DROP TABLE IF EXISTS outbox_handovers, sign_in_waits_cleared, sessions;
    DROP INDEX IF EXISTS sign_in_attempts_shop_idx;
    ALTER TABLE sign_in_attempts DROP COLUMN IF EXISTS shop_id;
  `.execute(db);
}
