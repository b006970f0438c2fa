import { storeReadyCopy } from "@/app/_server/frozen-report";
import { randomUUID } from "node:crypto";
import { PDFParse } from "pdf-parse";
import { beforeAll, describe, expect, it } from "vitest";
import { mailBikeReady, mailQuoteReady } from "@/app/_server/customer-mail";
import { getObject, putObject } from "@/app/_server/object-store";
import { mailTo, useFakes } from "./support/fakes";
import { useQueueWorkers } from "./support/queue";
import { createShopFixture } from "./support/shop-fixture";
import { useTestDb } from "./support/test-db";

const db = useTestDb();
useQueueWorkers(db);
let ports: ReturnType<typeof useFakes>;
beforeAll(() => {
  ports = useFakes();
});

describe("customer e-mails through the queue and SMTP (maildev)", () => {
  it("sends the quote-ready mail and records it against the work order", async () => {
    const fx = await createShopFixture(db);
    const { email } = await db.selectFrom("customers").select("email").where("id", "=", fx.customerId).executeTakeFirstOrThrow();
    const r = await mailQuoteReady(db, fx.shopId, fx.workOrderId, fx.workOrderId, 81715, 20000);
    expect(r).toEqual({ ok: true, queued: true });
    const [m] = await mailTo(ports.mailWeb, email!);
    expect(m.subject).toBe("Your quote for work order 1 is ready");
    expect(m.text).toContain("€817.15 including tax, with a deposit of €200.00");
    const logged = await db
      .selectFrom("outbound_emails")
      .select(["kind", "recipient", "error"])
      .where("work_order_id", "=", fx.workOrderId)
      .execute();
    expect(logged).toEqual([{ kind: "quote_ready", recipient: email, error: null }]);
  });

  it("attaches the build report PDF stored when the job passed its gate to the bike-ready mail, not one made when it is sent", async () => {
    const fx = await createShopFixture(db);
    await db
      .insertInto("parts_fitted")
      .values({
        shop_id: fx.shopId,
        work_order_id: fx.workOrderId,
        part_number: "PST-76",
        batch: "B-77",
        step_id: null,
        serial: null,
        fitted_by: null,
      })
      .execute();
    const { email } = await db.selectFrom("customers").select("email").where("id", "=", fx.customerId).executeTakeFirstOrThrow();
    // stored as the record stands when the job passes its gate; a part recorded after that is not in the e-mail's copy
    const key = await storeReadyCopy(db, fx.shopId, fx.workOrderId);
    await db
      .insertInto("parts_fitted")
      .values({
        shop_id: fx.shopId,
        work_order_id: fx.workOrderId,
        part_number: "LATE-99",
        batch: "B-99",
        step_id: null,
        serial: null,
        fitted_by: null,
      })
      .execute();
    expect(await mailBikeReady(db, fx.shopId, fx.workOrderId, key)).toEqual({ ok: true, queued: true });
    const [m] = await mailTo(ports.mailWeb, email!);
    expect(m.attachments).toHaveLength(1);
    expect(m.attachments![0].contentType).toBe("application/pdf");
    const pdf = await fetch(
      `http://127.0.0.1:${ports.mailWeb}/api/email/${m.id}/attachment/${m.attachments![0].generatedFileName ?? m.attachments![0].fileName}`,
    );
    expect(pdf.status).toBe(200);
    const text = (await new PDFParse({ data: new Uint8Array(await pdf.arrayBuffer()) }).getText()).text;
    expect(text).toContain("Build report");
    expect(text).toContain("work order #1");
    expect(text).toContain("PST-76");
    expect(text).toContain("B-77");
    expect(text).not.toContain("LATE-99");
    const stored = Buffer.from((await getObject(key)).body);
    expect(
      Buffer.from(
        await (
          await fetch(
            `http://127.0.0.1:${ports.mailWeb}/api/email/${m.id}/attachment/${m.attachments![0].generatedFileName ?? m.attachments![0].fileName}`,
          )
        ).arrayBuffer(),
      ),
    ).toEqual(stored);
  });
});

describe("object storage (s3rver)", () => {
  it("stores and reads back a photo", async () => {
    const key = `test/${randomUUID()}.jpg`;
    const bytes = Buffer.from([0xff, 0xd8, 0xff, 0xe0, 1, 2, 3, 4]);
    await putObject(key, bytes, "image/jpeg");
    const back = await getObject(key);
    expect(Buffer.from(back.body)).toEqual(bytes);
    expect(back.contentType).toBe("image/jpeg");
  });
});
