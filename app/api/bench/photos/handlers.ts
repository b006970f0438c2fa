import { bytesAreOfType } from "@/app/_server/file-bytes";
import { binary, route } from "@/app/_server/route";
import { appendAudit } from "@/db/audit/append";
import { findStepPhoto, markPhotoUploaded } from "@/db/bench/photos";
import { Refusal } from "@/lib/errors";
import { isUuid } from "@/lib/ids";
import { MAX_PHOTO_BYTES, PHOTO_CONTENT_TYPES } from "@/lib/sync/operations";

// Photo bytes for step photos. The tablet first syncs the photo's entry (photo.queued, which makes
// the attachments row); then it sends the bytes here, which go to object storage. Built for a
// given store so the integration test can hand in one of its own.
export interface PhotoStore {
  put(objectKey: string, body: Buffer, contentType: string): Promise<void>;
  get(objectKey: string): Promise<{ body: Uint8Array; contentType: string }>;
}

function photoId(raw: string): string {
  if (!isUuid(raw)) throw new Refusal("The photo id must be a UUID.", 400);
  return raw;
}

/** POST: the bytes of a step photo queued on a tablet (mechanics and supervisors). */
export function photoUpload(store: PhotoStore) {
  return route(
    { access: { area: "bench" }, params: ["id"], body: binary(PHOTO_CONTENT_TYPES, MAX_PHOTO_BYTES) },
    async ({ user, params, body, db }) => {
      const id = photoId(params.id);
      const row = await findStepPhoto(db, user.shopId, id);
      if (!row) throw new Refusal(`Photo ${id} is not on record: sync its entry first.`, 404);
      if (!row.awaitingUpload) return { stored: true, already: true };
      if (body.type !== row.contentType)
        throw new Refusal(`The photo was queued as ${row.contentType} but ${body.type || "no type"} was sent.`, 415);
      // No more than the queued size is read: a longer stream is refused as it comes in.
      const bytes = await body.read(row.byteSize);
      if (bytes.byteLength !== row.byteSize)
        throw new Refusal(`The photo was queued as ${row.byteSize} bytes but ${bytes.byteLength} arrived.`, 422);
      if (!(await bytesAreOfType(bytes, row.contentType)))
        throw new Refusal(`The bytes sent are not a photo of the queued type (${row.contentType}).`, 415);
      await store.put(row.objectKey, Buffer.from(bytes), row.contentType);
      await markPhotoUploaded(db, user.shopId, row.id);
      await appendAudit(db, [
        {
          shopId: user.shopId,
          actorId: user.id,
          action: "photo.uploaded",
          entity: "attachment",
          entityId: row.id,
          outcome: "accepted",
          detail: { bytes: bytes.byteLength },
        },
      ]);
      return { stored: true, already: false };
    },
  );
}

/** GET: the photo, for the bench and for review. */
export function photoBytes(store: PhotoStore) {
  return route({ access: { anyArea: ["bench", "review"] }, params: ["id"] }, async ({ user, params, db }) => {
    const id = photoId(params.id);
    const row = await findStepPhoto(db, user.shopId, id);
    if (!row) throw new Refusal(`No photo ${id} in this shop.`, 404);
    if (row.awaitingUpload) throw new Refusal("This photo is still on the tablet that took it.", 404);
    const { body, contentType } = await store.get(row.objectKey);
    return new Response(Buffer.from(body), { headers: { "content-type": contentType, "cache-control": "private, max-age=86400" } });
  });
}
