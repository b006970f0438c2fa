import { describe, expect, it } from "vitest";
import * as calc from "@/lib/calc";
import { CalcInputError } from "@/lib/calc";

describe("CalcInputError", () => {
  it("is an Error carrying the argument name and the bad value", () => {
    let caught: unknown;
    try {
      calc.sweptVolumeCc(-1, 50);
    } catch (e) {
      caught = e;
    }
    expect(caught).toBeInstanceOf(Error);
    expect(caught).toBeInstanceOf(CalcInputError);
    const err = caught as CalcInputError;
    expect(err.name).toBe("CalcInputError");
    expect(err.argument).toBe("boreMm");
    expect(err.value).toBe(-1);
    expect(err.message).toBe("boreMm must be a finite number > 0; got -1");
  });

  // Every numeric entry point refuses NaN instead of returning it.
  const nanCalls: Array<[string, () => unknown]> = [
    ["sweptVolumeCc", () => calc.sweptVolumeCc(Number.NaN, 50)],
    [
      "staticCompressionRatio",
      () =>
        calc.staticCompressionRatio({
          boreMm: 80,
          strokeMm: 60,
          chamberCc: Number.NaN,
          gasketBoreMm: 81,
          gasketThicknessMm: 0.8,
          deckClearanceMm: 0.1,
          pistonDishCc: 0,
        }),
    ],
    ["boostedCompressionRatio", () => calc.boostedCompressionRatio(10, 50, Number.NaN)],
    ["compressorOutletTemperatureK", () => calc.compressorOutletTemperatureK(Number.NaN, 2, 0.7)],
    ["intercoolerOutletTemperatureK", () => calc.intercoolerOutletTemperatureK(380, 300, Number.NaN)],
    ["chargeDensityKgM3", () => calc.chargeDensityKgM3(Number.NaN, 300)],
    ["powerCorrectionFactor", () => calc.powerCorrectionFactor("SAE_J1349", { pressureKpa: Number.NaN, temperatureC: 20 })],
    ["vaporPressureKpa", () => calc.vaporPressureKpa(20, Number.NaN)],
    ["powerKw", () => calc.powerKw(100, Number.NaN)],
    ["torqueNm", () => calc.torqueNm(Number.NaN, 5000)],
    ["convertTorque", () => calc.convertTorque(Number.NaN, "N·m", "lbf·ft")],
    ["convertPressure", () => calc.convertPressure(Number.NaN, "kPa", "psi")],
    ["convertPower", () => calc.convertPower(Number.NaN, "kW", "PS")],
    ["convertLength", () => calc.convertLength(Number.NaN, "mm", "in")],
    ["convertTemperature", () => calc.convertTemperature(Number.NaN, "C", "K")],
    ["tighteningSequence", () => calc.tighteningSequence("cross", Number.NaN)],
    ["boltLayout", () => calc.boltLayout("cross", Number.NaN)],
    ["torqueStages", () => calc.torqueStages({ finalValue: Number.NaN, unit: "N·m", passes: [] })],
    [
      "boreGeometry",
      () => calc.boreGeometry({ top: { thrust: Number.NaN, pin: 80 }, middle: { thrust: 80, pin: 80 }, bottom: { thrust: 80, pin: 80 } }),
    ],
    ["oilClearance", () => calc.oilClearance([Number.NaN], [40])],
    ["evaluateTolerance", () => calc.evaluateTolerance(Number.NaN, { unit: "mm", min: 0, max: 1 })],
    ["ringGapGuide", () => calc.ringGapGuide(Number.NaN, "boosted")],
  ];
  it.each(nanCalls)("%s throws CalcInputError for NaN, naming NaN in the message", (_name, call) => {
    expect(call).toThrow(CalcInputError);
    expect(call).toThrow(/got NaN/);
  });
});
