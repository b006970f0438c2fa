import type { Generated } from "kysely";
import type { DefaultTimestamp, Timestamp } from "./columns";

// Invitations, the message thread of a work order and progress updates (migration 2026_12_06_120).

interface CustomerInvitationsTable {
  id: Generated<string>;
  shop_id: string;
  user_id: string;
  invited_by: string;
  invited_at: DefaultTimestamp;
}

interface InvitationLinksTable {
  id: Generated<string>;
  shop_id: string;
  invitation_id: string;
  user_id: string;
  /** SHA-256 of the link's token; the token itself is only ever in the e-mail. */
  token_sha256: Buffer;
  made_at: DefaultTimestamp;
  expires_at: Timestamp;
}

interface InvitationUsesTable {
  link_id: string;
  used_at: DefaultTimestamp;
}

interface WorkOrderMessagesTable {
  id: Generated<string>;
  shop_id: string;
  work_order_id: string;
  author_id: string;
  from_customer: boolean;
  body: string;
  written_at: DefaultTimestamp;
}

interface ProgressUpdatesTable {
  id: Generated<string>;
  shop_id: string;
  work_order_id: string;
  note: string;
  posted_by: string;
  posted_at: DefaultTimestamp;
}

interface ProgressUpdatePhotosTable {
  update_id: string;
  attachment_id: string;
  position: number;
}

export interface CustomerContactTables {
  customer_invitations: CustomerInvitationsTable;
  invitation_links: InvitationLinksTable;
  invitation_uses: InvitationUsesTable;
  work_order_messages: WorkOrderMessagesTable;
  progress_updates: ProgressUpdatesTable;
  progress_update_photos: ProgressUpdatePhotosTable;
}
