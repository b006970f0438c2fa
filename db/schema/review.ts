import type { ColumnType, Generated } from "kysely";
import type { ReviewDecision } from "@/lib/review/decision-input";
import type { DefaultTimestamp, Timestamp } from "./columns";

// Table types for supervisor review (review_decisions: migration 001; the rest: 2026_12_02_005_review).

interface ReviewDecisionsTable {
  id: Generated<string>;
  sign_off_id: string;
  decision: ReviewDecision;
  reason: Generated<string>;
  reopened_step_ids: ColumnType<string[], string[] | undefined, string[]>;
  decided_by: string;
  decided_at: DefaultTimestamp;
  /** Place in the change sequence shared with operations.seq (set by a trigger; migration 002). */
  change_seq: Generated<number>;
}

/** A supervisor's written acceptance of an out-of-tolerance reading (append-only). */
interface ReadingAcceptancesTable {
  id: Generated<string>;
  shop_id: string;
  measurement_id: string;
  decision_id: string;
  justification: string;
  accepted_by: string;
  accepted_at: DefaultTimestamp;
}

/** A supervisor's written acceptance of one flagged bench entry, made with a decision (append-only; migration 020). */
interface FlagAcceptancesTable {
  id: Generated<string>;
  shop_id: string;
  operation_id: string;
  /** The decision it was made with; null when accepted on its own (a closed job's entry with no sign-off to decide on). */
  decision_id: string | null;
  justification: string;
  accepted_by: string;
  accepted_at: DefaultTimestamp;
}

/** The e-mail intent a sign-off leaves (filled by a trigger on sign_offs). */
interface ReviewNoticesTable {
  id: Generated<string>;
  shop_id: string;
  sign_off_id: string;
  work_order_id: string;
  state: Generated<"waiting" | "sending" | "sent" | "not_needed" | "failed">;
  attempts: Generated<number>;
  claimed_at: Timestamp | null;
  last_error: string | null;
  created_at: DefaultTimestamp;
  done_at: Timestamp | null;
}

/** A stage waiting for review (derived, kept by triggers; migration 2026_12_06_130_review_waiting). */
interface ReviewWaitingTable {
  job_procedure_id: string;
  stage_key: string;
  shop_id: string;
  work_order_id: string;
  sign_off_id: string;
  /** Current readings of the stage out of tolerance that nobody has let stand. */
  out_of_tolerance: number;
}

export interface ReviewTables {
  review_decisions: ReviewDecisionsTable;
  reading_acceptances: ReadingAcceptancesTable;
  flag_acceptances: FlagAcceptancesTable;
  review_notices: ReviewNoticesTable;
  review_waiting: ReviewWaitingTable;
}
