import type { Generated } from "kysely";
import type { DepositStatus, NoteKind, QuoteLineKind, QuoteStatus } from "@/lib/office/schemas";
import type { DefaultTimestamp, Timestamp } from "./columns";

// Table types for the office side (migration 2026_12_02_003_office).

interface WorkOrderNotesTable {
  id: Generated<string>;
  shop_id: string;
  work_order_id: string;
  kind: NoteKind;
  body: string;
  author_id: string | null;
  created_at: DefaultTimestamp;
}

interface QuotesTable {
  id: Generated<string>;
  shop_id: string;
  work_order_id: string;
  version: number;
  status: QuoteStatus;
  currency: string;
  tax_rate_bp: number;
  subtotal_minor: Generated<number>;
  tax_minor: Generated<number>;
  total_minor: Generated<number>;
  deposit_minor: Generated<number>;
  note: Generated<string>;
  created_by: string | null;
  created_at: DefaultTimestamp;
  sent_at: Timestamp | null;
  approved_at: Timestamp | null;
  approved_by: string | null;
}

interface QuoteLinesTable {
  id: Generated<string>;
  quote_id: string;
  position: number;
  kind: QuoteLineKind;
  description: string;
  part_number: string | null;
  quantity_hundredths: number;
  unit_price_minor: number;
  line_total_minor: number;
}

interface DepositsTable {
  id: Generated<string>;
  shop_id: string;
  work_order_id: string;
  quote_id: string;
  amount_minor: number;
  currency: string;
  payment_intent_id: string | null;
  status: DepositStatus;
  created_at: DefaultTimestamp;
  paid_at: Timestamp | null;
  /** How much of it the provider gave back (migration 190); all of it: status 'refunded'. */
  refunded_minor: Generated<number>;
}

/** Money the provider took that the shop must give back, until the provider reports the refund (migration 210). */
interface MoneyToGiveBackTable {
  id: Generated<string>;
  shop_id: string;
  work_order_id: string;
  payment_for: "deposit" | "balance";
  payment_id: string;
  payment_intent_id: string;
  amount_minor: number;
  currency: string;
  reason: string;
  recorded_at: DefaultTimestamp;
  given_back_minor: Generated<number>;
  given_back_at: Timestamp | null;
}

interface PaymentEventsTable {
  event_id: string;
  type: string;
  payment_intent_id: string | null;
  received_at: DefaultTimestamp;
}

interface OutboundEmailsTable {
  id: Generated<string>;
  shop_id: string;
  work_order_id: string | null;
  kind: string;
  recipient: string;
  subject: string;
  message_id: string | null;
  error: string | null;
  sent_at: DefaultTimestamp;
}

interface InvoicesTable {
  id: Generated<string>;
  shop_id: string;
  work_order_id: string;
  quote_id: string;
  number: number;
  currency: string;
  subtotal_minor: number;
  tax_minor: number;
  total_minor: number;
  deposits_paid_minor: number;
  balance_due_minor: number;
  /** Filled on bills issued from migration 2026_12_06_110 on. */
  tax_rate_bp: number | null;
  clocked_hundredths: number | null;
  created_by: string | null;
  created_at: DefaultTimestamp;
}

export interface OfficeTables {
  work_order_notes: WorkOrderNotesTable;
  quotes: QuotesTable;
  quote_lines: QuoteLinesTable;
  deposits: DepositsTable;
  payment_events: PaymentEventsTable;
  money_to_give_back: MoneyToGiveBackTable;
  outbound_emails: OutboundEmailsTable;
  invoices: InvoicesTable;
}
