import { describe, expect, it } from "vitest";
import { readChange, syncResponseSchema, tabletSyncResponseSchema } from "@/lib/sync/changes";

// A tablet still running an older version of the app must not fail its sync on a change it cannot
// read (a kind of change added later): it reloads that change's job and carries on.
const job = "7b0a3c59-5a4e-4c86-9d38-1f0a6d2b9c11";
const review = {
  type: "review",
  seq: "41",
  id: "0a9cde12-7f6b-4f7e-9a51-5b8f4f1f1a01",
  workOrderId: job,
  stamp: "001764662400000-000000-server",
};
const fromTheFuture = { type: "booking", seq: "42", id: "0a9cde12-7f6b-4f7e-9a51-5b8f4f1f1a05", workOrderId: job, bay: 3 };
const answer = { accepted: [], duplicates: [], refused: [], flagged: [], changes: [review, fromTheFuture], cursor: "42", more: false };

describe("reading the sync answer on a tablet", () => {
  it("the strict schema (the server's contract) refuses an unknown kind of change", () => {
    expect(syncResponseSchema.safeParse(answer).success).toBe(false);
  });

  it("the tablet keeps the changes it knows and names the job of the one it cannot read", () => {
    const body = tabletSyncResponseSchema.parse(answer);
    expect(body.changes[0]).toEqual(review);
    expect(body.changes[1]).toMatchObject({ type: "unread", seq: "42", workOrderId: job });
    expect(body.cursor).toBe("42");
  });

  it("a change with no job in it is still passed over, with why", () => {
    const r = readChange({ type: "something-new" });
    expect(r).toMatchObject({ type: "unread", seq: null, workOrderId: null });
    expect(r.type === "unread" && r.why).toContain("type");
  });
});
