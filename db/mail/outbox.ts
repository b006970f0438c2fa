import "server-only";
import { sql, type Kysely } from "kysely";
import type { Database } from "../schema";
import type { MailAttachment } from "../schema/mail";

// The e-mail outbox (table mail_outbox). A row is stored by the request that causes the e-mail;
// a queue worker claims it, sends it and marks it. The claim is one UPDATE on the row, so two
// workers (two app instances) that both hold a job for it never both send it.

const CLAIM_STALE_MS = 5 * 60_000;

export interface QueuedMail {
  shopId: string;
  workOrderId: string | null;
  kind: string;
  /** What the e-mail is about; the same cause and recipient is queued once. */
  cause: string;
  to: string;
  subject: string;
  text: string;
  /** A stored PDF (`attachmentKey`, its object key) attached when sent. */
  attachment?: { kind: "stored_report"; key: string } | null;
}

/** Stores the e-mails; answers the ids of those newly queued (one already queued for the cause is left as it is). */
export async function queueMails(db: Kysely<Database>, mails: QueuedMail[]): Promise<string[]> {
  if (!mails.length) return [];
  const rows = await db
    .insertInto("mail_outbox")
    .values(
      mails.map((m) => ({
        shop_id: m.shopId,
        work_order_id: m.workOrderId,
        kind: m.kind,
        cause: m.cause,
        recipient: m.to,
        subject: m.subject,
        body: m.text,
        attachment: m.attachment?.kind ?? null,
        attachment_key: m.attachment?.key ?? null,
      })),
    )
    .onConflict((oc) => oc.constraint("mail_outbox_once").doNothing())
    .returning("id")
    .execute();
  return rows.map((r) => r.id);
}

export interface ClaimedMail {
  id: string;
  shopId: string;
  cause: string;
  workOrderId: string | null;
  kind: string;
  to: string;
  subject: string;
  text: string;
  attachment: MailAttachment | null;
  attachmentKey: string | null;
  attempts: number;
}

/** Takes the e-mail for sending, or answers null when it is sent, failed for good, or being sent by another worker. */
export async function claimMail(db: Kysely<Database>, id: string): Promise<ClaimedMail | null> {
  const r = await sql<{
    id: string;
    shop_id: string;
    cause: string;
    work_order_id: string | null;
    kind: string;
    recipient: string;
    subject: string;
    body: string;
    attachment: MailAttachment | null;
    attachment_key: string | null;
    attempts: number;
  }>`
    UPDATE mail_outbox SET state = 'sending', attempts = attempts + 1, claimed_at = now()
    WHERE id = ${id}
      AND (state = 'queued' OR (state = 'sending' AND claimed_at < now() - make_interval(secs => ${CLAIM_STALE_MS / 1000})))
    RETURNING id, shop_id, cause, work_order_id, kind, recipient, subject, body, attachment, attachment_key, attempts
  `.execute(db);
  const m = r.rows[0];
  if (!m) return null;
  return {
    id: m.id,
    shopId: m.shop_id,
    cause: m.cause,
    workOrderId: m.work_order_id,
    kind: m.kind,
    to: m.recipient,
    subject: m.subject,
    text: m.body,
    attachment: m.attachment,
    attachmentKey: m.attachment_key,
    attempts: m.attempts,
  };
}

/** Marks a claimed e-mail sent, or back to queued (another try is coming) or failed (none is). */
export async function finishMail(
  db: Kysely<Database>,
  id: string,
  outcome: { sent: true; messageId: string | null } | { sent: false; error: string; final: boolean },
): Promise<void> {
  await db
    .updateTable("mail_outbox")
    .set(
      outcome.sent
        ? { state: "sent", sent_at: new Date(), message_id: outcome.messageId, last_error: null }
        : { state: outcome.final ? "failed" : "queued", last_error: outcome.error.slice(0, 500) },
    )
    .where("id", "=", id)
    .where("state", "=", "sending")
    .execute();
}

/**
 * E-mails with no live job (created, waiting for a retry, or running) in the queue's table, left
 * waiting: queued longer than `olderThanMs` (their job was lost, e.g. the process stopped before
 * handing it on), or claimed for sending longer ago than a claim is trusted (the worker stopped
 * between claiming and finishing, and its job expired and ended "not mine"). Such a claim is
 * taken again by the next job (`claimMail`), so the e-mail goes out rather than waiting for ever;
 * a worker that stopped after the SMTP server took it but before it was marked sent means it goes
 * out twice, the lesser harm.
 */
export async function strandedMails(db: Kysely<Database>, olderThanMs: number, limit = 200): Promise<string[]> {
  const r = await sql<{ id: string }>`
    SELECT m.id FROM mail_outbox m
    WHERE ((m.state = 'queued' AND m.queued_at < ${new Date(Date.now() - olderThanMs)})
        OR (m.state = 'sending' AND m.claimed_at < now() - make_interval(secs => ${CLAIM_STALE_MS / 1000})))
      AND NOT EXISTS (
        SELECT 1 FROM pgboss.job j
        WHERE j.name = 'mail-send' AND j.data->>'mailId' = m.id::text AND j.state IN ('created', 'retry', 'active')
      )
    ORDER BY m.queued_at LIMIT ${limit}
  `.execute(db);
  return r.rows.map((m) => m.id);
}

/** The office's "try again" on an e-mail that failed for good: queued once more. */
export async function requeueFailedMail(db: Kysely<Database>, shopId: string, id: string): Promise<boolean> {
  const r = await db
    .updateTable("mail_outbox")
    .set({ state: "queued", last_error: null })
    .where("id", "=", id)
    .where("shop_id", "=", shopId)
    .where("state", "=", "failed")
    .executeTakeFirst();
  return Number(r.numUpdatedRows) === 1;
}

/** The office's list: e-mails not yet sent (waiting, being sent, failed), newest first, and the last sent ones. */
export async function outboxForOffice(db: Kysely<Database>, shopId: string, limit = 100) {
  const base = db
    .selectFrom("mail_outbox as m")
    .leftJoin("work_orders as w", "w.id", "m.work_order_id")
    .select([
      "m.id",
      "m.kind",
      "m.recipient",
      "m.subject",
      "m.state",
      "m.attempts",
      "m.last_error as lastError",
      "m.queued_at as queuedAt",
      "m.sent_at as sentAt",
      "w.id as workOrderId",
      "w.number as workOrderNumber",
    ])
    .where("m.shop_id", "=", shopId);
  const [open, sent] = await Promise.all([
    base.where("m.state", "<>", "sent").orderBy("m.queued_at", "desc").limit(limit).execute(),
    base.where("m.state", "=", "sent").orderBy("m.sent_at", "desc").limit(20).execute(),
  ]);
  return { open, sent };
}
