import { describe, expect, it } from "vitest";
import { describeEntry } from "@/lib/review/flagged-work";

// One entry named the same on the review's flagged list, in a decision refused for unseen work and
// in the build report.
describe("an entry in workshop words", () => {
  it("names the kind, then what it recorded", () => {
    expect(describeEntry("measurement.recorded", { value: "0.43", unit: "mm", supersedesId: "x" })).toBe("Reading: 0.43 mm (a correction)");
    expect(describeEntry("measurement.recorded", { value: "76.02", unit: "mm" })).toBe("Reading: 76.02 mm");
    expect(describeEntry("torque.bolt-confirmed", { passIndex: 1, bolt: 3 })).toBe("Torque bolt: pass 1, bolt 3");
    expect(describeEntry("part.fitted", { partNumber: "FP-8821", serial: "S-19", batch: "B7" })).toBe(
      "Part fitted: FP-8821, serial S-19, batch B7",
    );
  });

  it("only the kind when there is nothing more to say, and a kind this version does not know as a bench entry", () => {
    expect(describeEntry("step.completed", { stepId: "s" })).toBe("Step done");
    expect(describeEntry("photo.queued", { caption: "" })).toBe("Photo");
    expect(describeEntry("something.new", null)).toBe("Bench entry");
  });
});
