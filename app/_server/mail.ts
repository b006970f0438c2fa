import "server-only";
import nodemailer from "nodemailer";
import { recordEmail } from "@/db/office/emails";
import { officeConfig } from "./office-config";
import type { Db } from "@/db/setup/client";

interface OutgoingMail {
  shopId: string;
  workOrderId: string | null;
  kind: "quote_ready" | "deposit_received" | "bike_ready" | "review_needed";
  to: string;
  subject: string;
  text: string;
  attachments?: Array<{ filename: string; content: Buffer; contentType: string }>;
}

// Sends one e-mail over SMTP (maildev locally) and records it — or the failure — against the job.
// A mail failure never undoes the business change that caused it.
export async function sendMail(db: Db, m: OutgoingMail): Promise<{ ok: boolean; error?: string }> {
  const cfg = officeConfig();
  const transport = nodemailer.createTransport(cfg.SMTP_URL);
  try {
    const info = await transport.sendMail({ from: cfg.MAIL_FROM, to: m.to, subject: m.subject, text: m.text, attachments: m.attachments });
    await recordEmail(db, {
      shopId: m.shopId,
      workOrderId: m.workOrderId,
      kind: m.kind,
      recipient: m.to,
      subject: m.subject,
      messageId: info.messageId ?? null,
      error: null,
    });
    return { ok: true };
  } catch (e) {
    const error = (e as Error).message.slice(0, 500);
    await recordEmail(db, {
      shopId: m.shopId,
      workOrderId: m.workOrderId,
      kind: m.kind,
      recipient: m.to,
      subject: m.subject,
      messageId: null,
      error,
    });
    return { ok: false, error };
  } finally {
    transport.close();
  }
}
