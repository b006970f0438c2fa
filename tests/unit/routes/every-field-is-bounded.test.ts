import path from "node:path";
import { describe, expect, it } from "vitest";
import type { z } from "zod";
import type { RouteHandler } from "@/app/_server/route";
import { INT4_MAX } from "@/lib/safe-values";
import { operationSchema } from "@/lib/sync/operations";
import { ROOT, routeFiles } from "../../support/route-handlers";

// Every text and number a route takes in its JSON body or its query has a stated limit, checked by
// its schema, before anything reaches PostgreSQL. A text with none reached a unique index as a
// 6,000-character e-mail address ("index row size exceeds btree maximum": a server error), and a
// price the schema let through past the integer column of the quote failed the save the same way.
// This walks each route's schemas (RouteRule.schemas) down to its fields and hands each one values
// no form sends: texts of 100,000 characters in several shapes, numbers of ±1e300. A field must
// refuse them all, unless it is listed below with what bounds it instead. A number that may pass
// PostgreSQL's integer must be listed with the bigint (or numeric, or jsonb) column it goes to.
// Each kind of bench operation is held to the same (the sync parses each one alone): a reading
// typed as "31.5" and 20,000 zeros passed its schema and failed the whole batch at PostgreSQL's
// numeric (at most 16,383 decimal places), which jams a tablet's outbox.

/** Fields bounded by something other than their own schema: "METHOD route-path field" → why. */
const BOUNDED_ELSEWHERE: Record<string, string> = {
  "POST bench/outbox-handover body.entries[]{key}": "kept as a storable jsonb copy (storableCopy), never indexed",
  "POST bench/outbox-handover body.entries[]{}": "kept as a storable jsonb copy (storableCopy), never indexed",
  "POST bench/outbox-handover body.photosLeft[].byteSize": "kept in the hand-over's jsonb only",
  "POST jobs/[id]/build-sheet body.figures{key}": "checkBuildSheet (lib/build-figures) takes only the sheet's own figures",
  "POST jobs/[id]/build-sheet body.figures{}": "checkBuildSheet checks each figure against its unit and range",
  "POST jobs/[id]/build-sheet body.fuel": "checkBuildSheet",
  "POST jobs/[id]/build-sheet body.mapOutline": "checkBuildSheet",
  "POST jobs/[id]/dyno-runs body": "the handler parses the run with its own schema and limits (lib/dyno)",
  "POST presets/[kind] body.body": "checkPresetBody (lib/presets/preset-kinds) per kind",
  "POST sync body.operations[]": "each operation is parsed alone by the operation schema (lib/sync/operations)",
  "POST sync/discards body.discards[].operation": "kept as a storable jsonb copy in the audit log",
  "POST office/users body.password": "newPassword (lib/auth/password-rule: PASSWORD_MAX) in the schema's superRefine",
  "POST welcome body.repeat": "must equal the password, which has PASSWORD_MAX",
  "PUT office/work-orders/[id]/quote body.lines[].unitPriceMinor": "bigint column (MAX_MINOR); the subtotal is checked too",
  "PUT office/work-orders/[id]/quote body.depositMinor": "bigint column (MAX_MINOR), at most the quote's total",
  "POST office/templates body.stages[].steps[].torque[].finalValue": "WRENCH_READING_LIMIT per unit (template schema superRefine)",
  "POST office/templates body.stages[].steps[].torque[].passes[]|1.value": "WRENCH_READING_LIMIT per unit (template schema superRefine)",
};

const LONG = 100_000;
const longTexts = [
  "a".repeat(LONG),
  "7".repeat(LONG),
  `a@example.${"a".repeat(LONG)}`,
  `${"a".repeat(LONG)}@example.test`,
  `A${"1".repeat(LONG)}`,
  `${"x ".repeat(LONG / 2)}`,
  `1.${"0".repeat(LONG)}`, // a decimal whose value is plain, past any column's scale
];
const hugeNumbers = [1e300, -1e300];

type Def = Record<string, unknown> & { type: string };
type Node = z.ZodType & { _zod: { def: Def } };
const def = (s: Node) => s._zod.def as Def & Record<string, Node & unknown>;

interface Field {
  at: string;
  schema: Node;
  kind: "text" | "number" | "open";
}

/** The schema's fields: each text, number, or open value (unknown, record), with its path. */
function fields(s: Node, at: string, out: Field[] = []): Field[] {
  const d = def(s);
  switch (d.type) {
    case "string":
      out.push({ at, schema: s, kind: "text" });
      break;
    case "number":
      out.push({ at, schema: s, kind: "number" });
      break;
    case "unknown":
    case "any":
      out.push({ at, schema: s, kind: "open" });
      break;
    case "object":
      for (const [k, v] of Object.entries(d.shape as unknown as Record<string, Node>)) fields(v, `${at}.${k}`, out);
      break;
    case "array":
      fields(d.element, `${at}[]`, out);
      break;
    case "record":
      fields(d.keyType, `${at}{key}`, out);
      fields(d.valueType, `${at}{}`, out);
      break;
    case "union": {
      // a field taken as a number or as typed text: the field as a whole must refuse what is too long or too large
      const options = d.options as unknown as Node[];
      const leaves = options.map((o) => def(o).type);
      if (leaves.every((t) => ["string", "number", "literal", "null", "pipe", "enum"].includes(t)) && leaves.includes("string"))
        out.push({ at, schema: s, kind: "text" }, { at, schema: s, kind: "number" });
      else options.forEach((o, i) => fields(o, `${at}|${i}`, out));
      break;
    }
    case "optional":
    case "nullable":
    case "default":
    case "prefault":
    case "catch":
    case "readonly":
    case "nonoptional":
      fields(d.innerType, at, out);
      break;
    case "pipe":
      // a preprocess: the value as sent meets the output side
      if (def(d.in).type === "transform") fields(d.out, at, out);
      // a transform may refuse too (a text read as a number, then its range): a field's value as
      // sent meets the whole pipe; a field deeper inside meets its own schema
      else if (def(d.out).type === "transform")
        out.push(...fields(d.in, at).map((f) => (f.at === at && f.kind !== "open" ? { ...f, schema: s } : f)));
      else fields(d.in, at, out);
      break;
    case "lazy":
      fields((d.getter as unknown as () => Node)(), at, out);
      break;
    case "enum":
    case "literal":
    case "boolean":
    case "null":
    case "undefined":
    case "never":
      break;
    default:
      out.push({ at, schema: s, kind: "open" });
  }
  return out;
}

const takes = (s: Node, v: unknown) => s.safeParse(v).success;

/** What a field takes that it should not: "" when it refuses every hostile value. */
function tooOpen(f: Field): string {
  if (f.kind === "open") return "takes any value";
  if (f.kind === "text") {
    const taken = longTexts.find((t) => takes(f.schema, t));
    return taken === undefined ? "" : `takes a text of ${taken.length} characters`;
  }
  const huge = hugeNumbers.find((n) => takes(f.schema, n) || takes(f.schema, String(n)));
  if (huge !== undefined) return `takes ${huge}`;
  const pastInt = [INT4_MAX + 1, -INT4_MAX - 2].find((n) => takes(f.schema, n) || takes(f.schema, String(n)));
  return pastInt === undefined ? "" : `takes ${pastInt}, past PostgreSQL's integer`;
}

async function routeFields(): Promise<Array<{ name: string; field: Field }>> {
  const all: Array<{ name: string; field: Field }> = [];
  for (const file of routeFiles()) {
    const mod = (await import(path.join(ROOT, file))) as Record<string, RouteHandler<unknown>>;
    const route = file.replace(/^app\/api\//, "").replace(/\/route\.ts$/, "");
    for (const m of ["GET", "POST", "PUT", "PATCH", "DELETE"]) {
      const h = mod[m];
      if (!h) continue;
      const { body, query } = h.rule.schemas;
      const found = [...(body ? fields(body as Node, "body") : []), ...(query ? fields(query as Node, "query") : [])];
      for (const field of found) all.push({ name: `${m} ${route} ${field.at}`, field });
    }
  }
  return all;
}

describe("every field a route takes has a limit", () => {
  it("refuses texts of 100,000 characters and numbers of ±1e300 (and past the integer) in every field not listed", async () => {
    const all = await routeFields();
    expect(all.length).toBeGreaterThan(150);
    const open = all
      .filter(({ name }) => !(name in BOUNDED_ELSEWHERE))
      .map(({ name, field }) => ({ name, problem: tooOpen(field) }))
      .filter((x) => x.problem)
      .map((x) => `${x.name}: ${x.problem}`);
    expect(open).toEqual([]);
  }, 60_000);

  it("lists only fields that exist and are open without the list (no stale entry hides a new field)", async () => {
    const all = new Map((await routeFields()).map(({ name, field }) => [name, field]));
    const stale = Object.keys(BOUNDED_ELSEWHERE).filter((name) => !all.has(name) || !tooOpen(all.get(name)!));
    expect(stale).toEqual([]);
  }, 60_000);

  it("holds every field of every kind of bench operation (the sync parses each one alone) to the same limits", () => {
    const found = fields(operationSchema as unknown as Node, "operation");
    expect(found.length).toBeGreaterThan(30);
    const problems = found.map((f) => ({ at: f.at, kind: f.kind, problem: tooOpen(f) }));
    // the list excuses a number's size only: every text is held to its length by its own schema
    const excused = (x: { at: string; kind: Field["kind"] }) => x.kind === "number" && x.at in OPERATION_BOUNDED_ELSEWHERE;
    expect(problems.filter((x) => x.problem && !excused(x)).map((x) => `${x.at}: ${x.problem}`)).toEqual([]);
    const open = new Set(problems.filter((x) => x.problem && x.kind === "number").map((x) => x.at));
    expect(Object.keys(OPERATION_BOUNDED_ELSEWHERE).filter((at) => !open.has(at))).toEqual([]);
  });
});

/** Numbers of bench operations whose size is bounded by something other than their own schema. */
const OPERATION_BOUNDED_ELSEWHERE: Record<string, string> = {
  "operation|1.payload.value":
    "a number is taken as the decimal it prints as; its size per unit is READING_MAGNITUDE_LIMIT (the payload's superRefine)",
  "operation|2.payload.wrenchReading":
    "a number is taken as the decimal it prints as; its size per unit is WRENCH_READING_LIMIT (the payload's superRefine)",
};
