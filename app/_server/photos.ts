import "server-only";
import { randomUUID } from "node:crypto";
import { recordAttachment } from "@/db/office/attachments";
import type { Db } from "@/db/setup/client";
import { Refusal } from "@/lib/errors";
import { storableFileName } from "@/lib/safe-values";
import { typeByBytes } from "./file-bytes";
import type { MultipartLimits } from "./multipart";
import { putObject } from "./object-store";

// Intake and teardown photos sent with an office form (multipart, field "photos").
const TYPES: Record<string, string> = { "image/jpeg": "jpg", "image/png": "png", "image/webp": "webp" };
const MAX_PHOTOS = 8;
export const MAX_PHOTO_BYTES = 10 * 1024 * 1024;
/** The largest form with photos a route reads: every photo at its limit, and the text fields. */
export const MAX_PHOTO_FORM_BYTES = MAX_PHOTOS * MAX_PHOTO_BYTES + 1024 * 1024;
/** The limits of a form carrying photos, enforced while it streams in (each photo refused past 10 MB). */
export const PHOTO_FORM: MultipartLimits = { maxBytes: MAX_PHOTO_FORM_BYTES, maxFileBytes: MAX_PHOTO_BYTES, maxFiles: MAX_PHOTOS };

/** A photo checked by its own bytes: `type` is what the bytes are, whatever the browser declared. */
export interface CheckedPhoto {
  file: File;
  type: string;
}

// Checks uploaded photos before anything is written, so a bad file refuses the whole request.
// The type is read from each file's first bytes (an HTML page sent as image/png is refused).
export async function checkPhotos(files: File[]): Promise<CheckedPhoto[]> {
  if (files.length > MAX_PHOTOS)
    throw new Refusal(`Attach at most ${MAX_PHOTOS} photos at once.`, 422, [{ path: "photos", message: `Photos: at most ${MAX_PHOTOS}` }]);
  const checked: CheckedPhoto[] = [];
  for (const f of files) {
    if (f.size > MAX_PHOTO_BYTES)
      throw new Refusal(`${f.name} is larger than 10 MB.`, 422, [{ path: "photos", message: `${f.name}: over 10 MB` }]);
    const type = await typeByBytes(new Uint8Array(await f.slice(0, 4100).arrayBuffer()));
    if (!type || !TYPES[type])
      throw new Refusal(`${f.name} is not a JPEG, PNG or WebP photo.`, 422, [{ path: "photos", message: `${f.name}: not a photo` }]);
    checked.push({ file: f, type });
  }
  return checked;
}

// Stores photos in object storage and records them against the work order (and note).
export async function storePhotos(
  db: Db,
  a: { shopId: string; userId: string; workOrderId: string; bikeId: string | null; noteId: string | null; purpose: "intake" | "teardown" },
  photos: CheckedPhoto[],
) {
  for (const { file: f, type } of photos) {
    const objectKey = `${a.shopId}/${a.workOrderId}/${randomUUID()}.${TYPES[type]}`;
    await putObject(objectKey, Buffer.from(await f.arrayBuffer()), type);
    await recordAttachment(db, { ...a, objectKey, contentType: type, byteSize: f.size, caption: storableFileName(f.name) });
  }
}

export function filesOf(form: FormData, field = "photos"): File[] {
  return form.getAll(field).filter((v): v is File => typeof v === "object" && v !== null && "arrayBuffer" in v && (v as File).size > 0);
}
