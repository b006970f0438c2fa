import "server-only";
import { emailContext } from "@/db/office/emails";
import { overridesOf } from "@/db/records/status-overrides";
import { openItemLine } from "@/lib/work-orders/open-items";
import { formatMinor } from "@/lib/money/quote-totals";
import { bikeReadyAttachment } from "./bike-ready-attachment";
import { sendMail } from "./mail";
import { officeConfig } from "./office-config";
import type { Db } from "@/db/setup/client";

// The three e-mails a customer gets about a job. Each returns quietly when the customer has no
// e-mail address on file (the work order page shows that nothing was sent).

export async function mailQuoteReady(db: Db, shopId: string, workOrderId: string, totalMinor: number, depositMinor: number) {
  const c = await emailContext(db, shopId, workOrderId);
  if (!c?.email) return { ok: false, error: "no e-mail address" };
  const link = `${officeConfig().NEXTAUTH_URL}/my-bikes`;
  return sendMail(db, {
    shopId,
    workOrderId,
    kind: "quote_ready",
    to: c.email,
    subject: `Your quote for work order ${c.number} is ready`,
    text: `Hello ${c.customerName},\n\nYour quote for the ${c.make} ${c.model} (${c.tagCode}) — "${c.title}" — is ready: ${formatMinor(totalMinor, c.currency)} including tax${depositMinor ? `, with a deposit of ${formatMinor(depositMinor, c.currency)}` : ""}.\n\nSign in to look at it and approve it: ${link}\n\n${c.shopName}`,
  });
}

export async function mailDepositReceived(db: Db, shopId: string, workOrderId: string, amountMinor: number) {
  const c = await emailContext(db, shopId, workOrderId);
  if (!c?.email) return { ok: false, error: "no e-mail address" };
  return sendMail(db, {
    shopId,
    workOrderId,
    kind: "deposit_received",
    to: c.email,
    subject: `Deposit received for work order ${c.number}`,
    text: `Hello ${c.customerName},\n\nThank you: we have received your deposit of ${formatMinor(amountMinor, c.currency)} for the ${c.make} ${c.model} (${c.tagCode}). Work can start.\n\n${c.shopName}`,
  });
}

/**
 * What the customer must be told when the office moved the job on with items open: said plainly,
 * with who decided, why, and what was open. Empty when there was no override.
 */
async function overrideNotice(db: Db, shopId: string, workOrderId: string): Promise<string> {
  const overrides = await overridesOf(db, shopId, workOrderId);
  if (overrides.length === 0) return "";
  return overrides
    .map(
      (o) =>
        `Please note: your bike was ${o.to === "ready" ? "released for collection" : "handed over"} with work on its record not finished or not checked by our supervisor. ${o.byName} decided this on ${o.at.toISOString().slice(0, 10)} and wrote why: "${o.reason}"\nOpen at that moment:\n${o.openItems.map((i) => `- ${openItemLine(i)}`).join("\n")}\nThe build report says the same on its first page. Ask us about anything on this list.\n\n`,
    )
    .join("");
}

export async function mailBikeReady(db: Db, shopId: string, workOrderId: string) {
  const c = await emailContext(db, shopId, workOrderId);
  if (!c?.email) return { ok: false, error: "no e-mail address" };
  const pdf = await bikeReadyAttachment(db, shopId, workOrderId);
  const notice = await overrideNotice(db, shopId, workOrderId);
  return sendMail(db, {
    shopId,
    workOrderId,
    kind: "bike_ready",
    to: c.email,
    subject: `Your ${c.make} ${c.model} is ready to collect`,
    text: notice
      ? `Hello ${c.customerName},\n\nYour ${c.make} ${c.model} (${c.tagCode}) is ready to collect.\n\n${notice}The build report is attached.\n\n${c.shopName}`
      : `Hello ${c.customerName},\n\nThe work on your ${c.make} ${c.model} (${c.tagCode}) is done and the bike is ready to collect. The build report is attached.\n\n${c.shopName}`,
    attachments: [{ filename: `work-order-${c.number}-handover.pdf`, content: pdf, contentType: "application/pdf" }],
  });
}
