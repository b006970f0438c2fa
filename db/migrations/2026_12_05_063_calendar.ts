import { sql, type Kysely } from "kysely";

// The shop's calendar: resources (bays, lifts, the dyno, mechanics), bookings of a work order on a
// resource for a time range, and the work order's promised date.
//
// - Opening hours live on the shop (default 08:00–18:00, Monday to Friday, ISO weekdays 1–7).
// - A resource is retired by its own record (resource_retirements), never edited.
// - Double bookings are refused by PostgreSQL itself: an exclusion constraint (btree_gist) on the
//   resource and the booking's tstzrange, over bookings not released.
// - Cancelling is its own record (booking_cancellations: who, when, why). Inserting it releases the
//   booking's slot: the trigger sets bookings.released_at, the one change the append-only guard on
//   bookings lets through (from empty to the cancellation's time, nothing else touched).
// - Promised dates are appended (work_order_promises); the newest is the one that counts.
export async function up(db: Kysely<unknown>): Promise<void> {
  await sql`
    CREATE EXTENSION IF NOT EXISTS btree_gist;

    ALTER TABLE shops
      ADD COLUMN opens_at time NOT NULL DEFAULT '08:00',
      ADD COLUMN closes_at time NOT NULL DEFAULT '18:00',
      ADD COLUMN open_days smallint[] NOT NULL DEFAULT '{1,2,3,4,5}',
      ADD CONSTRAINT shops_opening_hours CHECK (opens_at < closes_at AND open_days <@ '{1,2,3,4,5,6,7}'::smallint[]);

    CREATE TABLE shop_resources (
      id uuid PRIMARY KEY DEFAULT gen_random_uuid(),
      shop_id uuid NOT NULL REFERENCES shops(id),
      kind text NOT NULL CHECK (kind IN ('bay', 'lift', 'dyno', 'mechanic')),
      name text NOT NULL CHECK (length(name) BETWEEN 1 AND 80),
      user_id uuid REFERENCES users(id),
      created_by uuid NOT NULL REFERENCES users(id),
      created_at timestamptz NOT NULL DEFAULT now(),
      CHECK (user_id IS NULL OR kind = 'mechanic'),
      UNIQUE (shop_id, name)
    );
    CREATE TRIGGER shop_resources_append_only BEFORE UPDATE OR DELETE ON shop_resources
      FOR EACH ROW EXECUTE FUNCTION benchtag_refuse_change();

    CREATE TABLE resource_retirements (
      id uuid PRIMARY KEY DEFAULT gen_random_uuid(),
      shop_id uuid NOT NULL REFERENCES shops(id),
      resource_id uuid NOT NULL UNIQUE REFERENCES shop_resources(id),
      reason text NOT NULL CHECK (length(reason) BETWEEN 3 AND 500),
      retired_by uuid NOT NULL REFERENCES users(id),
      retired_at timestamptz NOT NULL DEFAULT now()
    );
    CREATE TRIGGER resource_retirements_append_only BEFORE UPDATE OR DELETE ON resource_retirements
      FOR EACH ROW EXECUTE FUNCTION benchtag_refuse_change();

    CREATE TABLE bookings (
      id uuid PRIMARY KEY DEFAULT gen_random_uuid(),
      shop_id uuid NOT NULL REFERENCES shops(id),
      resource_id uuid NOT NULL REFERENCES shop_resources(id),
      work_order_id uuid NOT NULL REFERENCES work_orders(id),
      during tstzrange NOT NULL CHECK (NOT isempty(during) AND lower_inc(during) AND NOT upper_inc(during)),
      note text NOT NULL DEFAULT '' CHECK (length(note) <= 500),
      booked_by uuid NOT NULL REFERENCES users(id),
      booked_at timestamptz NOT NULL DEFAULT now(),
      released_at timestamptz,
      CONSTRAINT bookings_no_double EXCLUDE USING gist (resource_id WITH =, during WITH &&) WHERE (released_at IS NULL)
    );
    CREATE INDEX bookings_work_order_idx ON bookings (work_order_id);

    CREATE FUNCTION benchtag_bookings_guard() RETURNS trigger LANGUAGE plpgsql AS $$
    BEGIN
      IF TG_OP = 'UPDATE' AND OLD.released_at IS NULL AND NEW.released_at IS NOT NULL
         AND (NEW.id, NEW.shop_id, NEW.resource_id, NEW.work_order_id, NEW.during, NEW.note, NEW.booked_by, NEW.booked_at)
             IS NOT DISTINCT FROM (OLD.id, OLD.shop_id, OLD.resource_id, OLD.work_order_id, OLD.during, OLD.note, OLD.booked_by, OLD.booked_at)
         AND EXISTS (SELECT 1 FROM booking_cancellations c WHERE c.booking_id = NEW.id) THEN
        RETURN NEW;
      END IF;
      RAISE EXCEPTION 'bookings are append-only: cancel a booking with a cancellation record';
    END $$;
    CREATE TABLE booking_cancellations (
      id uuid PRIMARY KEY DEFAULT gen_random_uuid(),
      shop_id uuid NOT NULL REFERENCES shops(id),
      booking_id uuid NOT NULL UNIQUE REFERENCES bookings(id),
      reason text NOT NULL CHECK (length(reason) BETWEEN 3 AND 500),
      cancelled_by uuid NOT NULL REFERENCES users(id),
      cancelled_at timestamptz NOT NULL DEFAULT now()
    );
    CREATE TRIGGER bookings_append_only BEFORE UPDATE OR DELETE ON bookings
      FOR EACH ROW EXECUTE FUNCTION benchtag_bookings_guard();
    CREATE TRIGGER booking_cancellations_append_only BEFORE UPDATE OR DELETE ON booking_cancellations
      FOR EACH ROW EXECUTE FUNCTION benchtag_refuse_change();
    CREATE FUNCTION benchtag_release_booking() RETURNS trigger LANGUAGE plpgsql AS $$
    BEGIN
      UPDATE bookings SET released_at = NEW.cancelled_at WHERE id = NEW.booking_id AND released_at IS NULL;
      RETURN NEW;
    END $$;
    CREATE TRIGGER booking_cancellations_release AFTER INSERT ON booking_cancellations
      FOR EACH ROW EXECUTE FUNCTION benchtag_release_booking();

    CREATE TABLE work_order_promises (
      id uuid PRIMARY KEY DEFAULT gen_random_uuid(),
      shop_id uuid NOT NULL REFERENCES shops(id),
      work_order_id uuid NOT NULL REFERENCES work_orders(id),
      promised_on date NOT NULL CHECK (promised_on BETWEEN '2000-01-01' AND '2099-12-31'),
      set_by uuid NOT NULL REFERENCES users(id),
      set_at timestamptz NOT NULL DEFAULT now()
    );
    CREATE INDEX work_order_promises_idx ON work_order_promises (work_order_id, set_at DESC);
    CREATE TRIGGER work_order_promises_append_only BEFORE UPDATE OR DELETE ON work_order_promises
      FOR EACH ROW EXECUTE FUNCTION benchtag_refuse_change();
  `.execute(db);
}

export async function down(db: Kysely<unknown>): Promise<void> {
  await sql`
    DROP TABLE IF EXISTS work_order_promises;
    DROP TABLE IF EXISTS booking_cancellations;
    DROP TABLE IF EXISTS bookings;
    DROP FUNCTION IF EXISTS benchtag_release_booking();
    DROP FUNCTION IF EXISTS benchtag_bookings_guard();
    DROP TABLE IF EXISTS resource_retirements;
    DROP TABLE IF EXISTS shop_resources;
    ALTER TABLE shops DROP CONSTRAINT IF EXISTS shops_opening_hours, DROP COLUMN IF EXISTS opens_at, DROP COLUMN IF EXISTS closes_at, DROP COLUMN IF EXISTS open_days;
  `.execute(db);
}
