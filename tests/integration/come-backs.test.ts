import { describe, expect, it } from "vitest";
import { storeHandoverCopy } from "@/app/_server/frozen-report";
import { GET as tagLookup } from "@/app/api/bench/tags/[code]/route";
import { POST as findingRoute } from "@/app/api/come-backs/[id]/findings/route";
import { POST as openRoute } from "@/app/api/come-backs/route";
import { comeBacksByBatch, comeBacksByTemplate, comeBackView } from "@/db/aftercare/come-backs";
import { handOver } from "@/db/office/invoices";
import { addPartFitted } from "@/db/office/parts";
import { loadHandoverReport } from "@/db/records/handover-report";
import { loadOpenItems } from "@/db/records/open-items";
import { moveWorkOrder } from "@/db/shop/work-orders";
import type { SessionUser } from "@/lib/auth/session-user";
import { closeOutJob, finishEverything, type CloseOutJob } from "./support/close-out";
import { useFakes } from "./support/fakes";
import { appRequest } from "./support/route-calls";
import { useTestDb } from "./support/test-db";

// Come-backs on real PostgreSQL: who may open one and when, the original's record beside the
// come-back's, findings kept append-only, and the lists by part batch and by procedure template.

const db = useTestDb();
useFakes();

/** A close-out job worked at the bench (readings 0.15 and 0.16 mm), a batch of seals fitted, and handed over. */
async function handedOverJob(batch = `SEAL-${Math.random().toString(36).slice(2, 8)}`) {
  const job = await closeOutJob(db);
  // the fixture's own job on the same bike is dropped, so the bike has no other open work order
  await db.updateTable("work_orders").set({ status: "cancelled", closed_at: new Date() }).where("id", "=", job.fx.workOrderId).execute();
  await finishEverything(db, job);
  await addPartFitted(db, job.fx.shopId, job.users.office.id, job.workOrderId, {
    partNumber: "CS-118",
    description: "Cover seal",
    batch,
    quantity: 2,
  });
  await moveWorkOrder(db, job.fx.shopId, job.users.office.id, job.workOrderId, "ready");
  expect(await loadOpenItems(db, job.fx.shopId, job.workOrderId)).toEqual([]);
  await handOver(db, job.fx.shopId, job.users.office.id, job.workOrderId, {
    storeReport: (trx) => storeHandoverCopy(trx, job.fx.shopId, job.workOrderId, job.users.office.id),
  });
  return { job, batch };
}

const open = (user: SessionUser, body: unknown) =>
  openRoute.handle(
    appRequest("/api/come-backs", { method: "POST", headers: { "content-type": "application/json" }, body: JSON.stringify(body) }),
    {
      user,
      db,
      params: {},
    },
  );
const finding = (user: SessionUser, id: string, body: unknown) =>
  findingRoute.handle(
    appRequest(`/api/come-backs/${id}/findings`, {
      method: "POST",
      headers: { "content-type": "application/json" },
      body: JSON.stringify(body),
    }),
    { user, db, params: { id } },
  );
const report = (job: CloseOutJob) => ({
  originalWorkOrderId: job.workOrderId,
  riderReport: "Oil weeping at the cover after 300 km.",
  warrantyClaimed: true,
  odometerKm: 1500,
});
const workOrderCount = async (shopId: string) =>
  Number(
    (
      await db
        .selectFrom("work_orders")
        .select((eb) => eb.fn.countAll().as("n"))
        .where("shop_id", "=", shopId)
        .executeTakeFirstOrThrow()
    ).n,
  );

describe("opening a come-back", () => {
  it("the supervisor opens one on a handed-over job: a new work order for the same bike, booked in, linked to the original", async () => {
    const { job } = await handedOverJob();
    const res = await open(job.users.sup, report(job));
    expect(res.status).toBe(201);
    const made = (await res.json()) as { id: string; workOrderId: string; number: number };
    const wo = await db.selectFrom("work_orders").selectAll().where("id", "=", made.workOrderId).executeTakeFirstOrThrow();
    expect(wo).toMatchObject({
      bike_id: job.fx.bike.id,
      status: "booked_in",
      number: made.number,
      complaint: report(job).riderReport,
      intake_odometer_km: 1500,
    });
    expect(wo.title).toBe("Come-back of #2: Close-out job");
    const link = await db.selectFrom("come_backs").selectAll().where("id", "=", made.id).executeTakeFirstOrThrow();
    expect(link).toMatchObject({
      original_work_order_id: job.workOrderId,
      work_order_id: made.workOrderId,
      warranty_claimed: true,
      opened_by: job.users.sup.id,
    });
    const audit = await db
      .selectFrom("audit_log")
      .select(["action", "entity_id"])
      .where("work_order_id", "=", made.workOrderId)
      .where("action", "=", "come_back.open")
      .execute();
    expect(audit).toEqual([{ action: "come_back.open", entity_id: made.id }]);
  });

  it("refuses a mechanic (the route's area), a job not handed over, and a second come-back while one is open (naming it); nothing is half-saved", async () => {
    const { job } = await handedOverJob();
    expect((await open(job.users.mech, report(job))).status).toBe(403);

    const notYet = await closeOutJob(db);
    const before = await workOrderCount(notYet.fx.shopId);
    const r1 = await open(notYet.users.office, report(notYet));
    expect(r1.status).toBe(409);
    expect((await r1.json()).error).toBe(
      "Job #2 is on the dyno, not handed over: a come-back is opened only for a bike that has been handed over.",
    );
    expect(await workOrderCount(notYet.fx.shopId)).toBe(before);

    // the shop keeps a calendar whose day differs from UTC's now (UTC+14 from 10:00 UTC, UTC-11 before 11:00)
    const dayIn = (timeZone: string) =>
      new Intl.DateTimeFormat("en-GB", { day: "numeric", month: "short", year: "numeric", timeZone }).format(new Date());
    const zone = ["Pacific/Kiritimati", "Pacific/Pago_Pago"].find((z) => dayIn(z) !== dayIn("UTC"))!;
    await db.updateTable("shops").set({ time_zone: zone }).where("id", "=", job.fx.shopId).execute();
    const first = await open(job.users.office, report(job));
    expect(first.status).toBe(201);
    const { number } = (await first.json()) as { number: number };
    const count = await workOrderCount(job.fx.shopId);
    const second = await open(job.users.sup, report(job));
    expect(second.status).toBe(409);
    const refusal = (await second.json()).error as string;
    expect(refusal).toMatch(
      new RegExp(`^Come-back #${number} for job #2 is still open \\(opened .+ by office .+\\): carry on with that one\\.$`),
    );
    // opened today as the shop's calendar reads it (not UTC's day)
    expect(refusal).toContain(`(opened ${dayIn(zone)} by office`);
    expect(await workOrderCount(job.fx.shopId)).toBe(count);
    expect(await db.selectFrom("come_backs").select("id").where("original_work_order_id", "=", job.workOrderId).execute()).toHaveLength(1);
  });

  it("two offices opening at the same moment make one come-back; the other is told which", async () => {
    const { job } = await handedOverJob();
    const [a, b] = await Promise.all([open(job.users.office, report(job)), open(job.users.sup, report(job))]);
    expect([a.status, b.status].sort()).toEqual([201, 409]);
    expect(await db.selectFrom("come_backs").select("id").where("original_work_order_id", "=", job.workOrderId).execute()).toHaveLength(1);
  });

  it("the rider's report is checked in workshop words: too long, a NUL character, empty", async () => {
    const { job } = await handedOverJob();
    const cases: Array<[string, string]> = [
      ["x".repeat(2001), "What the rider reports: at most 2000 characters."],
      ["oil\u0000leak", "What the rider reports holds a NUL character, which cannot be stored: retype it."],
      ["  ", "Write down what the rider reports."],
    ];
    for (const [riderReport, message] of cases) {
      const r = await open(job.users.office, { ...report(job), riderReport });
      expect(r.status).toBe(400);
      expect(JSON.stringify(await r.json())).toContain(message);
    }
    const km = await open(job.users.office, { ...report(job), odometerKm: -5 });
    expect(km.status).toBe(400);
    expect(await db.selectFrom("come_backs").select("id").where("original_work_order_id", "=", job.workOrderId).execute()).toEqual([]);
  });
});

describe("the bench's scan of a handed-over bike", () => {
  it("names the handed-over job; the supervisor is offered a come-back, a mechanic is told to ask; once one is open it is just a job not on the bench", async () => {
    const { job } = await handedOverJob();
    const look = (user: SessionUser) =>
      tagLookup.handle(appRequest(`/api/bench/tags/${job.fx.bike.tag_code}`), { user, db, params: { code: job.fx.bike.tag_code } });
    const sup = await look(job.users.sup);
    expect(sup.status).toBe(200);
    expect(await sup.json()).toMatchObject({
      handedOver: { workOrderId: job.workOrderId, number: 2, tagCode: job.fx.bike.tag_code, canOpenComeBack: true, openComeBack: null },
    });
    const mech = await look(job.users.mech);
    expect(await mech.json()).toMatchObject({ handedOver: { number: 2, canOpenComeBack: false } });
    expect((await open(job.users.sup, report(job))).status).toBe(201);
    const after = await look(job.users.mech);
    expect(after.status).toBe(404);
    expect(await after.json()).toEqual({ error: `Bike ${job.fx.bike.tag_code} has no open job.`, issues: [] });
  });
});

describe("the come-back beside the original", () => {
  it("shows the original's readings, torque and parts with batches as the handover report reads them, and the come-back's own record beside", async () => {
    const { job, batch } = await handedOverJob();
    const made = (await (await open(job.users.office, report(job))).json()) as { id: string; workOrderId: string };
    const v = (await comeBackView(db, job.fx.shopId, made.id))!;
    expect(v.original).toEqual(await loadHandoverReport(db, job.fx.shopId, job.workOrderId));
    expect(v.original.readings.map((r) => [r.label, r.readingIndex, r.value, r.unit, r.verdict])).toEqual([
      ["Cover gap", 0, "0.15", "mm", "in"],
      ["Cover gap", 1, "0.16", "mm", "in"],
    ]);
    expect(v.original.parts.map((p) => [p.partNumber, p.batch, p.quantity])).toEqual([["CS-118", batch, 2]]);
    expect(v.now.job.id).toBe(made.workOrderId);
    expect(v.now.readings).toEqual([]);
    expect(v.now.parts).toEqual([]);
    expect(v.comeBack.originalHandedOverAt).toBeInstanceOf(Date);
  });
});

describe("findings on a come-back", () => {
  it("are append-only: a second one must name the one it replaces; both stay on record; text limits in workshop words", async () => {
    const { job } = await handedOverJob();
    const made = (await (await open(job.users.office, report(job))).json()) as { id: string };
    const first = await finding(job.users.sup, made.id, { underWarranty: true, cause: "part_failed", note: "Seal lip torn on fitting." });
    expect(first.status).toBe(201);
    const f1 = (await first.json()) as { id: string };
    const blind = await finding(job.users.office, made.id, { underWarranty: false, cause: "not_our_work", note: "Rider dropped it." });
    expect(blind.status).toBe(409);
    expect((await blind.json()).error).toMatch(/^A finding is already on record \(by sup .+\); a new one replaces it/);
    const long = await finding(job.users.office, made.id, {
      underWarranty: false,
      cause: "not_our_work",
      note: "y".repeat(2001),
      replacesId: f1.id,
    });
    expect(long.status).toBe(400);
    expect(JSON.stringify(await long.json())).toContain("What was found: at most 2000 characters.");
    const badCause = await finding(job.users.office, made.id, {
      underWarranty: false,
      cause: "shrug",
      note: "Nothing.",
      replacesId: f1.id,
    });
    expect(badCause.status).toBe(400);
    expect(JSON.stringify(await badCause.json())).toContain("Choose what caused the come-back.");
    const second = await finding(job.users.office, made.id, {
      underWarranty: false,
      cause: "not_our_work",
      note: "Rider dropped it.",
      replacesId: f1.id,
    });
    expect(second.status).toBe(201);
    const again = await finding(job.users.office, made.id, {
      underWarranty: false,
      cause: "nothing_found",
      note: "x y z",
      replacesId: f1.id,
    });
    expect(again.status).toBe(409);
    const v = (await comeBackView(db, job.fx.shopId, made.id))!;
    expect(v.findings.map((f) => [f.cause, f.underWarranty, f.current])).toEqual([
      ["part_failed", true, false],
      ["not_our_work", false, true],
    ]);
    await expect(db.updateTable("come_back_findings").set({ note: "edited" }).where("id", "=", f1.id).execute()).rejects.toThrow(
      /append-only/,
    );
  });
});

describe("come-backs grouped so a bad batch or procedure shows up", () => {
  it("lists each batch fitted on come-back originals with the come-backs and how many jobs got it, and each template with its handed-over jobs", async () => {
    const batch = `SEAL-BAD-${Date.now()}`;
    const a = await handedOverJob(batch);
    const made = (await (await open(a.job.users.office, report(a.job))).json()) as { number: number };
    const byBatch = await comeBacksByBatch(db, a.job.fx.shopId);
    expect(byBatch).toEqual([{ partNumber: "CS-118", description: "Cover seal", batch, comeBacks: [made.number], fittedJobs: 1 }]);
    const byTemplate = await comeBacksByTemplate(db, a.job.fx.shopId);
    expect(byTemplate).toEqual([expect.objectContaining({ name: "Close-out check", comeBacks: [made.number], handedOverJobs: 1 })]);
    // the batch typed another way on another handed-over job is the same batch; a cancelled job that
    // got it is not counted among the jobs that went out with it
    const fx = a.job.fx;
    const fit = (workOrderId: string, typed: string) =>
      db
        .insertInto("parts_fitted")
        .values({
          shop_id: fx.shopId,
          work_order_id: workOrderId,
          part_number: "cs 118",
          description: "Cover seal",
          batch: typed,
          quantity: 1,
          fitted_by: fx.users.office.id,
        })
        .execute();
    const later = await db
      .insertInto("work_orders")
      .values({
        shop_id: fx.shopId,
        bike_id: fx.bike.id,
        number: 77,
        title: "Seal change",
        status: "handed_over",
        intake_odometer_km: 5,
        closed_at: new Date(),
      })
      .returning("id")
      .executeTakeFirstOrThrow();
    await fit(later.id, batch.toLowerCase().replace(/-/g, " "));
    await fit(fx.workOrderId, batch.toLowerCase());
    expect(await comeBacksByBatch(db, fx.shopId)).toEqual([
      { partNumber: "CS-118", description: "Cover seal", batch, comeBacks: [made.number], fittedJobs: 2 },
    ]);
    // another shop sees none of it
    const other = await handedOverJob(batch);
    expect(await comeBacksByBatch(db, other.job.fx.shopId)).toEqual([]);
  });
});
