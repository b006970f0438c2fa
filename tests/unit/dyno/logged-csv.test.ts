import { describe, expect, it } from "vitest";
import { checkDynoRunBody, columnMappingSchema, guessMapping, parseLoggedCsv, type ColumnMapping } from "@/lib/dyno";
import { expectWithin } from "../calc/helpers";

const mapping: ColumnMapping = {
  format: "benchtag-dyno-mapping",
  formatVersion: 1,
  columns: [
    { column: "Engine RPM", channel: "rpm", unit: "rpm" },
    { column: "Tq", channel: "torque", unit: "lbf·ft" },
    { column: "AFR1", channel: "mixture", unit: "AFR" },
    { column: "MAP", channel: "boost", unit: "kPa abs" },
    { column: "Gear", channel: "gear", unit: "gear" },
  ],
};
const run = { fuel: "petrol" as const, stationPressureKpa: 100 };

describe("a logged file read through a column mapping", () => {
  it("reads the mapped columns as written, leaves the others, and keeps empty channel cells empty", () => {
    const csv = "Time;Engine RPM;Tq;AFR1;MAP;Gear\n0.1;4000;60;12.5;150;4\n0.2;4500;66.5;;165;4\n";
    const r = parseLoggedCsv(csv, mapping, run);
    if (!r.ok) throw new Error(JSON.stringify(r.errors));
    expect(r.torqueUnit).toBe("lbf·ft");
    expect(r.points).toHaveLength(2);
    expect(r.points[0]).toMatchObject({ rpm: 4000, torque: 60, logged: { mixture: 12.5, boost: 150, gear: 4 } });
    expect(r.points[1].logged).toEqual({ boost: 165, gear: 4 });
    // 60 lbf·ft × 1.355 818 N·m (NIST SP 811) = 81.349 N·m
    expectWithin(r.points[0].torqueNm, 81.349077, 1e-5);
    expect(r.channels).toEqual([
      { channel: "mixture", unit: "AFR", sourceColumn: "AFR1" },
      { channel: "boost", unit: "kPa abs", sourceColumn: "MAP" },
      { channel: "gear", unit: "gear", sourceColumn: "Gear" },
    ]);
  });
  it("refuses the whole file, naming every line and column", () => {
    const csv = [
      "Engine RPM,Tq,AFR1,MAP,Gear",
      "4000,60,12.5,150,4",
      "4500,sixty,12.4,160,4", // line 3: torque not a number
      "5000,70,12,4,800,4", // line 4: one value too many (decimal comma split the cell)
      "5500,72,70,170,4.5", // line 5: AFR 70 is λ 4.76; gear 4.5
      "5400,71,12.2,171,5", // line 6: rpm falls
      "6000,73,11.9,900,5", // line 7: 900 kPa abs is 800 kPa boost
    ].join("\n");
    const r = parseLoggedCsv(csv, mapping, run);
    if (r.ok) throw new Error("should fail");
    expect(r.errors.map((e) => [e.row, e.column])).toEqual([
      [3, "Tq"],
      [4, "(line)"],
      [5, "AFR1"],
      [5, "Gear"],
      [6, "Engine RPM"],
      [7, "MAP"],
    ]);
    expect(r.errors[0].message).toBe('Torque must be a number; got "sixty"');
    expect(r.errors[1].message).toBe("Line 1 names 5 columns; this line has 6 values.");
    expect(r.errors[2].message).toMatch(/^Mixture 70 AFR \(stoichiometric 14\.7\) is λ 4\.762; the limit is λ 0\.4 to 3\.$/);
    expect(r.errors[5].message).toBe("Manifold boost 900 kPa abs is 800 kPa; the limit is -100 to 600 kPa (gauge; negative for vacuum).");
  });
  it("a column the mapping names but the file lacks is refused at line 1", () => {
    const r = parseLoggedCsv("Engine RPM,Tq,MAP,Gear\n4000,60,150,4\n5000,61,150,4\n", mapping, run);
    if (r.ok) throw new Error("should fail");
    expect(r.errors).toEqual([{ row: 1, column: "AFR1", message: 'The mapping\'s column "AFR1" (mixture) is not in line 1 of the file.' }]);
  });
  it("a decimal comma in a semicolon file is named with the fix", () => {
    const r = parseLoggedCsv("Engine RPM;Tq;AFR1;MAP;Gear\n4000;60;12,5;150;4\n5000;61;12.4;150;4\n", mapping, run);
    if (r.ok) throw new Error("should fail");
    expect(r.errors[0]).toEqual({ row: 2, column: "AFR1", message: 'Mixture "12,5" uses a comma as the decimal mark; write 12.5.' });
  });
});

describe("the mapping itself", () => {
  it("needs engine speed and torque once each, a unit of the channel, and each column once", () => {
    const bad = columnMappingSchema.safeParse({
      format: "benchtag-dyno-mapping",
      formatVersion: 1,
      columns: [
        { column: "A", channel: "torque", unit: "N·m" },
        { column: "B", channel: "boost", unit: "atm" },
        { column: "a", channel: "mixture", unit: "λ" },
      ],
    });
    expect(bad.success).toBe(false);
    const messages = bad.error!.issues.map((i) => i.message);
    expect(messages).toContain("Choose the column that holds engine speed.");
    expect(messages).toContain('Manifold boost (column "B"): choose the unit kPa, psi, bar, kPa abs; got "atm".');
    expect(messages).toContain('The column "a" is mapped twice.');
  });
  it("guesses the obvious columns of a header and leaves the rest unused", () => {
    expect(guessMapping(["Time", "RPM", "Torque lbft", "Lambda", "Boost psi"])).toEqual([
      { column: "Time", channel: null, unit: "" },
      { column: "RPM", channel: "rpm", unit: "rpm" },
      { column: "Torque lbft", channel: "torque", unit: "lbf·ft" },
      { column: "Lambda", channel: "mixture", unit: "λ" },
      { column: "Boost psi", channel: "boost", unit: "psi" },
    ]);
  });
  it("a run's body with a logged file and no fuel is refused: the mixture needs the fuel", () => {
    const r = checkDynoRunBody({
      label: "Logged",
      ranOn: "2026-12-01",
      boostTarget: "10",
      boostUnit: "psi",
      pressureKpa: "100",
      temperatureC: "20",
      humidityPercent: "40",
      standard: "SAE_J1349_CURRENT",
      tuneVersionId: null,
      curve: {
        source: "mapped-csv",
        text: "Engine RPM,Tq,AFR1,MAP,Gear\n4000,60,0.8,150,4\n5000,61,0.8,150,4\n",
        mapping: { ...mapping, columns: mapping.columns.map((c) => (c.channel === "mixture" ? { ...c, unit: "λ" } : c)) },
      },
    });
    if (r.ok) throw new Error("should fail");
    expect(r.fieldErrors.fuel).toMatch(/Name the fuel/);
    expect(r.curveErrors).toEqual([]);
  });
});
