import { describe, expect, it } from "vitest";
import { outlineLinesText, parseOutlineLines } from "@/lib/build-figures";
import { intercoolerFromRuns } from "@/lib/build-figures/intercooler-from-run";
import type { StoredDynoRun } from "@/lib/dyno/run-summary";
import { expectWithin } from "../calc/helpers";

const run = (label: string, points: StoredDynoRun["points"], channels: StoredDynoRun["channels"]): StoredDynoRun => ({
  id: label,
  label,
  ranOn: "2026-12-01",
  boostTarget: 10,
  boostUnit: "psi",
  pressureKpa: 100,
  temperatureC: 25,
  humidityPercent: 40,
  standard: "SAE_J1349",
  torqueUnit: "N·m",
  notes: "",
  fuel: "petrol",
  tune: null,
  channels,
  points,
  withdrawn: null,
});

const ic = [
  { channel: "iatBeforeCooler", unit: "°C", sourceColumn: "IN" },
  { channel: "iatAfterCooler", unit: "°C", sourceColumn: "OUT" },
] as StoredDynoRun["channels"];

describe("intercoolerFromRuns — effectiveness from a run's logged channels", () => {
  it("REFERENCE-CHECKS check (calc): 112.07 °C in, 25 °C ambient, 46.7675 °C out → ε 0.75, read at the hottest point of the newest run", () => {
    const older = run("older", [{ rpm: 8000, torque: 90, logged: { iatBeforeCooler: 70, iatAfterCooler: 40 } }], ic);
    const newer = run(
      "newer",
      [
        { rpm: 6000, torque: 95, logged: { iatBeforeCooler: 80, iatAfterCooler: 35 } },
        { rpm: 9000, torque: 92, logged: { iatBeforeCooler: 112.07, iatAfterCooler: 46.7675 } },
      ],
      ic,
    );
    const r = intercoolerFromRuns([older, newer, run("no channels", [{ rpm: 5000, torque: 80 }], [])]);
    expect(r?.runLabel).toBe("newer");
    expect(r?.rpm).toBe(9000);
    expectWithin(r!.result!.effectiveness, 0.75, 1e-9);
    expect(r!.result!.pressureDropKpa).toBeNull();
  });

  it("takes the pressure drop from charge pressure before and boost after, made absolute with the run's air pressure", () => {
    const r = intercoolerFromRuns([
      run(
        "with pressures",
        [{ rpm: 9000, torque: 92, logged: { iatBeforeCooler: 95, iatAfterCooler: 40, chargePressure: 80, boost: 70 } }],
        [
          ...ic,
          { channel: "chargePressure", unit: "kPa", sourceColumn: "CP" },
          { channel: "boost", unit: "kPa", sourceColumn: "MAP" },
        ] as StoredDynoRun["channels"],
      ),
    ]);
    expectWithin(r!.result!.pressureDropKpa!, 10, 1e-9);
    expectWithin(r!.result!.pressureDropFraction!, 10 / 180, 1e-12);
  });

  it("a charge colder than the cell air is a problem in words, not a figure; no logged temperatures: nothing", () => {
    const r = intercoolerFromRuns([run("cold", [{ rpm: 9000, torque: 92, logged: { iatBeforeCooler: 20, iatAfterCooler: 18 } }], ic)]);
    expect(r?.result).toBeNull();
    expect(r?.problem).toMatch(/^Intercooler inlet temperature must be above the ambient air temperature/);
    expect(intercoolerFromRuns([run("bare", [{ rpm: 5000, torque: 80 }], [])])).toBeNull();
  });
});

describe("parseOutlineLines — a map line typed one point a line", () => {
  it("reads commas, semicolons or spaces, skips blank lines, and writes back the same", () => {
    const pts = parseOutlineLines("10, 1.2\n\n12;3.0\n 14 3.4 ", "Surge line");
    expect(pts).toEqual([
      { correctedFlow: 10, pressureRatio: 1.2 },
      { correctedFlow: 12, pressureRatio: 3 },
      { correctedFlow: 14, pressureRatio: 3.4 },
    ]);
    expect(parseOutlineLines(outlineLinesText(pts), "Surge line")).toEqual(pts);
  });
  it("names the line of a point that is not two numbers", () => {
    expect(() => parseOutlineLines("10, 1.2\n12 lots", "Choke line")).toThrow(
      'Choke line, line 2: write the corrected air flow, then the pressure ratio, as two numbers (e.g. "12.5, 2.1"); got "12 lots".',
    );
    expect(() => parseOutlineLines("1e3, 2", "Surge line")).toThrow(/^Surge line, line 1:/);
  });
});
