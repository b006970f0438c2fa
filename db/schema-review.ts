import type { ColumnType, Generated } from "kysely";

// Table types for supervisor review (migration 2026_12_02_005_review).
type Timestamp = ColumnType<Date, Date | string | undefined, Date | string>;

/** A supervisor's written acceptance of an out-of-tolerance reading (append-only). */
export interface ReadingAcceptancesTable {
  id: Generated<string>;
  shop_id: string;
  measurement_id: string;
  decision_id: string;
  justification: string;
  accepted_by: string;
  accepted_at: Generated<Timestamp>;
}

/** The e-mail intent a sign-off leaves (filled by a trigger on sign_offs). */
export interface ReviewNoticesTable {
  id: Generated<string>;
  shop_id: string;
  sign_off_id: string;
  work_order_id: string;
  state: Generated<"waiting" | "sending" | "sent" | "not_needed" | "failed">;
  attempts: Generated<number>;
  claimed_at: Timestamp | null;
  last_error: string | null;
  created_at: Generated<Timestamp>;
  done_at: Timestamp | null;
}

export interface ReviewTables {
  reading_acceptances: ReadingAcceptancesTable;
  review_notices: ReviewNoticesTable;
}
