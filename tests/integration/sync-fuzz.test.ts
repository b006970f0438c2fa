import { randomUUID } from "node:crypto";
import fc from "fast-check";
import { beforeAll, describe, expect, it } from "vitest";
import { POST as syncRoute } from "@/app/api/sync/route";
import type { SessionUser } from "@/lib/auth/session-user";
import { syncResponseSchema } from "@/lib/sync/changes";
import { formatStamp } from "@/lib/sync/hlc";
import { fixtureSpecs, type FixtureSpecs } from "../bench/sync-ops";
import { createShopFixture, type ShopFixture } from "./support/shop-fixture";
import { appRequest } from "./support/route-calls";
import { useTestDb } from "./support/test-db";

// POST /api/sync under hostile input: thousands of random operations, most of them broken in a
// way PostgreSQL or a later reader would refuse (NUL and lone surrogates in texts, year 0000 and
// 275760, numbers JSON turns into Infinity, ids that are not ids, wrong types, unknown fields),
// mixed with good ones. No answer may be a 5xx; every operation sent is answered; every refusal
// names its reason in workshop words.

const db = useTestDb();
let fx: ShopFixture;
let specs: FixtureSpecs;
let users: SessionUser[];

beforeAll(async () => {
  fx = await createShopFixture(db);
  specs = await fixtureSpecs(db, fx);
  users = [fx.users.mechanic, fx.users.mechanic2, fx.users.supervisor].map((u) => ({ ...u, customerId: null }));
});

// Numbers JSON.stringify cannot write are put into the body text afterwards: 1e999 parses to Infinity.
const RAW = { __INF__: "1e999", __NEG_INF__: "-1e999", __HUGE__: "123456789012345678901234567890.5", __TINY__: "4.9e-325" };

const hostileText = fc.constantFrom(
  "\u0000",
  "gap ok\u0000",
  "\uD800",
  "half \uDBFF emoji",
  "\uDC00",
  "bell\u0007",
  "esc\u001b[31m",
  "\u007f",
  "",
  "   ",
  "line\nbreak",
  "tab\there",
  "\u202Eright-to-left",
  "'; DROP TABLE operations; --",
  "%s%n",
  "\\u0000",
  "🔧 0.03 ✓",
  "x".repeat(1100),
);
const hostileTime = fc.constantFrom(
  "0000-01-01T00:00:00.000Z",
  "+275760-09-13T00:00:00.000Z",
  "-000001-01-01T00:00:00Z",
  "2026-13-45T99:99:99Z",
  "1999-12-31T23:59:59Z",
  "2100-01-01T00:00:00Z",
  "2026-12-02",
  "2026-12-02T09:30:00",
  "",
  "yesterday",
);
const hostileNumber = fc.constantFrom(
  "__INF__",
  "__NEG_INF__",
  "__HUGE__",
  "__TINY__",
  1e308,
  -1e308,
  -0,
  2 ** 53 + 1,
  0.1 + 0.2,
  -1,
  0,
  1.5,
  1e7,
);
const hostileId = fc.constantFrom(
  "",
  "not-a-uuid",
  "00000000-0000-0000-0000-000000000000",
  "ZZZZZZZZ-0000-4000-8000-000000000000",
  "\u0000",
  randomUUID().toUpperCase(),
);
const hostileValue = fc.oneof(
  hostileText,
  hostileTime,
  hostileNumber,
  hostileId,
  fc.constantFrom(null, true, [], {}, [1, 2, 3], { nested: { deeper: ["\u0000"] } }),
);

const T0 = Date.now() - 600_000;
let counter = 0;

/** A well-formed operation of the fixture job (which the merge may still refuse, flag or hold). */
function goodOp(author: SessionUser, device: string, pick: number): Record<string, unknown> {
  counter++;
  const at = T0 + counter;
  const base = {
    id: randomUUID(),
    workOrderId: fx.workOrderId,
    authorId: author.id,
    deviceId: device,
    deviceTime: new Date(at).toISOString(),
    stamp: formatStamp({ wallMs: at, counter: 0, deviceId: device }),
  };
  switch (pick % 10) {
    case 0:
      return { ...base, kind: "step.completed", payload: { stepId: specs.boreStepId } };
    case 1:
      return {
        ...base,
        kind: "measurement.recorded",
        payload: {
          stepId: specs.boreStepId,
          specId: specs.boreSpecId,
          readingIndex: pick % 6,
          value: 76 + (pick % 9) / 1000,
          unit: "mm",
          note: "ok",
        },
      };
    case 2:
      return {
        ...base,
        kind: "measurement.recorded",
        payload: {
          stepId: specs.boreStepId,
          specId: specs.boreSpecId,
          readingIndex: 0,
          value: 76.001,
          unit: "mm",
          supersedesId: randomUUID(),
        },
      };
    case 3:
      return {
        ...base,
        kind: "torque.bolt-confirmed",
        payload: { stepId: specs.caseBoltsStepId, torqueSpecId: specs.caseBoltsSpecId, passIndex: 1, bolt: 1 + (pick % 10) },
      };
    case 4:
      return {
        ...base,
        kind: "timer.started",
        payload: {
          timerId: randomUUID(),
          stepId: specs.cureStepId,
          label: "Cure",
          durationS: 1800,
          startedAt: new Date(at).toISOString(),
        },
      };
    case 5:
      return { ...base, kind: "timer.stopped", payload: { timerId: randomUUID(), stoppedAt: new Date(at).toISOString() } };
    case 6:
      return {
        ...base,
        kind: "photo.queued",
        payload: { attachmentId: randomUUID(), stepId: specs.boreStepId, contentType: "image/jpeg", byteSize: 1000, caption: "deck" },
      };
    case 8:
      return { ...base, kind: "clock.on", payload: { clockId: randomUUID(), startedAt: new Date(at).toISOString() } };
    case 9:
      // a clock-off of a clock not on file: held until its clock-on arrives
      return { ...base, kind: "clock.off", payload: { clockId: randomUUID(), endedAt: new Date(at).toISOString() } };
    default:
      return {
        ...base,
        kind: "part.fitted",
        payload: {
          partFittedId: randomUUID(),
          stepId: specs.rodStepId,
          partNumber: "GS-1",
          description: "Bolt",
          batch: `B-${pick}`,
          quantity: 2,
        },
      };
  }
}

/** What a field holds, so most broken values are of the field's own type (a text gets a hostile text). */
const TEXT_FIELDS = new Set([
  "label",
  "note",
  "caption",
  "partNumber",
  "description",
  "batch",
  "serial",
  "supplier",
  "reason",
  "deviceId",
  "kind",
  "unit",
]);
const TIME_FIELDS = new Set(["deviceTime", "startedAt", "stoppedAt", "endedAt"]);
const NUMBER_FIELDS = new Set(["value", "readingIndex", "passIndex", "bolt", "durationS", "byteSize", "quantity", "wrenchReading"]);
type Hostile = "text" | "time" | "number" | "id";
const hostileFor = (field: string): Hostile =>
  TEXT_FIELDS.has(field) ? "text" : TIME_FIELDS.has(field) ? "time" : NUMBER_FIELDS.has(field) ? "number" : "id";

/** Breaks one place of an operation: a top-level field, a payload field (or a new one), or the whole of it. */
function spoil(op: Record<string, unknown>, where: number, pickValue: (field: string) => unknown): unknown {
  const payload = { ...(op.payload as Record<string, unknown>) };
  // every payload field, the texts a tablet types (note, caption) and the top-level fields, plus a few odd cases
  const places = [
    ...Object.keys(payload).map((k) => `payload.${k}`),
    "payload.note",
    "payload.caption",
    "deviceTime",
    "stamp",
    "id",
    "workOrderId",
    "authorId",
    "kind",
    "payload",
    "payload.extra",
    "(whole)",
  ];
  const place = places[where % places.length];
  if (place === "(whole)") return pickValue("(whole)");
  if (!place.startsWith("payload.")) return { ...op, [place]: pickValue(place) };
  const key = place.slice("payload.".length);
  payload[key] = pickValue(key);
  return { ...op, payload };
}

const entryArb = fc.record({
  pick: fc.nat(1000),
  broken: fc.boolean(),
  where: fc.nat(100),
  typed: fc.nat(3).map((n) => n > 0),
  text: hostileText,
  time: hostileTime,
  number: hostileNumber,
  id: hostileId,
  any: hostileValue,
});
const requestArb = fc.record({
  user: fc.nat(2),
  entries: fc.array(entryArb, { minLength: 30, maxLength: 120, size: "max" }),
  // one request in ten has a broken envelope (answered 422, nothing saved)
  badEnvelope: fc.oneof(
    { arbitrary: fc.constant(null), weight: 9 },
    { arbitrary: fc.constantFrom({ deviceId: "\u0000" }, { cursor: "-1" }, { cursor: "__INF__" }, { operations: "all" }), weight: 1 },
  ),
});

const RAW_ZOD = /expected (string|number|object)|received|Invalid input|Too (big|small)|Unrecognized key/;
const INTERNAL_NAMES =
  /\b(payload|readingIndex|supersedesId|torqueSpecId|timerId|clockId|endedAt|deviceTime|stepId|specId|partFittedId|attachmentId)\b/;

describe("POST /api/sync under random hostile input (bounded fuzz)", () => {
  it("never answers 5xx, answers every operation, and names every refusal's reason", async () => {
    let sent = 0;
    const statuses = new Map<number, number>();
    await fc.assert(
      fc.asyncProperty(requestArb, async ({ user: u, entries, badEnvelope }) => {
        const user = users[u];
        const device = `fuzz-${u}`;
        const ops = entries.map((e) => {
          const op = goodOp(user, device, e.pick);
          // three times in four a value of the field's own type, else anything
          const pickValue = (field: string) => (e.typed ? e[hostileFor(field)] : e.any);
          return e.broken ? spoil(op, e.where, pickValue) : op;
        });
        sent += ops.length;
        const body = { deviceId: device, cursor: null, operations: ops, ...(badEnvelope ?? {}) };
        let text = JSON.stringify(body);
        for (const [mark, raw] of Object.entries(RAW)) text = text.replaceAll(`"${mark}"`, raw);
        const res = await syncRoute.handle(
          appRequest("/api/sync", { method: "POST", body: text, headers: { "content-type": "application/json" } }),
          { user, db },
        );
        statuses.set(res.status, (statuses.get(res.status) ?? 0) + 1);
        const answer = await res.json();
        expect(res.status, JSON.stringify(answer)).toBeLessThan(500);
        if (res.status !== 200) {
          expect(badEnvelope).not.toBeNull();
          expect(answer.error).toEqual(expect.any(String));
          expect(answer.issues.length).toBeGreaterThan(0);
          return;
        }
        const parsed = syncResponseSchema.parse(answer);
        const answered = new Set([
          ...parsed.accepted,
          ...parsed.duplicates,
          ...parsed.refused.map((r) => r.id),
          ...parsed.pending.map((p) => p.id),
        ]);
        ops.forEach((op, i) => {
          const id = (op as { id?: unknown } | null)?.id;
          expect(answered.has(id as string) || answered.has(`operations.${i}`), `operation ${i} answered`).toBe(true);
        });
        for (const r of parsed.refused) {
          expect(r.reason.trim().length).toBeGreaterThan(10);
          expect(r.reason).not.toMatch(RAW_ZOD);
          expect(r.reason).not.toMatch(INTERNAL_NAMES);
        }
        for (const f of parsed.flagged) expect(f.reason.length).toBeGreaterThan(10);
      }),
      { numRuns: 60, seed: 1203, endOnFailure: true },
    );
    // thousands of operations went through, most of them answered 200
    expect(sent).toBeGreaterThan(2000);
    expect(statuses.get(200) ?? 0).toBeGreaterThan(40);
    // every refusal is on record, whole and readable
    const refusals = await db
      .selectFrom("audit_log")
      .select(["reason", "detail"])
      .where("shop_id", "=", fx.shopId)
      .where("outcome", "=", "refused")
      .execute();
    expect(refusals.length).toBeGreaterThan(500);
    expect(refusals.every((r) => typeof r.reason === "string" && r.reason.length > 10 && "operation" in (r.detail as object))).toBe(true);
  }, 180_000);
});
