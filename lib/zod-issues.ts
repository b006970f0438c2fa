import { z } from "zod";
import type { FieldIssue } from "./errors";

// zod's own messages ("Too big: expected string to have <=4000 characters", "Invalid input:
// expected number, received NaN") never reach a person. A message written on a schema stays as
// written; every other problem is said here in plain words, naming the field by the label the
// person sees: "Note: at most 4000 characters". This is the one place zod issues are turned into
// { path, message } pairs (`issuesOf`), on the server and in the browser alike.
//
// How: zod asks error maps for a message only when the schema gave none, most specific first
// (schema > per-parse map > global map). `workshopErrors(labels)` is such a map; it is installed
// globally below (so every parse anywhere gets it) and can be passed per parse with labels of
// its own: `schema.safeParse(input, { error: workshopErrors({ label: "Run name" }) })`.

/** A field's label by its key (the last named part of its path), e.g. { odometerKm: "Odometer" }. */
export type FieldLabels = Readonly<Record<string, string>>;

/** Labels of the fields people fill in across Benchtag, by key; a route or form may add its own. */
export const FIELD_LABELS: FieldLabels = {
  // people, bikes, work orders
  name: "Name",
  email: "E-mail",
  phone: "Phone",
  notes: "Notes",
  note: "Note",
  customerId: "Owner",
  make: "Make",
  model: "Model",
  year: "Year",
  vin: "VIN",
  engineNumber: "Engine number",
  displacementCc: "Displacement",
  colour: "Colour",
  tagCode: "Tag code",
  bikeId: "Bike",
  title: "Title",
  complaint: "Complaint or goal",
  odometerKm: "Odometer",
  to: "New status",
  override: "Override",
  openItemKeys: "Open items",
  templateVersionIds: "Procedure templates",
  mechanicId: "Mechanic",
  kind: "Kind",
  body: "Text",
  role: "Role",
  password: "Password",
  active: "Active",
  // quotes and parts
  lines: "Quote lines",
  description: "Description",
  partNumber: "Part number",
  quantityHundredths: "Quantity",
  unitPriceMinor: "Unit price",
  depositMinor: "Deposit",
  supplier: "Supplier",
  serial: "Serial number",
  batch: "Batch number",
  quantity: "Quantity",
  stepId: "Step",
  // lists and searches
  page: "Page",
  size: "Page size",
  q: "Search",
  sort: "Sort by",
  dir: "Sort order",
  status: "Status",
  job: "Job number",
  outcome: "Outcome",
  action: "Action",
  code: "Code",
  field: "Search in",
  version: "Version",
  download: "Download",
  // review
  decision: "Decision",
  reason: "Reason",
  expectedDecisionId: "Earlier decision",
  acceptances: "Accepted readings",
  readingId: "Reading",
  justification: "Reason for accepting",
  reopenStepIds: "Steps to redo",
  flagAcceptances: "Accepted flagged entries",
  operationId: "Flagged entry",
  // dyno
  label: "Name",
  ranOn: "Date",
  boostTarget: "Boost target",
  boostUnit: "Boost unit",
  pressureKpa: "Air pressure",
  temperatureC: "Air temperature",
  humidityPercent: "Humidity",
  standard: "Correction standard",
  curve: "Curve",
  torqueUnit: "Torque unit",
  fileName: "File name",
  text: "File",
  rows: "Curve rows",
  rpm: "Engine speed",
  torque: "Torque",
  // the bench's sync entries
  deviceId: "Tablet",
  cursor: "Sync position",
  operations: "Entries",
  id: "Entry id",
  workOrderId: "Work order",
  authorId: "Recorded by",
  deviceTime: "Time on the tablet",
  stamp: "Clock stamp",
  payload: "Entry details",
  specId: "Measurement",
  readingIndex: "Reading number",
  value: "Value",
  unit: "Unit",
  supersedesId: "Corrected reading",
  torqueSpecId: "Torque spec",
  passIndex: "Pass",
  bolt: "Bolt",
  wrenchReading: "Wrench reading",
  wrenchUnit: "Wrench unit",
  timerId: "Timer",
  timerSpecId: "Timer",
  startedAt: "Start time",
  stoppedAt: "Stop time",
  clockId: "Clock",
  endedAt: "Clock-off time",
  photoId: "Photo",
  contentType: "Photo type",
  byteSize: "Photo size",
  jobProcedureId: "Procedure",
  stageKey: "Stage",
  // template documents
  format: "Format",
  formatVersion: "Format version",
  key: "Key",
  summary: "Summary",
  exampleOnly: "Example only",
  stages: "Stages",
  steps: "Steps",
  instructions: "Instructions",
  requiresPhoto: "Photo required",
  cautions: "Cautions",
  measurements: "Measurements",
  timer: "Timer",
  templates: "Templates",
  finalValue: "Final value",
  passes: "Passes",
  percent: "Percent",
  anglePasses: "Angle passes",
  pattern: "Pattern",
  boltCount: "Bolt count",
  lubricant: "Lubricant",
  torqueToYield: "Torque-to-yield",
  nominal: "Nominal",
  min: "Minimum",
  max: "Maximum",
  readingLabels: "Reading labels",
  geometry: "Geometry",
  durationS: "Duration",
  blocksStepKey: "Step it holds back",
};

/** The label of the field at `path`: its key's label, or "This entry" for a field with none. */
export function fieldLabel(path: ReadonlyArray<PropertyKey>, labels: FieldLabels = {}): string {
  for (let i = path.length - 1; i >= 0; i--) {
    const key = path[i];
    if (typeof key !== "string") continue;
    return (Object.hasOwn(labels, key) ? labels[key] : undefined) ?? (Object.hasOwn(FIELD_LABELS, key) ? FIELD_LABELS[key] : "This entry");
  }
  return "This entry";
}

const FORMATS: Record<string, string> = {
  uuid: "is not a valid id",
  guid: "is not a valid id",
  email: "is not a valid e-mail address",
  url: "is not a valid web address",
  datetime: "must be a date and time (like 2026-03-14T09:30:00Z)",
  date: "must be a date (YYYY-MM-DD)",
  time: "must be a time (hh:mm)",
  regex: "holds characters that are not allowed here",
  starts_with: "does not start as it should",
  ends_with: "does not end as it should",
  includes: "is missing a part it should hold",
};

function listOf(values: readonly unknown[]): string {
  const shown = values.map((v) => String(v));
  return shown.length <= 1 ? (shown[0] ?? "") : `${shown.slice(0, -1).join(", ")} or ${shown[shown.length - 1]}`;
}

function typeRule(expected: string, input: unknown): string {
  if (input === undefined) return "is missing";
  if (input === null) return "is empty";
  if (typeof input === "number" && Number.isNaN(input)) return "is not a number";
  if (typeof input === "number" && !Number.isFinite(input)) return "must be a finite number";
  switch (expected) {
    case "number":
    case "int":
    case "bigint":
      return expected === "int" ? "must be a whole number" : "must be a number";
    case "string":
      return "must be text";
    case "boolean":
      return "must be yes or no";
    case "array":
    case "tuple":
    case "set":
      return "must be a list";
    case "date":
      return "must be a date";
    case "file":
      return "must be a file";
    default:
      return "is not in the right form";
  }
}

type SizeIssue = { origin?: string; maximum?: number | bigint; minimum?: number | bigint; inclusive?: boolean; exact?: boolean };

function sizeRule(big: boolean, i: SizeIssue): string {
  const n = big ? i.maximum : i.minimum;
  const inclusive = i.inclusive !== false;
  switch (i.origin) {
    case "string":
      if (!big && Number(n) === 1) return "is empty: enter it";
      if (i.exact) return `must be exactly ${n} characters`;
      return big ? `at most ${n} characters` : `at least ${n} characters`;
    case "array":
    case "set":
      if (!big && Number(n) === 1) return "add at least one";
      return big ? `at most ${n} entries` : `at least ${n} entries`;
    case "file":
      return big ? `at most ${n} bytes` : `at least ${n} bytes`;
    case "date":
      return big
        ? `no later than ${new Date(Number(n)).toISOString().slice(0, 10)}`
        : `no earlier than ${new Date(Number(n)).toISOString().slice(0, 10)}`;
    default:
      if (big) return inclusive ? `must be at most ${n}` : `must be less than ${n}`;
      return inclusive ? `must be at least ${n}` : `must be more than ${n}`;
  }
}

/** The rule a default zod issue broke, in plain words, without the field's name. */
function ruleOf(issue: z.core.$ZodRawIssue): string {
  const i = issue as z.core.$ZodRawIssue & Record<string, unknown>;
  switch (issue.code) {
    case "invalid_type":
      return typeRule(String(i.expected), issue.input);
    case "too_big":
      return sizeRule(true, i as SizeIssue);
    case "too_small":
      return sizeRule(false, i as SizeIssue);
    case "invalid_value": {
      const values = (i.values as unknown[] | undefined) ?? [];
      return values.length && values.length <= 8 ? `choose ${listOf(values)}` : "is not one of the allowed choices";
    }
    case "invalid_format":
      return FORMATS[String(i.format)] ?? "is not in the right form";
    case "not_multiple_of":
      return `must be a multiple of ${String(i.divisor)}`;
    case "unrecognized_keys":
      return "holds fields this form does not take";
    case "invalid_union":
      return "does not match any of the allowed forms";
    case "invalid_key":
    case "invalid_element":
      return "holds an entry that is not allowed";
    default:
      return "is not allowed";
  }
}

/** An error map naming the field and the rule, for zod issues without a message of their own. */
export function workshopErrors(labels: FieldLabels = {}): z.core.$ZodErrorMap {
  return (issue) => `${fieldLabel(issue.path ?? [], labels)}: ${ruleOf(issue)}`;
}

// Installed once for every parse in the process (server) or page (browser).
z.config({ customError: workshopErrors() });

/** The one flattener: a zod error as { path, message } pairs. `document` paths read "stages[1].steps[0]". */
export function issuesOf(error: z.ZodError, opts: { pathStyle?: "dots" | "document"; max?: number } = {}): FieldIssue[] {
  const text = opts.pathStyle === "document" ? documentPath : (p: ReadonlyArray<PropertyKey>) => p.map(String).join(".");
  return error.issues.slice(0, opts.max ?? error.issues.length).map((i) => ({ path: text(i.path), message: i.message }));
}

/** A path as it reads in a JSON document: "stages[1].steps[0].unit"; "(file)" for the whole. */
export function documentPath(path: ReadonlyArray<PropertyKey>): string {
  if (!path.length) return "(file)";
  return path.reduce<string>((acc, p) => (typeof p === "number" ? `${acc}[${p}]` : acc ? `${acc}.${String(p)}` : String(p)), "");
}

/** Parses with the workshop messages (and any labels of the caller's own). */
export function checkInput<S extends z.ZodType>(
  schema: S,
  input: unknown,
  labels: FieldLabels = {},
): { ok: true; data: z.output<S> } | { ok: false; issues: FieldIssue[] } {
  const r = schema.safeParse(input, { error: workshopErrors(labels) });
  return r.success ? { ok: true, data: r.data } : { ok: false, issues: issuesOf(r.error) };
}
