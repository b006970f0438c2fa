import "server-only";
import { emailContext, latestTransitionTo } from "@/db/office/emails";
import { formatMinor } from "@/lib/money/quote-totals";
import { enqueueMails, type QueuedMail } from "./mail";
import { officeConfig } from "./office-config";
import type { Db } from "@/db/setup/client";

// The three e-mails a customer gets about a job, queued in the outbox and sent by the queue
// worker (app/_server/queue/). Each answers { ok: false } when the customer has no e-mail address
// on file (the work order page shows that nothing was sent).

type Queued = { ok: true; queued: boolean } | { ok: false; error: string };
type Context = NonNullable<Awaited<ReturnType<typeof emailContext>>>;

async function queueForCustomer(
  db: Db,
  shopId: string,
  workOrderId: string,
  write: (c: Context) => Omit<QueuedMail, "shopId" | "workOrderId" | "to">,
): Promise<Queued> {
  const c = await emailContext(db, shopId, workOrderId);
  if (!c?.email) return { ok: false, error: "no e-mail address" };
  const ids = await enqueueMails(db, [{ shopId, workOrderId, to: c.email, ...write(c) }]);
  return { ok: true, queued: ids.length > 0 };
}

export async function mailQuoteReady(
  db: Db,
  shopId: string,
  workOrderId: string,
  quoteId: string,
  totalMinor: number,
  depositMinor: number,
) {
  const link = `${officeConfig().NEXTAUTH_URL}/my-bikes`;
  return queueForCustomer(db, shopId, workOrderId, (c) => ({
    kind: "quote_ready",
    cause: `quote:${quoteId}`,
    subject: `Your quote for work order ${c.number} is ready`,
    text: `Hello ${c.customerName},\n\nYour quote for the ${c.make} ${c.model} (${c.tagCode}) — "${c.title}" — is ready: ${formatMinor(totalMinor, c.currency)} including tax${depositMinor ? `, with a deposit of ${formatMinor(depositMinor, c.currency)}` : ""}.\n\nSign in to look at it and approve it: ${link}\n\n${c.shopName}`,
  }));
}

export async function mailDepositReceived(db: Db, shopId: string, workOrderId: string, depositId: string, amountMinor: number) {
  return queueForCustomer(db, shopId, workOrderId, (c) => ({
    kind: "deposit_received",
    cause: `deposit:${depositId}`,
    subject: `Deposit received for work order ${c.number}`,
    text: `Hello ${c.customerName},\n\nThank you: we have received your deposit of ${formatMinor(amountMinor, c.currency)} for the ${c.make} ${c.model} (${c.tagCode}). Work can start.\n\n${c.shopName}`,
  }));
}

/** The build report PDF is made when the e-mail is sent (attachment "handover_report"). */
export async function mailBikeReady(db: Db, shopId: string, workOrderId: string) {
  const moved = await latestTransitionTo(db, workOrderId, "ready");
  return queueForCustomer(db, shopId, workOrderId, (c) => ({
    kind: "bike_ready",
    cause: `ready:${moved ?? workOrderId}`,
    subject: `Your ${c.make} ${c.model} is ready to collect`,
    text: `Hello ${c.customerName},\n\nThe work on your ${c.make} ${c.model} (${c.tagCode}) is done and the bike is ready to collect. The build report is attached.\n\n${c.shopName}`,
    attachment: "handover_report",
  }));
}
