import { describe, expect, it } from "vitest";
import { enqueueMails, handToQueue } from "@/app/_server/mail";
import { QUEUES } from "@/app/_server/queue/names";
import { POST as tryAgain } from "@/app/api/office/outbox-mail/route";
import { GET as reviewQueue } from "@/app/api/review/queue/route";
import { outboxForOffice, queueMails, strandedMails } from "@/db/mail/outbox";
import { Tablet } from "../bench/sync-ops";
import { mailTo, useFakes } from "./support/fakes";
import { eventually, TEST_MAIL_RETRY, useQueueWorkers, withSmtpRefusing } from "./support/queue";
import { measureStageWork, reviewSetup, sync } from "./support/review-bench";
import { appRequest } from "./support/route-calls";
import { createShopFixture } from "./support/shop-fixture";
import { useTestDb } from "./support/test-db";

const db = useTestDb();
const ports = useFakes();
// Two workers, each its own pg-boss instance on the one database, as two app instances run them.
const workers = useQueueWorkers(db, 2);

const outboxRows = (workOrderId: string) =>
  db.selectFrom("mail_outbox").selectAll().where("work_order_id", "=", workOrderId).orderBy("recipient").execute();
const testMail = (fx: { shopId: string; workOrderId: string }, cause: string, to: string, subject: string) => ({
  shopId: fx.shopId,
  workOrderId: fx.workOrderId,
  kind: "quote_ready",
  cause,
  to,
  subject,
  text: "x",
});
const sends = (workOrderId: string) =>
  db.selectFrom("outbound_emails").select(["recipient", "error"]).where("work_order_id", "=", workOrderId).execute();

describe("the e-mail queue", () => {
  it("two workers on one database deliver each e-mail exactly once, even when it is handed to both", async () => {
    const fx = await createShopFixture(db);
    const stamp = Date.now();
    const addresses = Array.from({ length: 8 }, (_, i) => `twice-${stamp}-${i}@example.test`);
    const mails = addresses.map((to, i) => ({
      shopId: fx.shopId,
      workOrderId: fx.workOrderId,
      kind: "quote_ready",
      cause: `test-twice:${stamp}`,
      to,
      subject: `Exactly once ${i}`,
      text: "One copy only.",
    }));
    const ids = await enqueueMails(db, mails, workers[0]);
    expect(ids).toHaveLength(8);
    // The same cause again queues nothing new; and every e-mail is handed to the other instance
    // too, and once more under a job id of its own, so both workers hold jobs for the same e-mails.
    expect(await enqueueMails(db, mails, workers[1])).toEqual([]);
    await handToQueue(ids, workers[1]);
    for (const id of ids) await workers[1].send(QUEUES.mail, { mailId: id });

    await eventually(async () => (await outboxRows(fx.workOrderId)).every((r) => r.state === "sent"));
    for (const to of addresses) expect(await mailTo(ports.mailWeb, to, 2, 1500)).toHaveLength(1);
    const rows = await outboxRows(fx.workOrderId);
    expect(rows.map((r) => [r.state, r.attempts])).toEqual(addresses.map(() => ["sent", 1]));
    expect(await sends(fx.workOrderId)).toHaveLength(8);
  });

  it("an SMTP that refuses is tried again with back-off, and the e-mail goes out once when it answers", async () => {
    const fx = await createShopFixture(db);
    const to = `retry-${Date.now()}@example.test`;
    await withSmtpRefusing(async () => {
      await enqueueMails(db, [testMail(fx, "test-retry", to, "After a retry")]);
      await eventually(async () => (await sends(fx.workOrderId)).length >= 1);
      const [waiting] = await outboxRows(fx.workOrderId);
      expect(waiting.state).toBe("queued");
      expect(waiting.last_error).toMatch(/ECONNREFUSED|connect/i);
    });
    await eventually(async () => (await outboxRows(fx.workOrderId))[0].state === "sent");
    expect(await mailTo(ports.mailWeb, to, 2, 1500)).toHaveLength(1);
    const log = await sends(fx.workOrderId);
    expect(log.filter((l) => l.error)).not.toHaveLength(0);
    expect(log.filter((l) => !l.error)).toEqual([{ recipient: to, error: null }]);
    const [sent] = await outboxRows(fx.workOrderId);
    expect(sent.attempts).toBe(log.length);
    expect(sent.last_error).toBeNull();
  });

  it("an e-mail that fails every allowed try is marked failed, listed for the office, and sent once when the office tries it again", async () => {
    const fx = await createShopFixture(db);
    const to = `never-${Date.now()}@example.test`;
    await withSmtpRefusing(async () => {
      await enqueueMails(db, [testMail(fx, "test-fail", to, "Never goes out")]);
      await eventually(async () => (await outboxRows(fx.workOrderId))[0].state === "failed", 20_000);
    });
    const [failed] = await outboxRows(fx.workOrderId);
    expect(failed.attempts).toBe(TEST_MAIL_RETRY.retryLimit + 1);
    const { open } = await outboxForOffice(db, fx.shopId);
    expect(open).toEqual([
      expect.objectContaining({
        subject: "Never goes out",
        state: "failed",
        attempts: 3,
        workOrderNumber: 1,
        lastError: expect.stringMatching(/connect/i),
      }),
    ]);
    expect(await mailTo(ports.mailWeb, to, 1, 300)).toEqual([]);

    const post = () =>
      tryAgain.handle(
        appRequest("/api/office/outbox-mail", {
          method: "POST",
          headers: { "content-type": "application/json" },
          body: JSON.stringify({ id: failed.id }),
        }),
        {
          user: { ...fx.users.office, customerId: null },
          db,
        },
      );
    expect((await post()).status).toBe(200);
    await eventually(async () => (await outboxRows(fx.workOrderId))[0].state === "sent");
    expect(await mailTo(ports.mailWeb, to, 2, 1500)).toHaveLength(1);
    // Sent now: trying it again is refused, and nothing more goes out.
    const again = await post();
    expect(again.status).toBe(409);
    expect((await again.json()).error).toBe("E-mail: only a failed e-mail of this shop can be tried again.");
  });

  it("reading the review queue sends nothing; the merge's notice goes out through the queue once", async () => {
    const { fx, specs, stepIds, users, stage } = await reviewSetup(db);
    const tablet = new Tablet("bay-1", users.mech.id, fx.workOrderId);
    const { ops, signOff } = measureStageWork(tablet, specs, stepIds, stage, { "top-ring-gap:3": 0.31 });
    await sync(db, users.mech, tablet, ops);
    const notice = () => db.selectFrom("review_notices").selectAll().where("sign_off_id", "=", signOff.id).executeTakeFirstOrThrow();
    expect(await notice()).toMatchObject({ state: "waiting" });

    // Reads of the queue by the supervisor: no notice is taken, no e-mail queued or sent.
    for (let i = 0; i < 3; i++) {
      const res = await reviewQueue.handle(appRequest("/api/review/queue"), { user: users.sup, db });
      expect(res.status).toBe(200);
    }
    await new Promise((r) => setTimeout(r, 1500));
    expect(await notice()).toMatchObject({ state: "waiting", attempts: 0 });
    expect(await outboxRows(fx.workOrderId)).toEqual([]);
    expect(await mailTo(ports.mailWeb, users.sup.email, 1, 300)).toEqual([]);

    // The sweep (every minute; run here at once) queues it, and a worker sends it.
    await workers[1].send(QUEUES.sweep, {});
    await eventually(async () => (await outboxRows(fx.workOrderId)).some((r) => r.state === "sent"));
    expect(await notice()).toMatchObject({ state: "sent" });
    expect(await mailTo(ports.mailWeb, users.sup.email, 2, 1500)).toHaveLength(1);
  });

  it("an e-mail whose job was lost (stored, never handed on) is sent by the sweep, once", async () => {
    const fx = await createShopFixture(db);
    const to = `lost-${Date.now()}@example.test`;
    const [id] = await queueMails(db, [testMail(fx, "test-lost", to, "Lost job")]);
    await db
      .updateTable("mail_outbox")
      .set({ queued_at: new Date(Date.now() - 5 * 60_000) })
      .where("id", "=", id)
      .execute();
    await workers[0].send(QUEUES.sweep, {});
    await workers[1].send(QUEUES.sweep, {});
    await eventually(async () => (await outboxRows(fx.workOrderId))[0].state === "sent");
    expect(await mailTo(ports.mailWeb, to, 2, 1500)).toHaveLength(1);
    expect((await outboxRows(fx.workOrderId))[0].attempts).toBe(1);
  });

  it("an e-mail whose worker stopped between claiming and sending it is sent by the sweep, not left claimed for ever", async () => {
    const fx = await createShopFixture(db);
    const to = `claimed-${Date.now()}@example.test`;
    const [id] = await queueMails(db, [testMail(fx, "test-claimed", to, "Claimed, never sent")]);
    // As a worker leaves it when it stops after claiming: marked sending, its job long gone (pg-boss
    // expired it, and the retry found the claim still fresh and ended as "not mine").
    await db
      .updateTable("mail_outbox")
      .set({ state: "sending", attempts: 1, claimed_at: new Date(Date.now() - 10 * 60_000), queued_at: new Date(Date.now() - 11 * 60_000) })
      .where("id", "=", id)
      .execute();
    expect(await strandedMails(db, 60_000)).toContain(id);
    await workers[0].send(QUEUES.sweep, {});
    await eventually(async () => (await outboxRows(fx.workOrderId))[0].state === "sent");
    expect(await mailTo(ports.mailWeb, to, 1, 1500)).toHaveLength(1);
    expect((await outboxRows(fx.workOrderId))[0].attempts).toBe(2);
  });

  it("an e-mail claimed a moment ago by a live worker is left to it by the sweep", async () => {
    const fx = await createShopFixture(db);
    const to = `fresh-claim-${Date.now()}@example.test`;
    const [id] = await queueMails(db, [testMail(fx, "test-fresh-claim", to, "Being sent")]);
    await db
      .updateTable("mail_outbox")
      .set({ state: "sending", attempts: 1, claimed_at: new Date(), queued_at: new Date(Date.now() - 11 * 60_000) })
      .where("id", "=", id)
      .execute();
    expect(await strandedMails(db, 60_000)).not.toContain(id);
    const row = (await outboxRows(fx.workOrderId))[0];
    expect(row.state).toBe("sending");
    expect(row.attempts).toBe(1);
  });
});
