import "server-only";
import type { Kysely } from "kysely";
import { Refusal } from "@/lib/errors";
import type { Database } from "../schema";

// Progress updates the office shares with the customer (tables progress_updates,
// progress_update_photos, append-only): a note and photos already on the job.

/** Photos of the job whose bytes are stored (bench, intake and teardown photos), newest first. */
export async function shareablePhotos(db: Kysely<Database>, shopId: string, workOrderId: string) {
  return db
    .selectFrom("attachments as a")
    .leftJoin("template_steps as s", "s.id", "a.step_id")
    .select(["a.id", "a.purpose", "a.caption", "a.created_at as takenAt", "s.title as stepTitle"])
    .where("a.shop_id", "=", shopId)
    .where("a.work_order_id", "=", workOrderId)
    .where("a.awaiting_upload", "=", false)
    .where("a.content_type", "like", "image/%")
    .orderBy("a.created_at", "desc")
    .execute();
}

export async function postProgressUpdate(
  db: Kysely<Database>,
  u: { shopId: string; workOrderId: string; userId: string; note: string; photoIds: string[] },
) {
  const onJob = new Set((await shareablePhotos(db, u.shopId, u.workOrderId)).map((p) => p.id));
  const stranger = u.photoIds.findIndex((id) => !onJob.has(id));
  if (stranger >= 0)
    throw new Refusal("A chosen photo is not one of this job's stored photos; nothing was shared.", 400, [
      { path: `photoIds.${stranger}`, message: "not a stored photo of this job" },
    ]);
  return db.transaction().execute(async (trx) => {
    const made = await trx
      .insertInto("progress_updates")
      .values({ shop_id: u.shopId, work_order_id: u.workOrderId, note: u.note, posted_by: u.userId })
      .returning(["id", "posted_at as postedAt"])
      .executeTakeFirstOrThrow();
    if (u.photoIds.length)
      await trx
        .insertInto("progress_update_photos")
        .values(u.photoIds.map((attachment_id, position) => ({ update_id: made.id, attachment_id, position })))
        .execute();
    return made;
  });
}

/** The updates shared on these work orders, newest first, each with its photos in the chosen order. */
export async function progressUpdatesOf(db: Kysely<Database>, shopId: string, workOrderIds: string[]) {
  if (!workOrderIds.length) return [];
  const updates = await db
    .selectFrom("progress_updates as p")
    .innerJoin("users as u", "u.id", "p.posted_by")
    .select(["p.id", "p.work_order_id as workOrderId", "p.note", "p.posted_at as postedAt", "u.name as postedBy"])
    .where("p.shop_id", "=", shopId)
    .where("p.work_order_id", "in", workOrderIds)
    .orderBy("p.posted_at", "desc")
    .execute();
  if (!updates.length) return [];
  const photos = await db
    .selectFrom("progress_update_photos as pp")
    .innerJoin("attachments as a", "a.id", "pp.attachment_id")
    .select(["pp.update_id as updateId", "a.id", "a.caption"])
    .where(
      "pp.update_id",
      "in",
      updates.map((u) => u.id),
    )
    .orderBy("pp.position")
    .execute();
  return updates.map((u) => ({ ...u, photos: photos.filter((p) => p.updateId === u.id).map(({ id, caption }) => ({ id, caption })) }));
}

/**
 * A photo the customer may see: one shared in a progress update on a work order of one of their
 * own bikes. Anything else (another customer's, a photo never shared) is null.
 */
export async function photoSharedWithCustomer(db: Kysely<Database>, shopId: string, customerId: string, attachmentId: string) {
  return db
    .selectFrom("progress_update_photos as pp")
    .innerJoin("progress_updates as p", "p.id", "pp.update_id")
    .innerJoin("work_orders as w", "w.id", "p.work_order_id")
    .innerJoin("bikes as b", "b.id", "w.bike_id")
    .innerJoin("attachments as a", "a.id", "pp.attachment_id")
    .select(["a.object_key as objectKey", "a.content_type as contentType"])
    .where("pp.attachment_id", "=", attachmentId)
    .where("p.shop_id", "=", shopId)
    .where("b.customer_id", "=", customerId)
    .limit(1)
    .executeTakeFirst();
}
