import { randomUUID } from "node:crypto";
import { describe, expect, it } from "vitest";
import { splitIntoBatches } from "@/lib/sync/batching";
import { formatStamp } from "@/lib/sync/hlc";
import { operationSchema, syncBatchSchema, type Operation } from "@/lib/sync/operations";

const base = () => ({
  id: randomUUID(),
  workOrderId: randomUUID(),
  authorId: randomUUID(),
  deviceId: "tab-1",
  deviceTime: "2026-12-02T09:30:00.000+01:00",
  stamp: formatStamp({ wallMs: 1_796_000_000_000, counter: 0, deviceId: "tab-1" }),
});

describe("operation schema", () => {
  it("keeps a reading's value as sent (no rounding)", () => {
    const op = {
      ...base(),
      kind: "measurement.recorded",
      payload: { stepId: randomUUID(), specId: randomUUID(), readingIndex: 0, value: 76.00512345678901, unit: "µm" },
    };
    const parsed = operationSchema.parse(op);
    // a number from an older tablet is kept as the decimal text it prints as (values travel as text now)
    expect(parsed.kind === "measurement.recorded" && parsed.payload.value).toBe("76.00512345678901");
  });

  it("checks the payload against its kind, naming the path", () => {
    const bad = operationSchema.safeParse({
      ...base(),
      kind: "torque.bolt-confirmed",
      payload: { stepId: randomUUID(), torqueSpecId: randomUUID(), passIndex: 0, bolt: 1, wrenchReading: 20 },
    });
    expect(bad.success).toBe(false);
    const paths = bad.error!.issues.map((i) => i.path.join("."));
    expect(paths).toContain("payload.passIndex");
    expect(paths).toContain("payload.wrenchUnit");
  });

  it("refuses unknown kinds, unknown fields and bad stamps", () => {
    expect(operationSchema.safeParse({ ...base(), kind: "step.skipped", payload: {} }).error?.issues[0].path).toEqual(["kind"]);
    const extra = operationSchema.safeParse({ ...base(), kind: "step.completed", payload: { stepId: randomUUID(), by: "me" } });
    expect(extra.error?.issues[0]).toMatchObject({ code: "unrecognized_keys", path: ["payload"] });
    const stamp = operationSchema.safeParse({ ...base(), stamp: "2026-12-02", kind: "step.completed", payload: { stepId: randomUUID() } });
    expect(stamp.error?.issues[0].path).toEqual(["stamp"]);
  });

  it("takes a batch with a null or digit cursor only", () => {
    expect(syncBatchSchema.safeParse({ deviceId: "tab-1", cursor: null, operations: [] }).success).toBe(true);
    expect(syncBatchSchema.safeParse({ deviceId: "tab-1", cursor: "1200", operations: [] }).success).toBe(true);
    expect(syncBatchSchema.safeParse({ deviceId: "tab-1", cursor: "-1", operations: [] }).success).toBe(false);
    expect(syncBatchSchema.safeParse({ deviceId: "tab-1", cursor: "2026-12-02T09:00:00Z", operations: [] }).success).toBe(false);
  });
});

describe("splitting an outbox", () => {
  const ops: Operation[] = Array.from({ length: 25 }, () => ({ ...base(), kind: "step.completed", payload: { stepId: randomUUID() } }));
  const size = new TextEncoder().encode(JSON.stringify(ops[0])).byteLength + 1;

  it("keeps order and respects the count limit", () => {
    const batches = splitIntoBatches(ops, { maxOperations: 10 });
    expect(batches.map((b) => b.length)).toEqual([10, 10, 5]);
    expect(batches.flat()).toEqual(ops);
  });

  it("respects the byte limit", () => {
    const batches = splitIntoBatches(ops, { maxBodyBytes: 256 + size * 4 });
    expect(batches.every((b) => b.length <= 4)).toBe(true);
    expect(batches.flat()).toEqual(ops);
    for (const b of batches)
      expect(new TextEncoder().encode(JSON.stringify({ deviceId: "tab-1", cursor: "1", operations: b })).byteLength).toBeLessThanOrEqual(
        256 + size * 4,
      );
  });
});
