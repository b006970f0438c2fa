import { describe, expect, it } from "vitest";
import { POST as bookIn } from "@/app/api/office/work-orders/route";
import type { SessionUser } from "@/lib/auth/session-user";
import { appRequest } from "./support/route-calls";
import { createShopFixture } from "./support/shop-fixture";
import { useTestDb } from "./support/test-db";

// Forms with photos are read as they stream (busboy, app/_server/multipart.ts): a photo over its
// 10 MB limit is refused as soon as it passes it — the rest of the stream is never pulled — and a
// photo is what its bytes say, not what the browser declared.
const db = useTestDb();
const MIB = 1024 * 1024;
const BOUNDARY = "----benchtag-test-boundary";

/** A multipart body with text fields and one file of `fileBytes` bytes made on demand; `pulled()` says how many were read. */
function lazyForm(fields: Record<string, string>, file: { name: string; type: string; head: Uint8Array; size: number }) {
  const enc = new TextEncoder();
  const parts = Object.entries(fields).map(([k, v]) => `--${BOUNDARY}\r\nContent-Disposition: form-data; name="${k}"\r\n\r\n${v}\r\n`);
  const fileHeader = `--${BOUNDARY}\r\nContent-Disposition: form-data; name="photos"; filename="${file.name}"\r\nContent-Type: ${file.type}\r\n\r\n`;
  const chunk = new Uint8Array(256 * 1024).fill(0x41);
  let sent = 0;
  let pulled = 0;
  const stream = new ReadableStream<Uint8Array>({
    start(c) {
      c.enqueue(enc.encode(parts.join("") + fileHeader));
      c.enqueue(file.head);
      sent = file.head.byteLength;
    },
    pull(c) {
      if (sent >= file.size) {
        c.enqueue(enc.encode(`\r\n--${BOUNDARY}--\r\n`));
        c.close();
        return;
      }
      const n = Math.min(chunk.byteLength, file.size - sent);
      sent += n;
      pulled += n;
      c.enqueue(chunk.subarray(0, n));
    },
  });
  return { stream, pulled: () => pulled + file.head.byteLength };
}

const PNG_HEAD = new Uint8Array([0x89, 0x50, 0x4e, 0x47, 0x0d, 0x0a, 0x1a, 0x0a, 0, 0, 0, 0x0d, 0x49, 0x48, 0x44, 0x52]);

async function post(user: SessionUser, form: ReturnType<typeof lazyForm>) {
  return bookIn.handle(
    appRequest("/api/office/work-orders", {
      method: "POST",
      headers: { "content-type": `multipart/form-data; boundary=${BOUNDARY}` },
      body: form.stream,
    }),
    { user, db },
  );
}

describe("forms with photos", () => {
  it("refuse a 50 MB photo as soon as it passes 10 MB, without reading the rest", async () => {
    const fx = await createShopFixture(db);
    const office = { ...fx.users.office, customerId: null };
    const form = lazyForm(
      { bikeId: fx.bike.id, title: "Too big", complaint: "Photo too big", odometerKm: "10" },
      { name: "huge.png", type: "image/png", head: PNG_HEAD, size: 50 * MIB },
    );
    const res = await post(office, form);
    expect(res.status).toBe(413);
    expect((await res.json()).error).toBe("huge.png is larger than 10 MB.");
    expect(form.pulled()).toBeLessThan(12 * MIB);
    expect(await db.selectFrom("work_orders").select("id").where("title", "=", "Too big").execute()).toEqual([]);
  });

  it("refuse a web page declared as a PNG photo (its bytes decide), and book nothing", async () => {
    const fx = await createShopFixture(db);
    const office = { ...fx.users.office, customerId: null };
    const html = new TextEncoder().encode("<!doctype html><html><script>document.title='x'</script></html>");
    const form = lazyForm(
      { bikeId: fx.bike.id, title: "Disguised page", complaint: "Not a photo", odometerKm: "10" },
      { name: "side.png", type: "image/png", head: html, size: html.byteLength },
    );
    const res = await post(office, form);
    expect([res.status, (await res.json()).error]).toEqual([422, "side.png is not a JPEG, PNG or WebP photo."]);
    expect(await db.selectFrom("work_orders").select("id").where("title", "=", "Disguised page").execute()).toEqual([]);
  });
});
