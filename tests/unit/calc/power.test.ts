import { describe, expect, it } from "vitest";
import fc from "fast-check";
import { powerKw, torqueNm } from "@/lib/calc";
import { expectCalcError, expectWithin, isRelClose } from "./helpers";

const NM_PER_LBF_FT = 1.3558179483314; // NIST SP 811 B.8
const KW_PER_HP = 0.74569987158227; // NIST SP 811 B.8 (550 ft·lbf/s)

describe("powerKw / torqueNm — kW = N·m · rpm · 2π / 60 000", () => {
  it("300 lbf·ft at 5000 rpm → 285.60 hp → 212.971 kW (hp = lbf·ft·rpm/5252.113, published page)", () => {
    const kw = powerKw(300 * NM_PER_LBF_FT, 5000);
    expectWithin(kw, 212.971, 0.0005);
    expectWithin(kw / KW_PER_HP, 285.6, 0.005);
  });
  it("400 N·m at 6000 rpm → 251.33 kW (REFERENCE-CHECKS, calc)", () => {
    expectWithin(powerKw(400, 6000), 251.33, 0.005);
  });
  it("torque and power in lbf·ft and hp cross at 5252.113 rpm (33 000/2π, published page)", () => {
    const kw = powerKw(100 * NM_PER_LBF_FT, 5252.113);
    expectWithin(kw / KW_PER_HP, 100, 0.00001);
  });
  it("torqueNm inverts powerKw (property)", () => {
    fc.assert(
      fc.property(
        fc.double({ min: -500, max: 2000, noNaN: true }),
        fc.double({ min: 1, max: 25000, noNaN: true }),
        (t, rpm) => isRelClose(torqueNm(powerKw(t, rpm), rpm), t, 1e-13) || Math.abs(t) < 1e-300,
      ),
    );
  });
  it("zero rpm gives zero power", () => {
    expect(powerKw(100, 0)).toBe(0);
  });
  it("throws CalcInputError for impossible input", () => {
    expectCalcError(() => powerKw(Number.NaN, 5000), "torqueNm");
    expectCalcError(() => powerKw(100, -1), "rpm", /≥ 0/);
    expectCalcError(() => torqueNm(100, 0), "rpm", /> 0/);
    expectCalcError(() => torqueNm(Infinity, 5000), "powerKw");
  });
});
