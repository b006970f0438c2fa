import type { Generated } from "kysely";
import type { ResourceKind } from "@/lib/calendar/rules";
import type { DateOnly, DefaultTimestamp } from "./columns";

// The shop's calendar: resources, bookings, cancellations, promised dates (migration 2026_12_05_063).

interface ShopResourcesTable {
  id: Generated<string>;
  shop_id: string;
  kind: ResourceKind;
  name: string;
  user_id: string | null;
  created_by: string;
  created_at: DefaultTimestamp;
}

interface ResourceRetirementsTable {
  id: Generated<string>;
  shop_id: string;
  resource_id: string;
  reason: string;
  retired_by: string;
  retired_at: DefaultTimestamp;
}

interface BookingsTable {
  id: Generated<string>;
  shop_id: string;
  resource_id: string;
  work_order_id: string;
  /** tstzrange, written with sql`tstzrange(...)`. */
  during: string;
  note: Generated<string>;
  booked_by: string;
  booked_at: DefaultTimestamp;
  /** Set only by the cancellation's trigger. */
  released_at: Date | null;
}

interface BookingCancellationsTable {
  id: Generated<string>;
  shop_id: string;
  booking_id: string;
  reason: string;
  cancelled_by: string;
  cancelled_at: DefaultTimestamp;
}

interface WorkOrderPromisesTable {
  id: Generated<string>;
  shop_id: string;
  work_order_id: string;
  promised_on: DateOnly;
  set_by: string;
  set_at: DefaultTimestamp;
}

export interface CalendarTables {
  shop_resources: ShopResourcesTable;
  resource_retirements: ResourceRetirementsTable;
  bookings: BookingsTable;
  booking_cancellations: BookingCancellationsTable;
  work_order_promises: WorkOrderPromisesTable;
}
