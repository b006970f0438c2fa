import "server-only";
import { EXTRA_WORK_CAUSE_PREFIX, EXTRA_WORK_KIND, EXTRA_WORK_LINK_PLACEHOLDER } from "./extra-work-link";
import { emailContext, latestTransitionTo } from "@/db/office/emails";
import { overridesOf } from "@/db/records/status-overrides";
import { openItemLine } from "@/lib/work-orders/open-items";
import { isClosed, STATUS_LABELS } from "@/lib/work-orders/status";
import { formatMinor } from "@/lib/money/quote-totals";
import { ANSWER_LINK_DAYS } from "@/lib/office/extra-work";
import { queueMails } from "@/db/mail/outbox";
import { enqueueMails, type QueuedMail } from "./mail";
import { officeConfig } from "./office-config";
import type { Db } from "@/db/setup/client";

// The three e-mails a customer gets about a job, queued in the outbox and sent by the queue
// worker (app/_server/queue/). Each answers { ok: false } when the customer has no e-mail address
// on file (the work order page shows that nothing was sent).

type Queued = { ok: true; queued: boolean } | { ok: false; error: string };
/**
 * With `storedInto`: only stored in the outbox (in the caller's transaction), its id added to that
 * list; the caller hands it to the queue after committing.
 */
type QueueOptions = { storedInto?: string[] };
type Context = NonNullable<Awaited<ReturnType<typeof emailContext>>>;

async function queueForCustomer(
  db: Db,
  shopId: string,
  workOrderId: string,
  write: (c: Context) => Omit<QueuedMail, "shopId" | "workOrderId" | "to">,
  opts: QueueOptions = {},
): Promise<Queued> {
  const c = await emailContext(db, shopId, workOrderId);
  if (!c?.email) return { ok: false, error: "no e-mail address" };
  const mail = [{ shopId, workOrderId, to: c.email, ...write(c) }];
  const ids = opts.storedInto ? await queueMails(db, mail) : await enqueueMails(db, mail);
  opts.storedInto?.push(...ids);
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

export async function mailDepositReceived(
  db: Db,
  shopId: string,
  workOrderId: string,
  depositId: string,
  amountMinor: number,
  opts: QueueOptions = {},
) {
  return queueForCustomer(
    db,
    shopId,
    workOrderId,
    (c) => ({
      kind: "deposit_received",
      cause: `deposit:${depositId}`,
      subject: `Deposit received for work order ${c.number}`,
      // a payment confirmed after the job was closed (cancelled while the card was being charged): the money came, the work does not start
      text: isClosed(c.status)
        ? `Hello ${c.customerName},\n\nWe have received your deposit of ${formatMinor(amountMinor, c.currency)} for the ${c.make} ${c.model} (${c.tagCode}), but work order ${c.number} had already been closed (${STATUS_LABELS[c.status].toLowerCase()}): no work starts on it. We will be in touch to give the deposit back.\n\n${c.shopName}`
        : `Hello ${c.customerName},\n\nThank you: we have received your deposit of ${formatMinor(amountMinor, c.currency)} for the ${c.make} ${c.model} (${c.tagCode}). Work can start.\n\n${c.shopName}`,
    }),
    opts,
  );
}

export async function mailBalanceReceived(
  db: Db,
  shopId: string,
  workOrderId: string,
  paymentId: string,
  amountMinor: number,
  opts: QueueOptions = {},
) {
  return queueForCustomer(
    db,
    shopId,
    workOrderId,
    (c) => ({
      kind: "balance_received",
      cause: `balance:${paymentId}`,
      subject: `Receipt: bill for work order ${c.number} paid`,
      text: `Hello ${c.customerName},\n\nThank you: we have received ${formatMinor(amountMinor, c.currency)}, the balance of the bill for the ${c.make} ${c.model} (${c.tagCode}) — "${c.title}". Nothing more is due on it.\n\n${c.shopName}`,
    }),
    opts,
  );
}

/**
 * Extra work found on the bike: what it is, what it costs, and the one-time link to answer each
 * line (made by the queue worker as it sends the e-mail: ./extra-work-link.ts).
 */
export async function mailExtraWork(db: Db, shopId: string, workOrderId: string, supplementId: string, totalMinor: number) {
  const base = officeConfig().NEXTAUTH_URL;
  return queueForCustomer(db, shopId, workOrderId, (c) => ({
    kind: EXTRA_WORK_KIND,
    cause: `${EXTRA_WORK_CAUSE_PREFIX}${supplementId}`,
    subject: `Extra work found on your ${c.make} ${c.model} (work order ${c.number})`,
    text: `Hello ${c.customerName},\n\nWhile working on your ${c.make} ${c.model} (${c.tagCode}) we found something that needs more work: ${formatMinor(totalMinor, c.currency)} before tax. Please approve or decline each line — nothing is done without your yes.\n\nAnswer here (this link works once, for ${ANSWER_LINK_DAYS} days): ${EXTRA_WORK_LINK_PLACEHOLDER}\nOr sign in and answer on your page: ${base}/my-bikes\n\n${c.shopName}`,
  }));
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

/**
 * "Ready to collect", with the build report stored when the job passed the gate attached
 * (`reportKey`: storeReadyCopy, made in the move's own transaction).
 */
export async function mailBikeReady(db: Db, shopId: string, workOrderId: string, reportKey: string) {
  const moved = await latestTransitionTo(db, workOrderId, "ready");
  const notice = await overrideNotice(db, shopId, workOrderId);
  return queueForCustomer(db, shopId, workOrderId, (c) => ({
    kind: "bike_ready",
    cause: `ready:${moved ?? workOrderId}`,
    subject: `Your ${c.make} ${c.model} is ready to collect`,
    text: notice
      ? `Hello ${c.customerName},\n\nYour ${c.make} ${c.model} (${c.tagCode}) is ready to collect.\n\n${notice}The build report is attached.\n\n${c.shopName}`
      : `Hello ${c.customerName},\n\nThe work on your ${c.make} ${c.model} (${c.tagCode}) is done and the bike is ready to collect. The build report is attached.\n\n${c.shopName}`,
    attachment: { kind: "stored_report", key: reportKey },
  }));
}
