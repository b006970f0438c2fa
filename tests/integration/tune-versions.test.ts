import { createHash } from "node:crypto";
import { PDFParse } from "pdf-parse";
import { beforeAll, describe, expect, it } from "vitest";
import { renderHandoverReportPdf } from "@/app/_server/handover-report";
import { GET as downloadTune } from "@/app/api/jobs/[id]/tunes/[tuneId]/file/route";
import { GET as listTunes, POST as uploadTune } from "@/app/api/jobs/[id]/tunes/route";
import { importDynoRun } from "@/db/records/dyno-import";
import { listDynoRuns } from "@/db/records/dyno";
import { TUNE_FILE_MAX_BYTES } from "@/lib/dyno/tune-version";
import { useFakes } from "./support/fakes";
import { asUser } from "./support/review-bench";
import { appRequest } from "./support/route-calls";
import { createShopFixture, type ShopFixture } from "./support/shop-fixture";
import { useTestDb } from "./support/test-db";

const db = useTestDb();
beforeAll(() => {
  useFakes();
});

function form(file: Blob | null, fileName: string, label: string, notes = "") {
  const f = new FormData();
  if (file) f.set("file", file, fileName);
  f.set("label", label);
  f.set("notes", notes);
  return f;
}

async function upload(fx: ShopFixture, body: FormData | ReadableStream<Uint8Array>, headers: Record<string, string> = {}) {
  return uploadTune.handle(appRequest(`/api/jobs/${fx.workOrderId}/tunes`, { method: "POST", body, headers }), {
    user: asUser(fx.users.mechanic),
    db,
    params: { id: fx.workOrderId },
  });
}

const run = (tuneVersionId: string | null | undefined) => ({
  label: "Check run",
  ranOn: "2026-12-02",
  boostTarget: "8",
  boostUnit: "psi",
  pressureKpa: "99",
  temperatureC: "25",
  humidityPercent: "0",
  standard: "ISO_1585",
  ...(tuneVersionId === undefined ? {} : { tuneVersionId }),
  curve: {
    source: "table",
    torqueUnit: "N·m",
    rows: [
      { rpm: "6000", torque: "100" },
      { rpm: "9000", torque: "100" },
    ],
  },
});

describe("tune versions (real PostgreSQL, s3rver)", () => {
  it("stores the file in object storage with its SHA-256; the download is the same bytes; runs name it; the report names the tune handed over and its hash", async () => {
    const fx = await createShopFixture(db);
    const bytes = new Uint8Array(5000).map((_, i) => (i * 37) % 256);
    const expected = createHash("sha256").update(bytes).digest("hex");
    const res = await upload(
      fx,
      form(new Blob([bytes], { type: "application/octet-stream" }), "corvid-v3.bin", "v3 10 psi", "Timing −2° above 8000 rpm"),
    );
    expect(res.status).toBe(201);
    const made = (await res.json()) as { id: string; sha256: string; sizeBytes: number };
    expect(made.sha256).toBe(expected);
    expect(made.sizeBytes).toBe(5000);

    const listed = (await (
      await listTunes.handle(appRequest(`/api/jobs/${fx.workOrderId}/tunes`), {
        user: asUser(fx.users.office),
        db,
        params: { id: fx.workOrderId },
      })
    ).json()) as {
      tunes: Array<{ label: string; sha256: string; fileName: string; uploadedBy: string; notes: string }>;
    };
    expect(listed.tunes).toEqual([
      expect.objectContaining({
        label: "v3 10 psi",
        sha256: expected,
        fileName: "corvid-v3.bin",
        uploadedBy: fx.users.mechanic.name,
        notes: "Timing −2° above 8000 rpm",
      }),
    ]);

    const file = await downloadTune.handle(appRequest(`/api/jobs/${fx.workOrderId}/tunes/${made.id}/file`), {
      user: asUser(fx.users.supervisor),
      db,
      params: { id: fx.workOrderId, tuneId: made.id },
    });
    expect(file.status).toBe(200);
    expect(file.headers.get("x-content-sha256")).toBe(expected);
    expect(file.headers.get("content-disposition")).toContain("corvid-v3.bin");
    expect(
      createHash("sha256")
        .update(new Uint8Array(await file.arrayBuffer()))
        .digest("hex"),
    ).toBe(expected);

    // the work order now has a tune: a run must say which (or none, said outright)
    const silent = await importDynoRun(db, fx.shopId, fx.workOrderId, fx.users.mechanic.id, run(undefined)).catch((e: unknown) => e);
    expect(silent).toMatchObject({ status: 400, issues: [{ path: "tuneVersionId", message: expect.stringContaining("Say which tune") }] });
    expect(await importDynoRun(db, fx.shopId, fx.workOrderId, fx.users.mechanic.id, run(made.id))).toMatchObject({ ok: true });
    const [stored] = await listDynoRuns(db, fx.shopId, fx.workOrderId);
    expect(stored.tune).toEqual({ id: made.id, label: "v3 10 psi", sha256: expected });

    const pdf = await renderHandoverReportPdf(db, fx.shopId, fx.workOrderId);
    const text = (await new PDFParse({ data: new Uint8Array(pdf) }).getText()).text.replace(/\s+/g, " ");
    expect(text).toContain("Tune handed over");
    expect(text).toContain("v3 10 psi");
    expect(text).toContain(expected.slice(0, 32));
    expect(text).toContain(expected.slice(32));
  });

  it("a new tune version on a handed-over job is refused in words and stored nowhere: the report keeps naming the tune the bike left with", async () => {
    const fx = await createShopFixture(db);
    const first = await upload(fx, form(new Blob([new Uint8Array([1, 2, 3])]), "left-with.bin", "v3 as handed over"));
    expect(first.status).toBe(201);
    await db.updateTable("work_orders").set({ status: "handed_over", closed_at: new Date() }).where("id", "=", fx.workOrderId).execute();
    const late = await upload(fx, form(new Blob([new Uint8Array([4, 5, 6])]), "after.bin", "v4 after handover"));
    expect(late.status).toBe(409);
    const body = (await late.json()) as { error: string };
    expect(body.error).toMatch(
      /^Work order #\d+ is handed over: its record is closed\. A new tune version for a bike that has left belongs on a new work order/,
    );
    const labels = await db.selectFrom("tune_versions").select("label").where("work_order_id", "=", fx.workOrderId).execute();
    expect(labels).toEqual([{ label: "v3 as handed over" }]);
  });

  it("a run cannot name another work order's tune", async () => {
    const a = await createShopFixture(db);
    const b = await createShopFixture(db);
    const made = (await (await upload(a, form(new Blob(["map"]), "a.map", "A1"))).json()) as { id: string };
    const r = await importDynoRun(db, b.shopId, b.workOrderId, b.users.mechanic.id, run(made.id)).catch((e: unknown) => e);
    expect(r).toMatchObject({
      status: 400,
      issues: [{ path: "tuneVersionId", message: "That tune is not one of this work order's tune versions." }],
    });
    // nor read its file
    const other = await downloadTune.handle(appRequest(`/api/jobs/${a.workOrderId}/tunes/${made.id}/file`), {
      user: asUser(b.users.office),
      db,
      params: { id: a.workOrderId, tuneId: made.id },
    });
    expect(other.status).toBe(404);
  });

  it("refuses a body past the limit while it streams in (413), an empty file, a label used twice; stores nothing then", async () => {
    const fx = await createShopFixture(db);
    // a stream with no Content-Length that goes on past the limit
    let sent = 0;
    const chunk = new Uint8Array(1024 * 1024);
    const endless = new ReadableStream<Uint8Array>({
      pull(controller) {
        sent += chunk.byteLength;
        controller.enqueue(chunk);
        if (sent > TUNE_FILE_MAX_BYTES * 2) controller.close();
      },
    });
    const tooBig = await upload(fx, endless, { "content-type": "multipart/form-data; boundary=x" });
    expect(tooBig.status).toBe(413);
    expect(((await tooBig.json()) as { error: string }).error).toContain("A tune file may be at most 16 MiB.");
    expect(sent).toBeLessThan(TUNE_FILE_MAX_BYTES * 2); // reading stopped once past the limit

    const empty = await upload(fx, form(new Blob([]), "empty.bin", "v0"));
    expect(empty.status).toBe(400);
    expect(((await empty.json()) as { issues: unknown[] }).issues).toContainEqual({
      path: "file",
      message: "Choose the tune file (it must not be empty).",
    });

    expect((await upload(fx, form(new Blob(["one"]), "one.bin", "v1"))).status).toBe(201);
    const twice = await upload(fx, form(new Blob(["two"]), "two.bin", "v1"));
    expect(twice.status).toBe(409);
    const noLabel = await upload(fx, form(new Blob(["three"]), "three.bin", "  "));
    expect(((await noLabel.json()) as { issues: Array<{ path: string }> }).issues.map((i) => i.path)).toEqual(["label"]);
    const rows = await db.selectFrom("tune_versions").select("label").where("work_order_id", "=", fx.workOrderId).execute();
    expect(rows).toEqual([{ label: "v1" }]);
  });
});
