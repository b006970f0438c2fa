import "server-only";
import { createHash, randomUUID } from "node:crypto";
import { checkTuneLabelFree, findTuneFile, recordTuneVersion } from "@/db/records/tunes";
import type { Db } from "@/db/setup/client";
import { fileSizeWords, TUNE_FILE_MAX_BYTES, tuneFieldsSchema, tuneFileNameSchema } from "@/lib/dyno/tune-version";
import { CHECK_THE_FIELDS, Refusal } from "@/lib/errors";
import { storableContentType } from "@/lib/safe-values";
import { issuesOf } from "@/lib/zod-issues";
import { getObject, putObject } from "./object-store";

// Tune files: the bytes go to object storage under a key of their own, the SHA-256 is worked out
// here from the bytes received, and the version is recorded only after the bytes are stored.

/** SHA-256 of `bytes` as 64 lower-case hex digits. */
export function sha256Hex(bytes: Uint8Array): string {
  return createHash("sha256").update(bytes).digest("hex");
}

/** Checks the upload form (fields `file`, `label`, `notes`), stores the file and records the version. */
export async function storeTuneVersion(db: Db, user: { id: string; shopId: string }, workOrderId: string, form: FormData) {
  const fields = tuneFieldsSchema.safeParse({ label: form.get("label") ?? "", notes: form.get("notes") ?? "" });
  const file = form.get("file");
  const issues = fields.success ? [] : issuesOf(fields.error);
  if (typeof file !== "object" || file === null || file.size === 0) {
    issues.push({ path: "file", message: "Choose the tune file (it must not be empty)." });
  } else if (file.size > TUNE_FILE_MAX_BYTES) {
    issues.push({
      path: "file",
      message: `The tune file is ${fileSizeWords(file.size)}; the limit is ${fileSizeWords(TUNE_FILE_MAX_BYTES)}.`,
    });
  }
  const name = typeof file === "object" && file !== null ? tuneFileNameSchema.safeParse(file.name) : null;
  if (name && !name.success) issues.push(...issuesOf(name.error).map((i) => ({ ...i, path: "file" })));
  if (issues.length || !fields.success || typeof file !== "object" || file === null || !name?.success) {
    throw new Refusal(CHECK_THE_FIELDS, 400, issues);
  }
  await checkTuneLabelFree(db, user.shopId, workOrderId, fields.data.label);
  const bytes = new Uint8Array(await file.arrayBuffer());
  const id = randomUUID();
  const sha256 = sha256Hex(bytes);
  const objectKey = `tunes/${user.shopId}/${workOrderId}/${id}`;
  const contentType = storableContentType(file.type);
  await putObject(objectKey, Buffer.from(bytes), contentType);
  await recordTuneVersion(db, user, workOrderId, {
    ...fields.data,
    id,
    fileName: name.data,
    contentType,
    sizeBytes: bytes.byteLength,
    sha256,
    objectKey,
  });
  return { id, sha256, sizeBytes: bytes.byteLength };
}

/** The stored bytes of a tune version, checked against the SHA-256 recorded at upload. */
export async function readTuneFile(db: Db, shopId: string, workOrderId: string, tuneId: string) {
  const tune = await findTuneFile(db, shopId, workOrderId, tuneId);
  if (!tune) throw new Refusal("No such tune version on this work order.", 404);
  const { body } = await getObject(tune.objectKey);
  if (sha256Hex(body) !== tune.sha256) {
    throw new Refusal(
      `The stored file of “${tune.label}” no longer matches its SHA-256; it was changed in storage and is not served.`,
      409,
    );
  }
  return { ...tune, body };
}
