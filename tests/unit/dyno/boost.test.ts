import { describe, expect, it } from "vitest";
import { powerGainPerBoost, powerPerBoost } from "@/lib/dyno";
import { expectWithin } from "../calc/helpers";

const KPA_PER_PSI = 6.894757293168; // NIST SP 811 B.8: 1 psi = 6 894.757 293 168 Pa

describe("power per unit of boost", () => {
  it("150 kW at 10 psi → 15 kW per psi (arithmetic)", () => {
    expect(powerPerBoost(150, { value: 10, unit: "psi" })).toBe(15);
  });
  it("150 kW at 10 psi → 217.56 kW per bar (1 psi = 6.894757 kPa, NIST SP 811)", () => {
    expectWithin(powerPerBoost(150, { value: 10, unit: "psi" }, "kW", "bar")!, 150 / ((10 * KPA_PER_PSI) / 100), 1e-9);
    expectWithin(powerPerBoost(150, { value: 10, unit: "psi" }, "kW", "bar")!, 217.56, 0.005);
  });
  it("no boost → no figure (null), not infinity", () => {
    expect(powerPerBoost(100, { value: 0, unit: "kPa" })).toBeNull();
  });
  it("130 kW at 7 psi → 150 kW at 10 psi: 6.667 kW per extra psi (arithmetic)", () => {
    const g = powerGainPerBoost(
      { powerKw: 130, boost: { value: 7, unit: "psi" } },
      { powerKw: 150, boost: { value: 10, unit: "psi" } },
      "kW",
      "psi",
    );
    expectWithin(g!, 20 / 3, 1e-12);
  });
  it("same boost in two units → null", () => {
    expect(
      powerGainPerBoost({ powerKw: 1, boost: { value: 1, unit: "bar" } }, { powerKw: 2, boost: { value: 100, unit: "kPa" } }),
    ).toBeNull();
  });
  it("negative boost is refused", () => {
    expect(() => powerPerBoost(100, { value: -1, unit: "psi" })).toThrow(/boost.value/);
  });
});
