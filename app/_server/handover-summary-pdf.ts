import PDFDocument from "pdfkit";
import type { Kysely } from "kysely";
import { formatMinor } from "@/lib/money/quote-totals";
import { STATUS_LABELS, type WorkOrderStatus } from "@/lib/work-orders/status";
import type { Database } from "@/db/schema";

// A stand-in for the full handover report (renderHandoverReportPdf in handover-report.ts, written
// elsewhere): a one-page summary of the job — bike, work done, parts fitted, invoice figures.
// Same signature, so bike-ready-attachment.ts can switch to the full report with one line.
export async function renderHandoverSummaryPdf(db: Kysely<Database>, shopId: string, workOrderId: string): Promise<Buffer> {
  const wo = await db
    .selectFrom("work_orders as w")
    .innerJoin("bikes as b", "b.id", "w.bike_id")
    .innerJoin("customers as c", "c.id", "b.customer_id")
    .innerJoin("shops as s", "s.id", "w.shop_id")
    .select(["w.number", "w.title", "w.status", "w.complaint", "w.intake_odometer_km as odo", "b.make", "b.model", "b.year", "b.tag_code as tag", "c.name as customer", "s.name as shop", "s.currency"])
    .where("w.id", "=", workOrderId)
    .where("w.shop_id", "=", shopId)
    .executeTakeFirstOrThrow();
  const parts = await db.selectFrom("parts_fitted").select(["part_number", "description", "serial", "batch", "quantity"]).where("work_order_id", "=", workOrderId).orderBy("fitted_at").execute();
  const procs = await db
    .selectFrom("job_procedures as j")
    .innerJoin("template_versions as v", "v.id", "j.template_version_id")
    .select(["v.name", "v.version"])
    .where("j.work_order_id", "=", workOrderId)
    .orderBy("j.position")
    .execute();
  const invoice = await db.selectFrom("invoices").selectAll().where("work_order_id", "=", workOrderId).executeTakeFirst();

  const doc = new PDFDocument({ size: "A4", margin: 50, info: { Title: `Work order ${wo.number} summary` } });
  const chunks: Buffer[] = [];
  doc.on("data", (c: Buffer) => chunks.push(c));
  const done = new Promise<Buffer>((resolve, reject) => {
    doc.on("end", () => resolve(Buffer.concat(chunks)));
    doc.on("error", reject);
  });
  doc.fontSize(18).text(`${wo.shop}`, { continued: false });
  doc.fontSize(14).text(`Handover summary — work order ${wo.number}`);
  doc.moveDown();
  doc.fontSize(11);
  doc.text(`Bike: ${wo.make} ${wo.model}${wo.year ? ` (${wo.year})` : ""}, tag ${wo.tag}`);
  doc.text(`Customer: ${wo.customer}`);
  doc.text(`Job: ${wo.title}`);
  doc.text(`Status: ${STATUS_LABELS[wo.status as WorkOrderStatus] ?? wo.status}`);
  if (wo.odo !== null) doc.text(`Odometer at intake: ${wo.odo} km`);
  doc.text(`Complaint or goal: ${wo.complaint}`);
  doc.moveDown();
  doc.fontSize(13).text("Procedures followed");
  doc.fontSize(11);
  if (!procs.length) doc.text("None recorded.");
  for (const p of procs) doc.text(`• ${p.name} (template version ${p.version})`);
  doc.moveDown();
  doc.fontSize(13).text("Parts fitted");
  doc.fontSize(11);
  if (!parts.length) doc.text("None recorded.");
  for (const p of parts) doc.text(`• ${p.quantity} × ${p.part_number} ${p.description}${p.serial ? `, serial ${p.serial}` : ""}${p.batch ? `, batch ${p.batch}` : ""}`);
  if (invoice) {
    doc.moveDown();
    doc.fontSize(13).text(`Invoice ${invoice.number}`);
    doc.fontSize(11);
    doc.text(`Subtotal ${formatMinor(invoice.subtotal_minor, invoice.currency)}, tax ${formatMinor(invoice.tax_minor, invoice.currency)}, total ${formatMinor(invoice.total_minor, invoice.currency)}`);
    doc.text(`Deposit paid ${formatMinor(invoice.deposits_paid_minor, invoice.currency)}; balance due ${formatMinor(invoice.balance_due_minor, invoice.currency)}`);
  }
  doc.moveDown();
  doc.fontSize(9).text("Run-in: follow the run-in advice your mechanic gave you; the engine maker's service data comes first.");
  doc.end();
  return done;
}
