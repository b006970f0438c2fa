import { describe, expect, it } from "vitest";
import { boostTargetProblem, channelValueInBase, channelValueProblem, runChannelContext } from "@/lib/dyno";
import { expectWithin } from "../calc/helpers";

const petrol = runChannelContext("petrol", 100);
const noFuel = runChannelContext(null, 100);

describe("logged channel values read in their plotting unit", () => {
  it("AFR 11.76 on petrol (stoichiometric 14.7, common practice) → λ 0.8", () => {
    expectWithin(channelValueInBase("mixture", "AFR", 11.76, petrol)!, 0.8, 1e-12);
  });
  it("an AFR without a fuel cannot be read as lambda", () => {
    expect(channelValueInBase("mixture", "AFR", 12, noFuel)).toBeNull();
    expect(channelValueProblem("mixture", "AFR", 12, noFuel)).toMatch(/name the fuel/);
  });
  it("10 psi → 68.948 kPa (NIST SP 811: 1 psi = 6.894 757 kPa)", () => {
    expectWithin(channelValueInBase("boost", "psi", 10, petrol)!, 68.94757, 1e-5);
  });
  it("170 kPa absolute at a 100 kPa station → 70 kPa boost", () => {
    expect(channelValueInBase("boost", "kPa abs", 170, petrol)).toBe(70);
  });
  it("212 °F → 100 °C; 100 mph → 160.9344 km/h (1 mile = 1 609.344 m exactly, NIST SP 811)", () => {
    expectWithin(channelValueInBase("iatBeforeCooler", "°F", 212, petrol)!, 100, 1e-9);
    expectWithin(channelValueInBase("roadSpeed", "mph", 100, petrol)!, 160.9344, 1e-9);
  });
});

describe("a value out of its physical range is named in workshop words, with the unit the file used", () => {
  it("boost 59 bar is 5900 kPa", () => {
    expect(channelValueProblem("boost", "bar", 59, petrol)).toBe(
      "Manifold boost 59 bar is 5900 kPa; the limit is -100 to 600 kPa (gauge; negative for vacuum).",
    );
  });
  it("in its own unit the message gives the range and what was entered", () => {
    expect(channelValueProblem("ignition", "° BTDC", 90, petrol)).toBe("Ignition advance must be from -30 to 70 ° BTDC; got 90 ° BTDC.");
  });
  it("AFR 60 on petrol is λ 4.082", () => {
    expect(channelValueProblem("mixture", "AFR", 60, petrol)).toBe(
      "Mixture 60 AFR (stoichiometric 14.7) is λ 4.082; the limit is λ 0.4 to 3.",
    );
  });
  it("a gear must be a whole number 0–8; knock retard is a positive number of degrees", () => {
    expect(channelValueProblem("gear", "gear", 2.5, petrol)).toMatch(/whole number/);
    expect(channelValueProblem("gear", "gear", 3, petrol)).toBeNull();
    expect(channelValueProblem("knockRetard", "°", -2, petrol)).toMatch(/positive number/);
  });
  it("an unknown unit is named", () => {
    expect(channelValueProblem("boost", "atm", 1, petrol)).toMatch(/kPa, psi, bar, kPa abs/);
  });
});

describe("the boost target of a run is checked per unit (one range in kPa gauge, lib/calc INPUT_RULES.boost)", () => {
  it("10 psi typed as 68.9 kPa is accepted, as is 10 psi", () => {
    expect(boostTargetProblem(68.9, "kPa")).toBeNull();
    expect(boostTargetProblem(10, "psi")).toBeNull();
    expect(boostTargetProblem(6, "bar")).toBeNull();
  });
  it("59 bar is refused, saying what it is in kPa and the limit in every unit", () => {
    expect(boostTargetProblem(59, "bar")).toBe("Boost target 59 bar is 5900 kPa; the limit is 0 to 600 kPa (87 psi, 6 bar).");
    expect(boostTargetProblem(100, "psi")).toBe("Boost target 100 psi is 689.5 kPa; the limit is 0 to 600 kPa (87 psi, 6 bar).");
    expect(boostTargetProblem(700, "kPa")).toBe("Boost target must be 0 to 600 kPa (87 psi, 6 bar) above the air pressure; got 700 kPa.");
  });
});
