import type { Generated } from "kysely";
import type { DefaultTimestamp, Timestamp } from "./columns";

// Table types for the e-mail outbox (migration 2026_12_04_060_mail_outbox).

export type MailState = "queued" | "sending" | "sent" | "failed";
export type MailAttachment = "handover_report" | "stored_report";

interface MailOutboxTable {
  id: Generated<string>;
  shop_id: string;
  work_order_id: string | null;
  kind: string;
  cause: string;
  recipient: string;
  subject: string;
  body: string;
  /** 'handover_report': made when sent (e-mails queued before migration 220); 'stored_report': the stored PDF at `attachment_key`. */
  attachment: MailAttachment | null;
  attachment_key: string | null;
  state: Generated<MailState>;
  attempts: Generated<number>;
  last_error: string | null;
  message_id: string | null;
  queued_at: DefaultTimestamp;
  claimed_at: Timestamp | null;
  sent_at: Timestamp | null;
}

export interface MailTables {
  mail_outbox: MailOutboxTable;
}
