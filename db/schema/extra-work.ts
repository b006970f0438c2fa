import type { Generated } from "kysely";
import type { BillAnswer, LabourBasis } from "@/lib/money/final-bill";
import type { DepositStatus, QuoteLineKind } from "@/lib/office/schemas";
import type { DefaultTimestamp, Timestamp } from "./columns";

// Extra work, the customer's answers and the final bill (migration 2026_12_06_110). Append-only
// except balance_payments' status (as deposits').

interface SupplementsTable {
  id: Generated<string>;
  shop_id: string;
  work_order_id: string;
  number: number;
  finding: string;
  currency: string;
  created_by: string;
  created_at: DefaultTimestamp;
}

interface SupplementLinesTable {
  id: Generated<string>;
  supplement_id: string;
  position: number;
  kind: QuoteLineKind;
  description: string;
  part_number: string | null;
  quantity_hundredths: number;
  unit_price_minor: number;
  line_total_minor: number;
}

interface SupplementPhotosTable {
  supplement_id: string;
  attachment_id: string;
}

interface SupplementLinksTable {
  id: Generated<string>;
  shop_id: string;
  supplement_id: string;
  customer_id: string;
  token_sha256: string;
  expires_at: Timestamp;
  created_at: DefaultTimestamp;
}

interface SupplementLinkUsesTable {
  link_id: string;
  used_at: DefaultTimestamp;
}

interface SupplementDecisionsTable {
  id: Generated<string>;
  shop_id: string;
  work_order_id: string;
  supplement_line_id: string;
  decision: "approved" | "declined";
  comment: string;
  decided_by: string | null;
  supplement_link_id: string | null;
  decided_at: DefaultTimestamp;
}

interface QuoteDeclinesTable {
  quote_id: string;
  declined_by: string;
  comment: string;
  declined_at: DefaultTimestamp;
}

interface InvoiceLinesTable {
  id: Generated<string>;
  invoice_id: string;
  position: number;
  source: "quote" | "supplement" | "fitted_part";
  quote_line_id: string | null;
  supplement_line_id: string | null;
  part_fitted_id: string | null;
  kind: QuoteLineKind;
  description: string;
  part_number: string | null;
  answer: BillAnswer;
  labour_basis: LabourBasis | null;
  quoted_hundredths: number;
  clocked_hundredths: number | null;
  quantity_hundredths: number;
  unit_price_minor: number;
  line_total_minor: number;
  counted: boolean;
}

interface BalancePaymentsTable {
  id: Generated<string>;
  shop_id: string;
  work_order_id: string;
  invoice_id: string;
  amount_minor: number;
  currency: string;
  payment_intent_id: string | null;
  status: DepositStatus;
  created_at: DefaultTimestamp;
  paid_at: Timestamp | null;
  /** How much of it the provider gave back (migration 190); all of it: status 'refunded'. */
  refunded_minor: Generated<number>;
}

export interface ExtraWorkTables {
  supplements: SupplementsTable;
  supplement_lines: SupplementLinesTable;
  supplement_photos: SupplementPhotosTable;
  supplement_links: SupplementLinksTable;
  supplement_link_uses: SupplementLinkUsesTable;
  supplement_decisions: SupplementDecisionsTable;
  quote_declines: QuoteDeclinesTable;
  invoice_lines: InvoiceLinesTable;
  balance_payments: BalancePaymentsTable;
}
