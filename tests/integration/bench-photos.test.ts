import { randomUUID } from "node:crypto";
import { describe, expect, it } from "vitest";
import { photoBytes, photoUpload, type PhotoStore } from "@/app/api/bench/photos/handlers";
import type { Db } from "@/db/setup/client";
import { mergeBatch } from "@/db/sync/merge";
import type { SessionUser } from "@/lib/auth/session-user";
import { fixtureSpecs, Tablet } from "../bench/sync-ops";
import { createShopFixture, type ShopFixture } from "./support/shop-fixture";
import { appRequest } from "./support/route-calls";
import { useTestDb } from "./support/test-db";

const db = useTestDb();
const asUser = (u: ShopFixture["users"]["mechanic"]): SessionUser => ({ ...u, role: u.role, customerId: null });

// An in-memory object store standing in for S3 here; the browser test uses the real SDK and s3rver.
function memoryStore(): PhotoStore & { objects: Map<string, { body: Buffer; contentType: string }> } {
  const objects = new Map<string, { body: Buffer; contentType: string }>();
  return {
    objects,
    put: async (key, body, contentType) => void objects.set(key, { body, contentType }),
    get: async (key) => {
      const o = objects.get(key);
      if (!o) throw new Error(`no object ${key}`);
      return { body: new Uint8Array(o.body), contentType: o.contentType };
    },
  };
}

const upload = (id: string, body: Buffer, type = "image/jpeg") =>
  appRequest(`/api/bench/photos/${id}`, {
    method: "POST",
    headers: { "content-type": type, "content-length": String(body.byteLength) },
    body: new Uint8Array(body),
  });

// The photo routes, called through the route wrapper with the user, database and store given.
const uploadPhotoResponse = (user: SessionUser | null, db: Db, store: PhotoStore, id: string, req: Request) =>
  photoUpload(store).handle(req, { user, db, params: { id } });
const photoBytesResponse = (user: SessionUser | null, db: Db, store: PhotoStore, id: string) =>
  photoBytes(store).handle(appRequest(`/api/bench/photos/${id}`), { user, db, params: { id } });

/** A JPEG by its first bytes (SOI marker and a JFIF APP0 header, ISO/IEC 10918-1), then `rest`. */
const jpeg = (rest: string) =>
  Buffer.concat([Buffer.from([0xff, 0xd8, 0xff, 0xe0, 0x00, 0x10, 0x4a, 0x46, 0x49, 0x46, 0x00, 0x01]), Buffer.from(rest)]);

describe("step photo bytes", () => {
  async function queued(bytes: Buffer) {
    const fx = await createShopFixture(db);
    const specs = await fixtureSpecs(db, fx);
    const mech = asUser(fx.users.mechanic);
    const tablet = new Tablet(`tab-${randomUUID().slice(0, 6)}`, mech.id, fx.workOrderId);
    const photoId = randomUUID();
    await mergeBatch(
      db,
      mech,
      tablet.batch([
        tablet.make("photo.queued", {
          attachmentId: photoId,
          stepId: specs.boreStepId,
          contentType: "image/jpeg",
          byteSize: bytes.byteLength,
        }),
      ]),
    );
    return { fx, mech, photoId };
  }

  it("stores the bytes once the entry is on record, marks it uploaded, and serves them back", async () => {
    const bytes = jpeg("the rest of the picture");
    const { fx, mech, photoId } = await queued(bytes);
    const store = memoryStore();
    const res = await uploadPhotoResponse(mech, db, store, photoId, upload(photoId, bytes));
    expect(res.status).toBe(200);
    expect(await res.json()).toEqual({ stored: true, already: false });
    const row = await db
      .selectFrom("attachments")
      .select(["object_key", "awaiting_upload"])
      .where("id", "=", photoId)
      .executeTakeFirstOrThrow();
    expect(row.awaiting_upload).toBe(false);
    expect(store.objects.get(row.object_key)?.body.equals(bytes)).toBe(true);
    // sending again changes nothing
    expect(await (await uploadPhotoResponse(mech, db, store, photoId, upload(photoId, bytes))).json()).toEqual({
      stored: true,
      already: true,
    });
    const back = await photoBytesResponse(asUser(fx.users.supervisor), db, store, photoId);
    expect(back.status).toBe(200);
    expect(Buffer.from(await back.arrayBuffer()).equals(bytes)).toBe(true);
  });

  it("refuses a wrong type, a wrong size, an unknown photo, another shop and the wrong roles, with reasons", async () => {
    const bytes = jpeg("x");
    const { fx, mech, photoId } = await queued(bytes);
    const store = memoryStore();
    const wrongType = await uploadPhotoResponse(mech, db, store, photoId, upload(photoId, bytes, "image/png"));
    expect([wrongType.status, (await wrongType.json()).error]).toEqual([415, "The photo was queued as image/jpeg but image/png was sent."]);
    const wrongSize = await uploadPhotoResponse(mech, db, store, photoId, upload(photoId, bytes.subarray(0, 11)));
    expect([wrongSize.status, (await wrongSize.json()).error]).toEqual([
      422,
      `The photo was queued as ${bytes.byteLength} bytes but 11 arrived.`,
    ]);
    // more than was queued is refused as it streams in, before it is held
    const longer = await uploadPhotoResponse(mech, db, store, photoId, upload(photoId, Buffer.concat([bytes, Buffer.alloc(1000)])));
    expect(longer.status).toBe(413);
    // the bytes decide what a photo is, not the type declared: a web page sent as a JPEG is refused
    const page = Buffer.from(`<html><script>alert(1)</script>${"x".repeat(bytes.byteLength)}`).subarray(0, bytes.byteLength);
    const notAPhoto = await uploadPhotoResponse(mech, db, store, photoId, upload(photoId, page));
    expect([notAPhoto.status, (await notAPhoto.json()).error]).toEqual([
      415,
      "The bytes sent are not a photo of the queued type (image/jpeg).",
    ]);
    const unknown = randomUUID();
    expect((await uploadPhotoResponse(mech, db, store, unknown, upload(unknown, bytes))).status).toBe(404);
    expect((await uploadPhotoResponse(mech, db, store, "not-a-uuid", upload(photoId, bytes))).status).toBe(400);
    const other = await createShopFixture(db);
    expect((await uploadPhotoResponse(asUser(other.users.mechanic), db, store, photoId, upload(photoId, bytes))).status).toBe(404);
    expect((await uploadPhotoResponse(asUser(fx.users.customer), db, store, photoId, upload(photoId, bytes))).status).toBe(403);
    expect((await uploadPhotoResponse(null, db, store, photoId, upload(photoId, bytes))).status).toBe(401);
    expect((await photoBytesResponse(asUser(fx.users.customer), db, store, photoId)).status).toBe(403);
    // not uploaded yet: nothing to serve
    expect((await photoBytesResponse(mech, db, store, photoId)).status).toBe(404);
    expect(store.objects.size).toBe(0);
  });
});
