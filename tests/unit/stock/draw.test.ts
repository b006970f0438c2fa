import { describe, expect, it } from "vitest";
import { planDraw, stockFlagReason, withStockReason, type LotBalance } from "@/lib/stock/draw";

// The draw planner: the job's own reservation first, then free stock, then stock put aside for
// others; never below zero; what is left over is short.

const lot = (id: string, onHand: number, reserved: Record<string, number> = {}): LotBalance => ({
  id,
  location: "B2",
  onHand,
  reserved: Object.values(reserved).reduce((a, b) => a + b, 0),
  reservedFor: new Map(Object.entries(reserved)),
});

describe("planDraw", () => {
  it("takes free stock oldest lot first", () => {
    const lots = [lot("a", 2), lot("b", 5)];
    expect(planDraw(lots, "job1", 3)).toEqual({
      draws: [
        { lotId: "a", quantity: 2, reservedUsed: 0 },
        { lotId: "b", quantity: 1, reservedUsed: 0 },
      ],
      short: 0,
      tookReserved: false,
    });
    expect(lots.map((l) => l.onHand)).toEqual([0, 4]);
  });

  it("uses the job's own reservation before free stock, and leaves other jobs' reservations alone while free stock lasts", () => {
    const lots = [lot("a", 3, { other: 2 }), lot("b", 2, { job1: 2 })];
    const plan = planDraw(lots, "job1", 3);
    expect(plan.draws).toEqual([
      { lotId: "b", quantity: 2, reservedUsed: 2 },
      { lotId: "a", quantity: 1, reservedUsed: 0 },
    ]);
    expect(plan.tookReserved).toBe(false);
    expect(lots[1]).toMatchObject({ onHand: 0, reserved: 0 });
    expect(lots[1].reservedFor.get("job1")).toBe(0);
  });

  it("takes stock put aside for another job only when nothing else is left, and says so", () => {
    const lots = [lot("a", 2, { other: 2 })];
    const plan = planDraw(lots, "job1", 1);
    expect(plan).toEqual({ draws: [{ lotId: "a", quantity: 1, reservedUsed: 0 }], short: 0, tookReserved: true });
    expect(stockFlagReason({ partNumber: "P1", batch: "B7", quantity: 1 }, plan, 1)).toBe(
      "Stock: part P1 batch B7 was taken from stock put aside for another job. The fit is kept: check that job still has its part.",
    );
  });

  it("never goes below zero: what the shelf cannot cover is short", () => {
    const lots = [lot("a", 1)];
    const first = planDraw(lots, "job1", 1);
    const second = planDraw(lots, "job2", 1);
    expect(first.short).toBe(0);
    expect(second).toEqual({ draws: [], short: 1, tookReserved: false });
    expect(lots[0].onHand).toBe(0);
    expect(stockFlagReason({ partNumber: "P1", serial: "S-1", quantity: 1 }, second, 1)).toMatch(
      /^Stock short: 1 of part P1 serial S-1 fitted but only 0 left on the shelf as recorded\. .*who else fitted this part\.$/,
    );
  });

  it("a fit that drew cleanly has no flag; a second reason is added to the first", () => {
    const plan = planDraw([lot("a", 4)], "job1", 4);
    expect(stockFlagReason({ partNumber: "P1", batch: "B7", quantity: 4 }, plan, 1)).toBeNull();
    expect(withStockReason("Work on a closed job.", "Stock short: …")).toBe("Work on a closed job. Also: Stock short: …");
    expect(withStockReason("Work on a closed job.", null)).toBe("Work on a closed job.");
    expect(withStockReason(null, null)).toBeNull();
  });
});
