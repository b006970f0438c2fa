import Papa from "papaparse";
import { sql } from "kysely";
import { describe, expect, it } from "vitest";
import { auditCsvResponse } from "@/app/_server/audit-csv-response";
import { appendAudit, type AuditEntry } from "@/db/audit/append";
import { COUNT_CAP, auditLogBatches, pageAuditLog, pageAuditLogSql } from "@/db/audit/read";
import type { AuditRange } from "@/lib/review/audit-range";
import { auditFilterSchema, auditQuerySchema } from "@/lib/review/list-queries";
import { createShopFixture } from "./support/shop-fixture";
import { useTestDb } from "./support/test-db";

const db = useTestDb();
const DAY = 24 * 60 * 60 * 1000;

/** Appends `n` entries through the app's own writer, in inserts of at most 2000. */
async function append(shopId: string, actorId: string, workOrderId: string | null, action: string, n: number, from = 0) {
  const entries: AuditEntry[] = Array.from({ length: n }, (_, i) => ({
    shopId,
    actorId,
    action,
    entity: "work_order",
    entityId: String(from + i),
    workOrderId,
    outcome: i % 7 === 0 ? "refused" : "accepted",
    reason: i % 7 === 0 ? "=SUM(A1) not yours" : null,
    detail: { i: from + i },
  }));
  for (let i = 0; i < n; i += 2000) await appendAudit(db, entries.slice(i, i + 2000));
  return entries;
}

const range = (from: Date, until: Date): AuditRange => ({
  from,
  until,
  fromDay: from.toISOString().slice(0, 10),
  toDay: new Date(until.getTime() - 1).toISOString().slice(0, 10),
});

async function plan(q: ReturnType<typeof pageAuditLogSql>) {
  const r = await sql<{ "QUERY PLAN": string }>`EXPLAIN ${q}`.execute(db);
  return r.rows.map((x) => x["QUERY PLAN"]).join("\n");
}

describe("audit log at scale: a date range, a streamed download, a page that walks its index", () => {
  it("selects by moment, streams the rows of the range in batches, and the CSV holds exactly them", async () => {
    const fx = await createShopFixture(db);
    const office = fx.users.office.id;
    const before = await append(fx.shopId, office, fx.workOrderId, "test.range", 700);
    // The cut: a moment after every entry above was committed and before any below.
    const [{ cut }] = (await sql<{ cut: Date }>`SELECT clock_timestamp() AS cut`.execute(db)).rows;
    await new Promise((r) => setTimeout(r, 5));
    const after = await append(fx.shopId, office, fx.workOrderId, "test.range", 600, 700);

    const collect = async (r: AuditRange) => {
      const out: string[] = [];
      let reads = 0;
      for await (const b of auditLogBatches(db, fx.shopId, auditFilterSchema.parse({}), r)) {
        reads++;
        out.push(...b.map((x) => x.entityId ?? ""));
      }
      return { ids: out, reads };
    };
    const early = await collect(range(new Date(cut.getTime() - DAY), cut));
    expect(early.ids).toEqual(before.map((e) => e.entityId));
    expect(early.reads).toBe(2);
    const late = await collect(range(cut, new Date(cut.getTime() + DAY)));
    expect(late.ids).toEqual(after.map((e) => e.entityId));
    expect((await collect(range(new Date(cut.getTime() - 3 * DAY), new Date(cut.getTime() - 2 * DAY)))).ids).toEqual([]);

    // The response streams: its body arrives in more than one piece, and the pieces are the range's rows, oldest first.
    const res = auditCsvResponse(db, fx.shopId, {
      filter: auditFilterSchema.parse({ outcome: "refused" }),
      range: range(cut, new Date(cut.getTime() + DAY)),
    });
    expect(res.body).toBeInstanceOf(ReadableStream);
    expect(res.headers.get("content-disposition")).toMatch(
      /^attachment; filename="audit-log-all-\d{4}-\d\d-\d\d-to-\d{4}-\d\d-\d\d\.csv"$/,
    );
    const reader = res.body!.getReader();
    const pieces: string[] = [];
    const decoder = new TextDecoder();
    for (let r = await reader.read(); !r.done; r = await reader.read()) pieces.push(decoder.decode(r.value, { stream: true }));
    // 600 entries, every 7th refused: 86 rows fit one read of 500, so one piece (header with the rows).
    const text = pieces.join("");
    const parsed = Papa.parse<Record<string, string>>(text, { header: true, skipEmptyLines: true });
    const refusedAfter = after.filter((e) => e.outcome === "refused");
    expect(parsed.data.map((r) => r.entity_id)).toEqual(refusedAfter.map((e) => e.entityId));
    expect(parsed.data.every((r) => r.reason === "'=SUM(A1) not yours")).toBe(true);

    const all = auditCsvResponse(db, fx.shopId, {
      filter: auditFilterSchema.parse({}),
      range: range(new Date(cut.getTime() - DAY), new Date(cut.getTime() + DAY)),
    });
    const allReader = all.body!.getReader();
    let chunks = 0;
    let whole = "";
    for (let r = await allReader.read(); !r.done; r = await allReader.read()) {
      chunks++;
      whole += decoder.decode(r.value);
    }
    expect(chunks).toBe(3); // 1300 rows, 500 per read
    const rows = Papa.parse<Record<string, string>>(whole, { header: true, skipEmptyLines: true }).data;
    expect(rows.map((r) => r.entity_id)).toEqual([...before, ...after].map((e) => e.entityId));
  });

  it("counts up to 10,000 and then says more; the page and a job's page use their indexes", async () => {
    const fx = await createShopFixture(db);
    const other = await createShopFixture(db);
    await append(fx.shopId, fx.users.office.id, null, "test.many", COUNT_CAP + 5);
    await append(fx.shopId, fx.users.office.id, fx.workOrderId, "test.job", 300);
    await append(other.shopId, other.users.office.id, other.workOrderId, "test.other", 2000);
    await sql`ANALYZE audit_log`.execute(db);

    const page = await pageAuditLog(db, fx.shopId, auditQuerySchema.parse({ size: "25" }));
    expect(page).toMatchObject({ total: COUNT_CAP, more: true });
    expect(page.rows).toHaveLength(25);
    expect(page.rows[0]).toMatchObject({ action: "test.job", entityId: "299" });
    const job = await pageAuditLog(db, fx.shopId, auditQuerySchema.parse({ job: "1", size: "100" }));
    expect(job).toMatchObject({ total: 300, more: false });
    expect(job.rows.map((r) => r.entityId)).toEqual(Array.from({ length: 100 }, (_, i) => String(299 - i)));
    const oldest = await pageAuditLog(db, fx.shopId, auditQuerySchema.parse({ size: "3", dir: "asc" }));
    expect(oldest.rows.map((r) => r.entityId)).toEqual(["0", "1", "2"]);

    // Newest first walks an index in id order backwards, stops after the page and sorts nothing: the
    // index (shop_id, id), or the primary key when this shop holds nearly every entry (as here).
    const newest = await plan(pageAuditLogSql(fx.shopId, auditQuerySchema.parse({ size: "25", page: "3" })));
    expect(newest).toMatch(/^Limit[\s\S]*Index Scan Backward using audit_log_(shop_id_idx|pkey) on audit_log a/);
    expect(newest).not.toMatch(/\bSort\b/);
    expect(newest).not.toMatch(/Seq Scan on audit_log/);
    const byJob = await plan(pageAuditLogSql(fx.shopId, auditQuerySchema.parse({ job: "1", size: "25" })));
    // A job's page reads the log through an index (the job's, directly or as a bitmap, or the primary
    // key backwards: the planner's pick on a small, freshly filled table varies), never the whole table.
    expect(byJob).toMatch(/(Index Scan (Backward )?using|Bitmap Index Scan on) audit_log_(job_id_idx|pkey)\b/);
    expect(byJob).not.toMatch(/Seq Scan on audit_log/);
    // The old order (id DESC NULLS LAST) could not walk the index: the database sorted every entry of the shop.
    const old = await plan(
      sql`SELECT a.id FROM audit_log a WHERE a.shop_id = ${fx.shopId}::uuid ORDER BY a.id DESC NULLS LAST, a.id DESC LIMIT 25`,
    );
    expect(old).toMatch(/\bSort\b/);
  });
});
