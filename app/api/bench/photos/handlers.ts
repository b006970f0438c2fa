import type { Kysely } from "kysely";
import { NextResponse } from "next/server";
import { z } from "zod";
import { appendAudit } from "@/db/audit/append";
import { findStepPhoto, markPhotoUploaded } from "@/db/bench/photos";
import type { Database } from "@/db/schema";
import { canReach } from "@/lib/auth/roles";
import type { SessionUser } from "@/lib/auth/session-user";
import { MAX_PHOTO_BYTES } from "@/lib/sync/operations";

// Photo bytes for step photos. The tablet first syncs the photo's entry (photo.queued, which makes
// the attachments row); then it sends the bytes here, which go to object storage.
export interface PhotoStore {
  put(objectKey: string, body: Buffer, contentType: string): Promise<void>;
  get(objectKey: string): Promise<{ body: Uint8Array; contentType: string }>;
}

const idSchema = z.uuid({ error: "The photo id must be a UUID." });
const json = (status: number, error: string) => NextResponse.json({ error }, { status });

function gate(user: SessionUser | null, viewing: boolean): Response | null {
  if (!user) return json(401, "Sign in first.");
  const ok = canReach(user.role, "bench") || (viewing && canReach(user.role, "review"));
  return ok ? null : json(403, `Your role (${user.role}) may not use this.`);
}

export async function uploadPhotoResponse(user: SessionUser | null, db: Kysely<Database>, store: PhotoStore, rawId: string, request: Request): Promise<Response> {
  const refused = gate(user, false);
  if (refused) return refused;
  const id = idSchema.safeParse(rawId);
  if (!id.success) return json(400, id.error.issues[0].message);
  const row = await findStepPhoto(db, user!.shopId, id.data);
  if (!row) return json(404, `Photo ${id.data} is not on record: sync its entry first.`);
  if (!row.awaitingUpload) return NextResponse.json({ stored: true, already: true });
  const type = (request.headers.get("content-type") ?? "").split(";")[0].trim();
  if (type !== row.contentType) return json(415, `The photo was queued as ${row.contentType} but ${type || "no type"} was sent.`);
  const declared = Number(request.headers.get("content-length") ?? "0");
  if (declared > MAX_PHOTO_BYTES) return json(413, `The photo is larger than ${MAX_PHOTO_BYTES} bytes.`);
  const body = Buffer.from(await request.arrayBuffer());
  if (body.byteLength !== row.byteSize) return json(422, `The photo was queued as ${row.byteSize} bytes but ${body.byteLength} arrived.`);
  await store.put(row.objectKey, body, row.contentType);
  await markPhotoUploaded(db, user!.shopId, row.id);
  await appendAudit(db, [{ shopId: user!.shopId, actorId: user!.id, action: "photo.uploaded", entity: "attachment", entityId: row.id, outcome: "accepted", detail: { bytes: body.byteLength } }]);
  return NextResponse.json({ stored: true, already: false });
}

export async function photoBytesResponse(user: SessionUser | null, db: Kysely<Database>, store: PhotoStore, rawId: string): Promise<Response> {
  const refused = gate(user, true);
  if (refused) return refused;
  const id = idSchema.safeParse(rawId);
  if (!id.success) return json(400, id.error.issues[0].message);
  const row = await findStepPhoto(db, user!.shopId, id.data);
  if (!row) return json(404, `No photo ${id.data} in this shop.`);
  if (row.awaitingUpload) return json(404, "This photo is still on the tablet that took it.");
  const { body, contentType } = await store.get(row.objectKey);
  return new Response(Buffer.from(body), { headers: { "content-type": contentType, "cache-control": "private, max-age=86400" } });
}
