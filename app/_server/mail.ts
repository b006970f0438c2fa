import "server-only";
import nodemailer from "nodemailer";
import { claimMail, finishMail, queueMails, type QueuedMail } from "@/db/mail/outbox";
import { recordEmail } from "@/db/office/emails";
import { bikeReadyAttachment } from "./bike-ready-attachment";
import { getObject } from "./object-store";
import { EXTRA_WORK_KIND, withExtraWorkLink } from "./extra-work-link";
import { INVITATION_KIND, withInvitationLink } from "./invitation-link";
import { officeConfig } from "./office-config";
import { appBoss } from "./queue/boss";
import { QUEUES } from "./queue/names";
import type { Db } from "@/db/setup/client";
import type PgBoss from "pg-boss";

export type { QueuedMail };

/**
 * Stores the e-mails in the outbox and hands each to the queue (job id = the e-mail's id, so
 * handing one on twice makes one job). Nothing is sent here: a queue worker sends it. When the
 * queue cannot be reached the e-mail stays in the outbox and the every-minute sweep hands it on.
 */
export async function enqueueMails(db: Db, mails: QueuedMail[], boss?: PgBoss): Promise<string[]> {
  const ids = await queueMails(db, mails);
  await handToQueue(ids, boss).catch((e) => console.error("[mail] queue not reached; the sweep will hand the e-mail on", e));
  return ids;
}

/**
 * A job for each e-mail. The first hand-on uses the e-mail's id as the job id (twice makes one
 * job); `again` (the office's "try again", the sweep of e-mails with no live job) makes a new job,
 * since the old one is still on file as failed.
 */
export async function handToQueue(ids: string[], boss?: PgBoss, again = false): Promise<void> {
  if (!ids.length) return;
  const b = boss ?? (await appBoss());
  for (const id of ids) await b.send(QUEUES.mail, { mailId: id }, again ? {} : { id });
}

/**
 * The queue worker's send of one e-mail: claims it (a second worker holding a job for the same
 * e-mail finds it taken and does nothing), sends it over SMTP (maildev locally) and records the
 * attempt. A failed send throws, so pg-boss tries again after its back-off; on the last allowed
 * try (`final`) the e-mail is marked failed and shows on the office's outbox page.
 */
export async function deliverQueuedMail(db: Db, mailId: string, final: boolean): Promise<"sent" | "not-mine"> {
  const m = await claimMail(db, mailId);
  if (!m) return "not-mine";
  const cfg = officeConfig();
  const transport = nodemailer.createTransport(cfg.SMTP_URL);
  const log = { shopId: m.shopId, workOrderId: m.workOrderId, kind: m.kind, recipient: m.to, subject: m.subject };
  try {
    // the report as stored when the job passed its gate; an e-mail queued before copies were stored makes it now
    const report =
      m.attachment === "stored_report" && m.attachmentKey
        ? Buffer.from((await getObject(m.attachmentKey)).body)
        : m.attachment === "handover_report" && m.workOrderId
          ? await bikeReadyAttachment(db, m.shopId, m.workOrderId)
          : null;
    const attachments =
      report && m.workOrderId
        ? [
            {
              filename: `work-order-${await workOrderNumber(db, m.workOrderId)}-handover.pdf`,
              content: report,
              contentType: "application/pdf",
            },
          ]
        : undefined;
    const text =
      m.kind === INVITATION_KIND
        ? await withInvitationLink(db, m.cause, m.text)
        : m.kind === EXTRA_WORK_KIND
          ? await withExtraWorkLink(db, m.cause, m.text)
          : m.text;
    const info = await transport.sendMail({ from: cfg.MAIL_FROM, to: m.to, subject: m.subject, text, attachments });
    await finishMail(db, m.id, { sent: true, messageId: info.messageId ?? null });
    await recordEmail(db, { ...log, messageId: info.messageId ?? null, error: null });
    return "sent";
  } catch (e) {
    const error = (e as Error).message.slice(0, 500);
    await recordEmail(db, { ...log, messageId: null, error });
    await finishMail(db, m.id, { sent: false, error, final });
    throw e;
  } finally {
    transport.close();
  }
}

async function workOrderNumber(db: Db, id: string): Promise<number> {
  const w = await db.selectFrom("work_orders").select("number").where("id", "=", id).executeTakeFirstOrThrow();
  return w.number;
}
