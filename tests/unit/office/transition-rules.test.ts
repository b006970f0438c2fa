import { describe, expect, it } from "vitest";
import { checkTransition, type TransitionFacts } from "@/lib/work-orders/transition-rules";

const ready: TransitionFacts = {
  sentQuote: true,
  approvedQuote: true,
  depositDueMinor: 5000,
  depositPaidMinor: 5000,
  mechanicAssigned: true,
  proceduresPinned: 1,
};

describe("work-order transition rules", () => {
  it("allows approved → in build when the deposit is paid, a mechanic assigned and a procedure pinned", () => {
    expect(checkTransition("approved", "in_build", ready)).toEqual({ ok: true });
  });
  it("names what is missing", () => {
    expect(checkTransition("approved", "in_build", { ...ready, depositPaidMinor: 0 })).toEqual({
      ok: false,
      reason: "The deposit has not been paid yet.",
    });
    expect(checkTransition("approved", "in_build", { ...ready, mechanicAssigned: false })).toMatchObject({
      ok: false,
      reason: expect.stringMatching(/Assign a mechanic/),
    });
    expect(checkTransition("approved", "in_build", { ...ready, proceduresPinned: 0 })).toMatchObject({
      ok: false,
      reason: expect.stringMatching(/Pin at least one/),
    });
  });
  it("refuses jumps the flow does not have, in words", () => {
    expect(checkTransition("booked_in", "in_build", ready)).toEqual({
      ok: false,
      reason: 'A work order cannot go from "Booked in" to "In build".',
    });
    expect(checkTransition("handed_over", "ready", ready).ok).toBe(false);
  });
  it("leaves approval to the customer", () => {
    expect(checkTransition("quoted", "approved", ready)).toMatchObject({ ok: false, reason: expect.stringMatching(/Only the customer/) });
    expect(checkTransition("quoted", "approved", { ...ready, byCustomerApproval: true })).toEqual({ ok: true });
  });
  it("needs a sent quote before quoted", () => {
    expect(checkTransition("inspected", "quoted", { ...ready, sentQuote: false })).toMatchObject({ ok: false });
  });
});
