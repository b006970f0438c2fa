import { sql, type Kysely } from "kysely";

// Reminders after handover (run-in check, first service). A procedure template carries its run-in
// reminder lines (after so many days, and optionally at so many km, whichever comes first); the
// handover of a work order running that template sets one reminder per line. The office may add
// one by hand. A reminder is e-mailed to the customer on its due date through the job queue (the
// e-mail outbox's cause "reminder:<id>" makes it once), and the office records when it was done
// (append-only, one record per reminder).
export async function up(db: Kysely<unknown>): Promise<void> {
  await sql`
    CREATE TABLE run_in_reminder_lines (
      id uuid PRIMARY KEY DEFAULT gen_random_uuid(),
      shop_id uuid NOT NULL REFERENCES shops(id),
      template_id uuid NOT NULL REFERENCES procedure_templates(id),
      position integer NOT NULL CHECK (position >= 0),
      label text NOT NULL CHECK (length(label) BETWEEN 1 AND 120),
      after_days integer NOT NULL CHECK (after_days BETWEEN 1 AND 3650),
      after_km integer CHECK (after_km BETWEEN 1 AND 100000),
      UNIQUE (template_id, position)
    );

    CREATE TABLE service_reminders (
      id uuid PRIMARY KEY DEFAULT gen_random_uuid(),
      shop_id uuid NOT NULL REFERENCES shops(id),
      work_order_id uuid NOT NULL REFERENCES work_orders(id),
      label text NOT NULL CHECK (length(label) BETWEEN 1 AND 120),
      due_on date NOT NULL,
      due_odometer_km integer CHECK (due_odometer_km BETWEEN 0 AND 2000000),
      from_line_id uuid REFERENCES run_in_reminder_lines(id),
      created_by uuid NOT NULL REFERENCES users(id),
      created_at timestamptz NOT NULL DEFAULT now(),
      UNIQUE (work_order_id, from_line_id)
    );
    CREATE INDEX service_reminders_due_idx ON service_reminders (shop_id, due_on);
    CREATE TRIGGER service_reminders_append_only BEFORE UPDATE OR DELETE ON service_reminders
      FOR EACH ROW EXECUTE FUNCTION benchtag_refuse_change();

    CREATE TABLE service_reminder_done (
      id uuid PRIMARY KEY DEFAULT gen_random_uuid(),
      shop_id uuid NOT NULL REFERENCES shops(id),
      reminder_id uuid NOT NULL UNIQUE REFERENCES service_reminders(id),
      note text NOT NULL CHECK (length(note) <= 1000),
      odometer_km integer CHECK (odometer_km BETWEEN 0 AND 2000000),
      recorded_by uuid NOT NULL REFERENCES users(id),
      recorded_at timestamptz NOT NULL DEFAULT now()
    );
    CREATE TRIGGER service_reminder_done_append_only BEFORE UPDATE OR DELETE ON service_reminder_done
      FOR EACH ROW EXECUTE FUNCTION benchtag_refuse_change();
  `.execute(db);
}

export async function down(db: Kysely<unknown>): Promise<void> {
  await sql`DROP TABLE IF EXISTS service_reminder_done; DROP TABLE IF EXISTS service_reminders; DROP TABLE IF EXISTS run_in_reminder_lines;`.execute(
    db,
  );
}
