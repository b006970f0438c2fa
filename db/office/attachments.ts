import "server-only";
import type { Kysely } from "kysely";
import type { Database } from "../schema";

// Intake and teardown photos: their bytes are in object storage, their rows here.

interface NewAttachment {
  shopId: string;
  userId: string;
  workOrderId: string;
  bikeId: string | null;
  noteId: string | null;
  purpose: "intake" | "teardown";
  objectKey: string;
  contentType: string;
  byteSize: number;
  caption: string;
}

export async function recordAttachment(db: Kysely<Database>, a: NewAttachment): Promise<void> {
  await db
    .insertInto("attachments")
    .values({
      shop_id: a.shopId,
      work_order_id: a.workOrderId,
      bike_id: a.bikeId,
      step_id: null,
      note_id: a.noteId,
      purpose: a.purpose,
      object_key: a.objectKey,
      content_type: a.contentType,
      byte_size: a.byteSize,
      caption: a.caption,
      uploaded_by: a.userId,
    })
    .execute();
}

/** A stored photo of this shop: where its bytes are and their type. */
export async function findAttachment(db: Kysely<Database>, shopId: string, id: string) {
  return db
    .selectFrom("attachments")
    .select(["object_key as objectKey", "content_type as contentType"])
    .where("id", "=", id)
    .where("shop_id", "=", shopId)
    .executeTakeFirst();
}
