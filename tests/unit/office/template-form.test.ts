import { describe, expect, it } from "vitest";
import { parseList, parsePasses, passesText, setAt } from "@/lib/procedures/template-form";

describe("template form helpers", () => {
  it("reads torque passes typed as percentages or values, and writes them back", () => {
    expect(parsePasses("30%, 70 %,100%")).toEqual([{ percent: 30 }, { percent: 70 }, { percent: 100 }]);
    expect(parsePasses("20, 40")).toEqual([{ value: 20 }, { value: 40 }]);
    expect(passesText([{ percent: 50 }, { value: 12.5 }])).toBe("50%, 12.5");
    expect(Number.isNaN((parsePasses("abc")[0] as { value: number }).value)).toBe(true);
  });
  it("splits reading labels on commas and drops empty ones", () => {
    expect(parseList(" Cyl 1, Cyl 2 ,, ")).toEqual(["Cyl 1", "Cyl 2"]);
  });
  it("replaces a nested value without touching the original", () => {
    const doc = { stages: [{ steps: [{ title: "a" }, { title: "b" }] }] };
    const next = setAt(doc, ["stages", 0, "steps", 1, "title"], "c");
    expect(next.stages[0].steps[1].title).toBe("c");
    expect(doc.stages[0].steps[1].title).toBe("b");
    expect(next.stages[0].steps[0]).toBe(doc.stages[0].steps[0]);
  });
});
