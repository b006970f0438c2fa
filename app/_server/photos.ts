import { randomUUID } from "node:crypto";
import type { Kysely } from "kysely";
import { Refusal } from "@/lib/office/refusal";
import type { Database } from "@/db/schema";
import { putObject } from "./object-store";

const TYPES: Record<string, string> = { "image/jpeg": "jpg", "image/png": "png", "image/webp": "webp" };
export const MAX_PHOTO_BYTES = 10 * 1024 * 1024;
export const MAX_PHOTOS = 8;

// Checks uploaded photos before anything is written, so a bad file refuses the whole request.
export function checkPhotos(files: File[]): void {
  if (files.length > MAX_PHOTOS) throw new Refusal(`Attach at most ${MAX_PHOTOS} photos at once.`, 422, [{ path: "photos", message: `at most ${MAX_PHOTOS}` }]);
  for (const f of files) {
    if (!TYPES[f.type]) throw new Refusal(`${f.name} is not a JPEG, PNG or WebP photo.`, 422, [{ path: "photos", message: `${f.name}: not a photo` }]);
    if (f.size > MAX_PHOTO_BYTES) throw new Refusal(`${f.name} is larger than 10 MB.`, 422, [{ path: "photos", message: `${f.name}: over 10 MB` }]);
  }
}

// Stores photos in object storage and records them against the work order (and note).
export async function storePhotos(
  db: Kysely<Database>,
  a: { shopId: string; userId: string; workOrderId: string; bikeId: string | null; noteId: string | null; purpose: "intake" | "teardown" },
  files: File[],
) {
  for (const f of files) {
    const key = `${a.shopId}/${a.workOrderId}/${randomUUID()}.${TYPES[f.type]}`;
    await putObject(key, Buffer.from(await f.arrayBuffer()), f.type);
    await db
      .insertInto("attachments")
      .values({ shop_id: a.shopId, work_order_id: a.workOrderId, bike_id: a.bikeId, step_id: null, note_id: a.noteId, purpose: a.purpose, object_key: key, content_type: f.type, byte_size: f.size, caption: f.name.slice(0, 200), uploaded_by: a.userId })
      .execute();
  }
}

export function filesOf(form: FormData, field = "photos"): File[] {
  return form.getAll(field).filter((v): v is File => typeof v === "object" && v !== null && "arrayBuffer" in v && (v as File).size > 0);
}
