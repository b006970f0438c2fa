import { describe, expect, it } from "vitest";
import { GET as listPresets, POST as savePreset } from "@/app/api/presets/[kind]/route";
import { POST as postRun } from "@/app/api/jobs/[id]/dyno-runs/route";
import { listDynoRuns } from "@/db/records/dyno";
import { summariseRun, type ColumnMapping } from "@/lib/dyno";
import { asUser } from "./support/review-bench";
import { appRequest } from "./support/route-calls";
import { createShopFixture } from "./support/shop-fixture";
import { useTestDb } from "./support/test-db";

const db = useTestDb();

const mapping: ColumnMapping = {
  format: "benchtag-dyno-mapping",
  formatVersion: 1,
  columns: [
    { column: "RPM", channel: "rpm", unit: "rpm" },
    { column: "Torque", channel: "torque", unit: "N·m" },
    { column: "Lambda", channel: "mixture", unit: "λ" },
    { column: "Boost", channel: "boost", unit: "psi" },
    { column: "IAT pre", channel: "iatBeforeCooler", unit: "°C" },
    { column: "IAT post", channel: "iatAfterCooler", unit: "°C" },
    { column: "Timing", channel: "ignition", unit: "° BTDC" },
    { column: "Knock", channel: "knockRetard", unit: "°" },
    { column: "Speed", channel: "roadSpeed", unit: "km/h" },
    { column: "Gear", channel: "gear", unit: "gear" },
  ],
};
const fields = {
  label: "Logged 10 psi",
  ranOn: "2026-12-02",
  boostTarget: "10",
  boostUnit: "psi",
  pressureKpa: "100.3",
  temperatureC: "18",
  humidityPercent: "55",
  standard: "SAE_J1349_CURRENT",
  fuel: "E10",
  tuneVersionId: null,
  notes: "",
};
const csv = [
  "Time,RPM,Torque,Lambda,Boost,IAT pre,IAT post,Timing,Knock,Speed,Gear",
  "0.00,5000,100.5,0.82,9.8,88,31,22,0,120.5,4",
  "0.25,6000,110.25,0.81,10.1,95,33,24,0.5,144,4",
  "0.50,7000,112,0.88,11.9,101,35,24,,168.2,4",
].join("\n");

function post(user: ReturnType<typeof asUser>, workOrderId: string, body: unknown) {
  return postRun.handle(
    appRequest(`/api/jobs/${workOrderId}/dyno-runs`, {
      method: "POST",
      headers: { "content-type": "application/json" },
      body: JSON.stringify(body),
    }),
    { user, db, params: { id: workOrderId } },
  );
}

describe("logged channels on a dyno run (real PostgreSQL)", () => {
  it("stores every mapped channel as written, with its unit and file column, and reads it back", async () => {
    const fx = await createShopFixture(db);
    const res = await post(asUser(fx.users.mechanic), fx.workOrderId, {
      ...fields,
      curve: { source: "mapped-csv", fileName: "pull.csv", text: csv, mapping },
    });
    expect(res.status).toBe(201);
    const [run] = await listDynoRuns(db, fx.shopId, fx.workOrderId);
    expect(run.fuel).toBe("E10");
    expect(run.standard).toBe("SAE_J1349_CURRENT");
    expect(run.channels.map((c) => [c.channel, c.unit, c.sourceColumn])).toEqual([
      ["mixture", "λ", "Lambda"],
      ["boost", "psi", "Boost"],
      ["iatBeforeCooler", "°C", "IAT pre"],
      ["iatAfterCooler", "°C", "IAT post"],
      ["ignition", "° BTDC", "Timing"],
      ["knockRetard", "°", "Knock"],
      ["roadSpeed", "km/h", "Speed"],
      ["gear", "gear", "Gear"],
    ]);
    expect(run.points[1]).toEqual({
      rpm: 6000,
      torque: 110.25,
      logged: {
        mixture: 0.81,
        boost: 10.1,
        iatBeforeCooler: 95,
        iatAfterCooler: 33,
        ignition: 24,
        knockRetard: 0.5,
        roadSpeed: 144,
        gear: 4,
      },
    });
    expect(run.points[2].logged).not.toHaveProperty("knockRetard"); // empty cell: not logged there
    const source = await db.selectFrom("dyno_runs").select("source").where("id", "=", run.id).executeTakeFirstOrThrow();
    expect(source.source).toBe("mapped-csv");
    // boost in the plotting unit: 10.1 psi × 6.894 757 kPa (NIST SP 811) = 69.637 kPa
    const s = summariseRun(run);
    expect(s.series.boost![1].value).toBeCloseTo(69.637, 3);
  });

  it("a file with problems is refused whole, every line and column named, and nothing is stored", async () => {
    const fx = await createShopFixture(db);
    const bad = csv.replace("0.81,10.1", "0.81,abc").replace(",4\n0.50", ",4.5\n0.50").replace("112,0.88", "112,9.5");
    const res = await post(asUser(fx.users.mechanic), fx.workOrderId, { ...fields, curve: { source: "mapped-csv", text: bad, mapping } });
    expect(res.status).toBe(400);
    const body = (await res.json()) as { error: string; issues: Array<{ path: string; message: string }> };
    expect(body.error).toBe("Some entries need fixing.");
    expect(body.issues).toEqual([
      { path: "curve.3.Boost", message: 'Manifold boost must be a number; got "abc".' },
      { path: "curve.3.Gear", message: "Gear must be a whole number; got 4.5." },
      { path: "curve.4.Lambda", message: "Mixture must be from λ 0.4 to 3; got λ 9.5." },
    ]);
    const counts = await db
      .selectFrom("dyno_runs")
      .select(db.fn.countAll<string>().as("n"))
      .where("work_order_id", "=", fx.workOrderId)
      .executeTakeFirstOrThrow();
    expect(Number(counts.n)).toBe(0);
  });

  it("a mapping that does not fit the file, or is itself wrong, is refused with the place named", async () => {
    const fx = await createShopFixture(db);
    const missing = await post(asUser(fx.users.mechanic), fx.workOrderId, {
      ...fields,
      curve: { source: "mapped-csv", text: csv.replace("IAT post", "IAT2"), mapping },
    });
    expect(await missing.json()).toMatchObject({
      issues: [
        {
          path: "curve.1.IAT post",
          message: 'The mapping\'s column "IAT post" (intake air after the intercooler) is not in line 1 of the file.',
        },
      ],
    });
    const wrong = await post(asUser(fx.users.mechanic), fx.workOrderId, {
      ...fields,
      curve: { source: "mapped-csv", text: csv, mapping: { ...mapping, columns: mapping.columns.filter((c) => c.channel !== "rpm") } },
    });
    expect(await wrong.json()).toMatchObject({
      issues: [{ path: "curve.1.(mapping)", message: "Choose the column that holds engine speed." }],
    });
  });

  it("the boost target is checked per unit: 68.9 kPa is accepted, 59 bar refused in workshop words", async () => {
    const fx = await createShopFixture(db);
    const table = {
      source: "table",
      torqueUnit: "N·m",
      rows: [
        { rpm: "5000", torque: "90" },
        { rpm: "6000", torque: "95" },
      ],
    };
    const ok = await post(asUser(fx.users.mechanic), fx.workOrderId, { ...fields, boostTarget: "68.9", boostUnit: "kPa", curve: table });
    expect(ok.status).toBe(201);
    const refused = await post(asUser(fx.users.mechanic), fx.workOrderId, { ...fields, boostTarget: "59", boostUnit: "bar", curve: table });
    expect(refused.status).toBe(400);
    expect(((await refused.json()) as { issues: unknown[] }).issues).toContainEqual({
      path: "boostTarget",
      message: "Boost target 59 bar is 5900 kPa; the limit is 0 to 600 kPa (87 psi, 6 bar).",
    });
  });

  it("a mapping is saved per shop by name; saving the name again offers the newer one; another shop does not see it", async () => {
    const a = await createShopFixture(db);
    const b = await createShopFixture(db);
    const save = (fx: typeof a, body: unknown) =>
      savePreset.handle(
        appRequest("/api/presets/dyno-csv-mapping", {
          method: "POST",
          headers: { "content-type": "application/json" },
          body: JSON.stringify(body),
        }),
        { user: asUser(fx.users.mechanic), db, params: { kind: "dyno-csv-mapping" } },
      );
    const list = async (fx: typeof a) =>
      (await (
        await listPresets.handle(appRequest("/api/presets/dyno-csv-mapping"), {
          user: asUser(fx.users.office),
          db,
          params: { kind: "dyno-csv-mapping" },
        })
      ).json()) as {
        presets: Array<{ name: string; body: ColumnMapping }>;
      };
    expect((await save(a, { name: "Bay 2 logger", body: mapping })).status).toBe(201);
    const newer = { ...mapping, columns: mapping.columns.slice(0, 3) };
    expect((await save(a, { name: "Bay 2 logger", body: newer })).status).toBe(201);
    const mine = await list(a);
    expect(mine.presets).toHaveLength(1);
    expect(mine.presets[0].body.columns).toHaveLength(3);
    expect((await list(b)).presets).toEqual([]);
    const bad = await save(a, { name: "Broken", body: { ...mapping, columns: [{ column: "X", channel: "boost", unit: "atm" }] } });
    expect(bad.status).toBe(400);
    expect(JSON.stringify(await bad.json())).toContain('choose the unit kPa, psi, bar, kPa abs; got \\"atm\\"');
    // a customer reaches neither kind
    const customer = await listPresets.handle(appRequest("/api/presets/dyno-csv-mapping"), {
      user: { ...asUser(a.users.customer), customerId: null },
      db,
      params: { kind: "dyno-csv-mapping" },
    });
    expect(customer.status).toBe(403);
  });
});
