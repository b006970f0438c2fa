import { describe, expect, it } from "vitest";
import { readyToGoInBuild } from "@/lib/office/deposit-notice";

describe("the office is told when a paid deposit makes a job ready to go into build", () => {
  it("only an approved job whose approved quote's deposit is paid in full", () => {
    expect(readyToGoInBuild({ status: "approved", depositDueMinor: 5000, depositPaidMinor: 5000 })).toBe(true);
    expect(readyToGoInBuild({ status: "approved", depositDueMinor: 5000, depositPaidMinor: 6000 })).toBe(true);
    // not yet paid in full
    expect(readyToGoInBuild({ status: "approved", depositDueMinor: 5000, depositPaidMinor: 4999 })).toBe(false);
    // no approved quote, or a quote that asked for no deposit: nothing to announce
    expect(readyToGoInBuild({ status: "approved", depositDueMinor: null, depositPaidMinor: 0 })).toBe(false);
    expect(readyToGoInBuild({ status: "approved", depositDueMinor: 0, depositPaidMinor: 0 })).toBe(false);
    // once the job has moved on (or before approval) the notice is gone
    expect(readyToGoInBuild({ status: "in_build", depositDueMinor: 5000, depositPaidMinor: 5000 })).toBe(false);
    expect(readyToGoInBuild({ status: "quoted", depositDueMinor: 5000, depositPaidMinor: 5000 })).toBe(false);
  });
});
