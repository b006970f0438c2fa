import "server-only";
import { randomUUID } from "node:crypto";
import { recordAttachment } from "@/db/office/attachments";
import type { Db } from "@/db/setup/client";
import { Refusal } from "@/lib/errors";
import { putObject } from "./object-store";

// Intake and teardown photos sent with an office form (multipart, field "photos").
const TYPES: Record<string, string> = { "image/jpeg": "jpg", "image/png": "png", "image/webp": "webp" };
const MAX_PHOTOS = 8;
export const MAX_PHOTO_BYTES = 10 * 1024 * 1024;
/** The largest form with photos a route reads: every photo at its limit, and the text fields. */
export const MAX_PHOTO_FORM_BYTES = MAX_PHOTOS * MAX_PHOTO_BYTES + 1024 * 1024;

// Checks uploaded photos before anything is written, so a bad file refuses the whole request.
export function checkPhotos(files: File[]): void {
  if (files.length > MAX_PHOTOS)
    throw new Refusal(`Attach at most ${MAX_PHOTOS} photos at once.`, 422, [{ path: "photos", message: `Photos: at most ${MAX_PHOTOS}` }]);
  for (const f of files) {
    if (!TYPES[f.type])
      throw new Refusal(`${f.name} is not a JPEG, PNG or WebP photo.`, 422, [{ path: "photos", message: `${f.name}: not a photo` }]);
    if (f.size > MAX_PHOTO_BYTES)
      throw new Refusal(`${f.name} is larger than 10 MB.`, 422, [{ path: "photos", message: `${f.name}: over 10 MB` }]);
  }
}

// Stores photos in object storage and records them against the work order (and note).
export async function storePhotos(
  db: Db,
  a: { shopId: string; userId: string; workOrderId: string; bikeId: string | null; noteId: string | null; purpose: "intake" | "teardown" },
  files: File[],
) {
  for (const f of files) {
    const objectKey = `${a.shopId}/${a.workOrderId}/${randomUUID()}.${TYPES[f.type]}`;
    await putObject(objectKey, Buffer.from(await f.arrayBuffer()), f.type);
    await recordAttachment(db, { ...a, objectKey, contentType: f.type, byteSize: f.size, caption: f.name.slice(0, 200) });
  }
}

export function filesOf(form: FormData, field = "photos"): File[] {
  return form.getAll(field).filter((v): v is File => typeof v === "object" && v !== null && "arrayBuffer" in v && (v as File).size > 0);
}
