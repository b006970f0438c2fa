import { describe, expect, it } from "vitest";
import { checkDynoRunBody, parseCurveCsv } from "@/lib/dyno";
import { expectWithin } from "../calc/helpers";

describe("dyno curve CSV", () => {
  it("reads rpm and torque_nm, keeping values as written", () => {
    const r = parseCurveCsv("rpm,torque_nm\n3000,62.5\n3250,66.125\n");
    expect(r).toEqual({
      ok: true,
      torqueUnit: "N·m",
      points: [
        { rpm: 3000, torque: 62.5, torqueNm: 62.5 },
        { rpm: 3250, torque: 66.125, torqueNm: 66.125 },
      ],
    });
  });
  it("torque_lbft: 100 lbf·ft → 135.5818 N·m (NIST SP 811: 1 lbf·ft = 1.355 818 N·m)", () => {
    const r = parseCurveCsv("RPM,Torque_lbft\r\n4000,100\r\n5000,110\r\n");
    if (!r.ok) throw new Error(JSON.stringify(r.errors));
    expect(r.torqueUnit).toBe("lbf·ft");
    expect(r.points[0].torque).toBe(100);
    expectWithin(r.points[0].torqueNm, 135.5818, 0.00005);
  });
  it("skips blank lines but reports real line numbers", () => {
    const r = parseCurveCsv("rpm,torque_nm\n3000,60\n\n3500,abc\n");
    expect(r.ok).toBe(false);
    if (r.ok) return;
    expect(r.errors).toEqual([{ row: 4, column: "torque_nm", message: 'Torque must be a number; got "abc"' }]);
  });
  it("names each bad cell by line and column", () => {
    const r = parseCurveCsv("rpm,torque_nm\n3000,60\n,61\n4000,-5\n90000,70\n");
    if (r.ok) throw new Error("should fail");
    expect(r.errors.map((e) => [e.row, e.column])).toEqual([
      [3, "rpm"],
      [4, "torque_nm"],
      [5, "rpm"],
    ]);
    expect(r.errors[0].message).toBe("Engine speed is empty");
    expect(r.errors[1].message).toMatch(/at least 0/);
    expect(r.errors[2].message).toMatch(/at most 25000 rpm/);
  });
  it("refuses falling engine speed, naming the line", () => {
    const r = parseCurveCsv("rpm,torque_nm\n3000,60\n3500,62\n3400,63\n");
    if (r.ok) throw new Error("should fail");
    expect(r.errors).toHaveLength(1);
    expect(r.errors[0]).toMatchObject({ row: 4, column: "rpm" });
    expect(r.errors[0].message).toMatch(/must rise/);
  });
  it("header problems: missing, unknown and doubled torque columns", () => {
    const a = parseCurveCsv("speed,torque_nm\n3000,60\n4000,61\n");
    if (a.ok) throw new Error("should fail");
    expect(a.errors).toContainEqual({ row: 1, column: "speed", message: expect.stringContaining("Unknown column") });
    expect(a.errors).toContainEqual({ row: 1, column: "rpm", message: "Column rpm is missing" });
    const b = parseCurveCsv("rpm,torque_nm,torque_lbft\n3000,60,44\n");
    if (b.ok) throw new Error("should fail");
    expect(b.errors[0].message).toMatch(/one torque column only/);
    const c = parseCurveCsv("rpm\n3000\n4000\n");
    if (c.ok) throw new Error("should fail");
    expect(c.errors).toEqual([{ row: 1, column: "torque_nm", message: "Column torque_nm or torque_lbft is missing" }]);
  });
  it("an empty file and a short line are refused", () => {
    const e = parseCurveCsv("");
    expect(e.ok).toBe(false);
    const s = parseCurveCsv("rpm,torque_nm\n3000,60\n3500\n4000,62\n");
    if (s.ok) throw new Error("should fail");
    expect(s.errors).toContainEqual({ row: 3, column: "(line)", message: "Expected 2 values, found 1" });
  });
  it("one point is not a curve", () => {
    const r = parseCurveCsv("rpm,torque_nm\n3000,60\n");
    if (r.ok) throw new Error("should fail");
    expect(r.errors[0].message).toMatch(/at least 2 points/);
  });
});

describe("a run's request body", () => {
  const fields = {
    label: "Baseline",
    ranOn: "2026-11-20",
    boostTarget: "7",
    boostUnit: "psi",
    pressureKpa: "100.2",
    temperatureC: "21",
    humidityPercent: "48",
    standard: "SAE_J1349",
    notes: "",
    tuneVersionId: null,
  };
  it("accepts text fields and table rows, skipping blank rows", () => {
    const r = checkDynoRunBody({
      ...fields,
      curve: {
        source: "table",
        torqueUnit: "N·m",
        rows: [
          { rpm: "4000", torque: "70" },
          { rpm: "", torque: "" },
          { rpm: "5000", torque: "80" },
        ],
      },
    });
    if (!r.ok) throw new Error(JSON.stringify(r));
    expect(r.run.boostTarget).toBe(7);
    expect(r.run.points.map((p) => p.rpm)).toEqual([4000, 5000]);
  });
  it("reports every field problem and every curve problem at once", () => {
    const r = checkDynoRunBody({
      ...fields,
      label: " ",
      pressureKpa: "12",
      humidityPercent: "wet",
      standard: "NONE",
      curve: {
        source: "table",
        torqueUnit: "N·m",
        rows: [
          { rpm: "4000", torque: "x" },
          { rpm: "5000", torque: "80" },
        ],
      },
    });
    if (r.ok) throw new Error("should fail");
    expect(r.fieldErrors.label).toMatch(/Name the run/);
    expect(r.fieldErrors.pressureKpa).toBe("Air pressure must be at least 50 kPa");
    expect(r.fieldErrors.humidityPercent).toBe("Humidity must be a number");
    expect(r.fieldErrors.standard).toBe("Choose a correction standard");
    expect(r.curveErrors).toEqual([{ row: 1, column: "Torque (N·m)", message: 'Torque must be a number; got "x"' }]);
  });
  it("a bad CSV gives row and column errors", () => {
    const r = checkDynoRunBody({ ...fields, curve: { source: "csv", text: "rpm,torque_nm\n3000,1\n2000,2\n" } });
    if (r.ok) throw new Error("should fail");
    expect(r.fieldErrors).toEqual({});
    expect(r.curveErrors[0]).toMatchObject({ row: 3, column: "rpm" });
  });
  it("not an object at all → errors, no throw", () => {
    const r = checkDynoRunBody("nonsense");
    expect(r.ok).toBe(false);
  });
});
