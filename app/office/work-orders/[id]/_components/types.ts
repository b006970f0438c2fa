// The shape GET /api/office/work-orders/[id] answers with (dates arrive as ISO strings).
export interface QuoteLine {
  id: string;
  position: number;
  kind: "part" | "labour";
  description: string;
  part_number: string | null;
  quantity_hundredths: number;
  unit_price_minor: number;
  line_total_minor: number;
}
export interface Quote {
  id: string;
  version: number;
  status: "draft" | "sent" | "approved" | "superseded";
  currency: string;
  tax_rate_bp: number;
  subtotal_minor: number;
  tax_minor: number;
  total_minor: number;
  deposit_minor: number;
  note: string;
  sent_at: string | null;
  approved_at: string | null;
  lines: QuoteLine[];
  deposits: Array<{ id: string; amountMinor: number; status: string; paidAt: string | null; paymentIntentId: string | null }>;
}
export interface WorkOrderData {
  workOrder: {
    id: string;
    number: number;
    title: string;
    status: string;
    complaint: string;
    odometerKm: number | null;
    mechanicId: string | null;
    mechanicName: string | null;
    bikeId: string;
    make: string;
    model: string;
    year: number | null;
    tagCode: string;
    customerId: string;
    customerName: string;
    customerEmail: string | null;
    customerPhone: string | null;
    transitions: Array<{ id: string; from: string | null; to: string; note: string; at: string; byName: string | null }>;
    notes: Array<{ id: string; kind: string; body: string; at: string; authorName: string | null }>;
    photos: Array<{ id: string; purpose: string; noteId: string | null; caption: string }>;
    procedures: Array<{ id: string; position: number; key: string; name: string; version: number }>;
    parts: Array<{ id: string; partNumber: string; description: string; supplier: string; serial: string | null; batch: string | null; quantity: number; fittedAt: string; stepTitle: string | null; fittedByName: string | null; atBench: boolean; flagReason: string | null }>;
    emails: Array<{ id: string; kind: string; recipient: string; subject: string; error: string | null; at: string }>;
  };
  next: string[];
  quotes: Quote[];
  invoice: { number: number; currency: string; subtotal_minor: number; tax_minor: number; total_minor: number; deposits_paid_minor: number; balance_due_minor: number } | null;
  mechanics: Array<{ id: string; name: string }>;
  templates: Array<{ versionId: string; key: string; name: string; version: number; exampleOnly: boolean }>;
  steps: Array<{ id: string; title: string; stageTitle: string; position: number }>;
}
