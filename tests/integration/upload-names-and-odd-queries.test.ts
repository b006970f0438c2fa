import { sql } from "kysely";
import { beforeAll, describe, expect, it } from "vitest";
import { POST as recordRun } from "@/app/api/jobs/[id]/dyno-runs/route";
import { POST as uploadTune } from "@/app/api/jobs/[id]/tunes/route";
import { GET as listCustomers } from "@/app/api/office/customers/route";
import { GET as listWorkOrders, POST as bookIn } from "@/app/api/office/work-orders/route";
import type { SessionUser } from "@/lib/auth/session-user";
import { useFakes } from "./support/fakes";
import { appRequest } from "./support/route-calls";
import { createShopFixture, type ShopFixture } from "./support/shop-fixture";
import { useTestDb } from "./support/test-db";

// What a browser or a script may send beside the fields: a file's name with a NUL or in another
// alphabet, a long declared type, a run dated year 0000, a sort column named like an object's own
// property. Each is stored as it can be, or refused in words; never a server error, and a file's
// name is kept as the person wrote it.

const db = useTestDb();
let fx: ShopFixture;
let office: SessionUser;
const PNG = Buffer.from("iVBORw0KGgoAAAANSUhEUgAAAAEAAAABCAYAAAAfFcSJAAAADUlEQVR42mP8z8BQDwAEhQGAhKmMIQAAAABJRU5ErkJggg==", "base64");

beforeAll(async () => {
  useFakes();
  fx = await createShopFixture(db);
  office = { ...fx.users.office, customerId: null };
});

/** A multipart body written by hand, so the file's name goes out byte for byte as a browser sends it (UTF-8 in filename="…"). */
function multipart(fields: Record<string, string>, ...files: Array<{ field: string; name: string; type: string; bytes: Buffer }>) {
  const boundary = "----benchtag-test-boundary";
  const parts: Buffer[] = [];
  for (const [k, v] of Object.entries(fields))
    parts.push(Buffer.from(`--${boundary}\r\nContent-Disposition: form-data; name="${k}"\r\n\r\n${v}\r\n`));
  for (const file of files) {
    // a name with "%" is sent the RFC 5987 way (filename*=UTF-8''…), as a client escapes what it cannot put in quotes
    const param = file.name.includes("%") ? `filename*=UTF-8''${file.name}` : `filename="${file.name}"`;
    parts.push(
      Buffer.from(`--${boundary}\r\nContent-Disposition: form-data; name="${file.field}"; ${param}\r\nContent-Type: ${file.type}\r\n\r\n`),
      file.bytes,
      Buffer.from("\r\n"),
    );
  }
  parts.push(Buffer.from(`--${boundary}--\r\n`));
  return { body: Buffer.concat(parts), headers: { "content-type": `multipart/form-data; boundary=${boundary}` } };
}

describe("uploaded files' names and types", () => {
  it("photos named outside Latin-1, or with a NUL and other controls, book in, each name kept as written less the controls", async () => {
    // a second bike of the fixture's customer (its first has a job open)
    const bike = await db
      .insertInto("bikes")
      .values({
        shop_id: fx.shopId,
        customer_id: fx.customerId,
        make: "Fixture",
        model: "Second 650",
        year: 2019,
        tag_code: `FX2-${fx.bike.tag_code}`,
        vin: null,
        engine_number: null,
        displacement_cc: 649,
        colour: null,
      })
      .returning("id")
      .executeTakeFirstOrThrow();
    const { body, headers } = multipart(
      { bikeId: bike.id, title: "Top-end refresh", complaint: "Rattle at idle", odometerKm: "12000" },
      { field: "photos", name: "Zylinderkopf Übersicht ✓.png", type: "image/png", bytes: PNG },
      { field: "photos", name: "deck%00%C2%85%01%20face.png", type: "image/png", bytes: Buffer.concat([PNG, Buffer.from([0])]) },
    );
    const res = await bookIn.handle(appRequest("/api/office/work-orders", { method: "POST", body, headers }), { user: office, db });
    expect(res.status).toBe(201);
    const { id } = (await res.json()) as { id: string };
    const captions = await sql<{ caption: string }>`SELECT caption FROM attachments WHERE work_order_id = ${id}::uuid`.execute(db);
    expect(captions.rows.map((r) => r.caption).sort()).toEqual(["Zylinderkopf Übersicht ✓.png", "deck face.png"]);
  });

  it("a tune file declared with a 300-character type is stored as plain bytes, not refused by the database after the upload", async () => {
    const { body, headers } = multipart(
      { label: "Stage 1 map", notes: "" },
      { field: "file", name: "stage1.bin", type: `application/${"x".repeat(300)}`, bytes: Buffer.from("tune bytes") },
    );
    const res = await uploadTune.handle(appRequest(`/api/jobs/${fx.workOrderId}/tunes`, { method: "POST", body, headers }), {
      user: { ...fx.users.mechanic, customerId: null },
      db,
      params: { id: fx.workOrderId },
    });
    expect(res.status).toBe(201);
    const row = await sql<{ content_type: string; file_name: string }>`
      SELECT content_type, file_name FROM tune_versions WHERE work_order_id = ${fx.workOrderId}::uuid`.execute(db);
    expect(row.rows).toEqual([{ content_type: "application/octet-stream", file_name: "stage1.bin" }]);
  });
});

describe("odd values beside the fields", () => {
  it("a dyno run dated year 0000 or 2150 is refused in words", async () => {
    for (const ranOn of ["0000-01-01", "2150-06-01"]) {
      const res = await recordRun.handle(
        appRequest(`/api/jobs/${fx.workOrderId}/dyno-runs`, {
          method: "POST",
          headers: { "content-type": "application/json" },
          body: JSON.stringify({ label: "Check run", ranOn }),
        }),
        { user: { ...fx.users.mechanic, customerId: null }, db, params: { id: fx.workOrderId } },
      );
      expect(res.status).toBe(400);
      const issues = ((await res.json()) as { issues: Array<{ path: string; message: string }> }).issues;
      expect(issues).toContainEqual({ path: "ranOn", message: "Date must be a real day between the years 2000 and 2099." });
    }
  });

  it("a sort named like an object's own property (constructor, toString, __proto__) lists in the usual order", async () => {
    for (const sort of ["constructor", "toString", "__proto__", "valueOf"]) {
      const jobs = await listWorkOrders.handle(appRequest(`/api/office/work-orders?sort=${sort}`), { user: office, db });
      expect(jobs.status).toBe(200);
      const customers = await listCustomers.handle(appRequest(`/api/office/customers?sort=${sort}`), { user: office, db });
      expect(customers.status).toBe(200);
    }
  });
});
