import "server-only";
import type { Kysely } from "kysely";
import type { Database } from "../schema";

/** A step photo of the shop, as queued by a tablet's sync (null when not on record). */
export async function findStepPhoto(db: Kysely<Database>, shopId: string, id: string) {
  return db
    .selectFrom("attachments")
    .select(["id", "object_key as objectKey", "content_type as contentType", "byte_size as byteSize", "awaiting_upload as awaitingUpload"])
    .where("id", "=", id)
    .where("shop_id", "=", shopId)
    .where("purpose", "=", "step")
    .executeTakeFirst();
}

export async function markPhotoUploaded(db: Kysely<Database>, shopId: string, id: string): Promise<void> {
  await db.updateTable("attachments").set({ awaiting_upload: false }).where("id", "=", id).where("shop_id", "=", shopId).execute();
}
