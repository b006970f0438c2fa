import { sql, type Kysely } from "kysely";

// The customer's side of a job: invitations to set a password, a message thread per work order,
// and progress updates the office shares (with photos already on the job). All append-only.
//
// Invitations: the office's request (customer_invitations) is one row; the link is made when the
// e-mail is sent (invitation_links: only the SHA-256 of its token is kept, never the token), and a
// link used to set a password gets one row in invitation_uses (its primary key makes the use single).
// A newer link for the same sign-in retires the older ones: nothing is updated, the newest counts.
export async function up(db: Kysely<unknown>): Promise<void> {
  await sql`
    CREATE TABLE customer_invitations (
      id uuid PRIMARY KEY DEFAULT gen_random_uuid(),
      shop_id uuid NOT NULL REFERENCES shops(id),
      user_id uuid NOT NULL REFERENCES users(id),
      invited_by uuid NOT NULL REFERENCES users(id),
      invited_at timestamptz NOT NULL DEFAULT now()
    );
    CREATE INDEX customer_invitations_user_idx ON customer_invitations (user_id, invited_at);
    CREATE TRIGGER customer_invitations_append_only BEFORE UPDATE OR DELETE ON customer_invitations
      FOR EACH ROW EXECUTE FUNCTION benchtag_refuse_change();

    CREATE TABLE invitation_links (
      id uuid PRIMARY KEY DEFAULT gen_random_uuid(),
      shop_id uuid NOT NULL REFERENCES shops(id),
      invitation_id uuid NOT NULL REFERENCES customer_invitations(id),
      user_id uuid NOT NULL REFERENCES users(id),
      token_sha256 bytea NOT NULL UNIQUE CHECK (length(token_sha256) = 32),
      made_at timestamptz NOT NULL DEFAULT clock_timestamp(),
      expires_at timestamptz NOT NULL,
      CHECK (expires_at > made_at)
    );
    CREATE INDEX invitation_links_user_idx ON invitation_links (user_id, made_at);
    CREATE TRIGGER invitation_links_append_only BEFORE UPDATE OR DELETE ON invitation_links
      FOR EACH ROW EXECUTE FUNCTION benchtag_refuse_change();

    CREATE TABLE invitation_uses (
      link_id uuid PRIMARY KEY REFERENCES invitation_links(id),
      used_at timestamptz NOT NULL DEFAULT now()
    );
    CREATE TRIGGER invitation_uses_append_only BEFORE UPDATE OR DELETE ON invitation_uses
      FOR EACH ROW EXECUTE FUNCTION benchtag_refuse_change();

    CREATE TABLE work_order_messages (
      id uuid PRIMARY KEY DEFAULT gen_random_uuid(),
      shop_id uuid NOT NULL REFERENCES shops(id),
      work_order_id uuid NOT NULL REFERENCES work_orders(id),
      author_id uuid NOT NULL REFERENCES users(id),
      from_customer boolean NOT NULL,
      body text NOT NULL CHECK (length(body) BETWEEN 1 AND 4000),
      written_at timestamptz NOT NULL DEFAULT clock_timestamp()
    );
    CREATE INDEX work_order_messages_idx ON work_order_messages (work_order_id, written_at);
    CREATE INDEX work_order_messages_shop_idx ON work_order_messages (shop_id, written_at);
    CREATE TRIGGER work_order_messages_append_only BEFORE UPDATE OR DELETE ON work_order_messages
      FOR EACH ROW EXECUTE FUNCTION benchtag_refuse_change();

    CREATE TABLE progress_updates (
      id uuid PRIMARY KEY DEFAULT gen_random_uuid(),
      shop_id uuid NOT NULL REFERENCES shops(id),
      work_order_id uuid NOT NULL REFERENCES work_orders(id),
      note text NOT NULL CHECK (length(note) BETWEEN 1 AND 2000),
      posted_by uuid NOT NULL REFERENCES users(id),
      posted_at timestamptz NOT NULL DEFAULT clock_timestamp()
    );
    CREATE INDEX progress_updates_idx ON progress_updates (work_order_id, posted_at);
    CREATE TRIGGER progress_updates_append_only BEFORE UPDATE OR DELETE ON progress_updates
      FOR EACH ROW EXECUTE FUNCTION benchtag_refuse_change();

    CREATE TABLE progress_update_photos (
      update_id uuid NOT NULL REFERENCES progress_updates(id),
      attachment_id uuid NOT NULL REFERENCES attachments(id),
      position smallint NOT NULL CHECK (position BETWEEN 0 AND 11),
      PRIMARY KEY (update_id, attachment_id),
      UNIQUE (update_id, position)
    );
    CREATE INDEX progress_update_photos_attachment_idx ON progress_update_photos (attachment_id);
    CREATE TRIGGER progress_update_photos_append_only BEFORE UPDATE OR DELETE ON progress_update_photos
      FOR EACH ROW EXECUTE FUNCTION benchtag_refuse_change();
  `.execute(db);
}

export async function down(db: Kysely<unknown>): Promise<void> {
  await sql`
    DROP TABLE IF EXISTS progress_update_photos; DROP TABLE IF EXISTS progress_updates;
    DROP TABLE IF EXISTS work_order_messages; DROP TABLE IF EXISTS invitation_uses;
    DROP TABLE IF EXISTS invitation_links; DROP TABLE IF EXISTS customer_invitations;
  `.execute(db);
}
