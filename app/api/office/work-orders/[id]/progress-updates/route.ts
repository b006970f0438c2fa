import { mailProgressUpdate } from "@/app/_server/customer-contact-mail";
import { created, idParam, json, route } from "@/app/_server/route";
import { appendAudit } from "@/db/audit/append";
import { officeWorkOrder } from "@/db/customer-contact/messages";
import { postProgressUpdate, progressUpdatesOf, shareablePhotos } from "@/db/customer-contact/progress-updates";
import { progressUpdateSchema } from "@/lib/customer-contact/schemas";

// Progress updates shared with the customer. GET: those shared so far and the job's photos that
// may be chosen. POST: a note and chosen photos of the job; the customer sees them on their
// bike's page and gets an e-mail.

export const GET = route({ access: { area: "office" }, params: ["id"] }, async ({ user, params, db }) => {
  const id = await officeWorkOrder(db, user.shopId, idParam(params.id));
  return { updates: await progressUpdatesOf(db, user.shopId, [id]), photos: await shareablePhotos(db, user.shopId, id) };
});

export const POST = route(
  {
    access: { area: "office" },
    params: ["id"],
    body: json(progressUpdateSchema, { maxBytes: 64 * 1024, labels: { note: "Note to the customer", photoIds: "Photos" } }),
  },
  async ({ user, params, body, db }) => {
    const id = await officeWorkOrder(db, user.shopId, idParam(params.id));
    const made = await postProgressUpdate(db, { shopId: user.shopId, workOrderId: id, userId: user.id, ...body });
    const mail = await mailProgressUpdate(db, user.shopId, id, made.id, body.note, body.photoIds.length);
    await appendAudit(db, [
      {
        shopId: user.shopId,
        actorId: user.id,
        workOrderId: id,
        action: "progress-update.shared",
        entity: "progress_update",
        entityId: made.id,
        outcome: "accepted",
        detail: { photos: body.photoIds.length },
      },
    ]);
    return created({ id: made.id, postedAt: made.postedAt, mailed: mail.queued, warning: mail.queued ? undefined : mail.reason });
  },
);
