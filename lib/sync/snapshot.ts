/**
 * What the bench read endpoints return, for the client to fill IndexedDB. Pure zod schemas and
 * types, shared by db/bench/jobs.ts (which builds them) and the client (which can check them).
 * Numbers from numeric columns (specs) come as JSON numbers, exactly as entered; a reading comes
 * as its decimal text too (`valueText`, "0.030"), which is what every screen shows.
 *
 * Fields added since a version are added, never changed in type, so a tablet still on an older
 * version reads a newer snapshot (zod drops the keys it does not know). The server always sends
 * them; they are optional here because a copy stored on a tablet before a field existed lacks it,
 * and readers fall back (see lib/work-order-record/).
 */
import { z } from "zod";
import { MEASUREMENT_UNITS, TORQUE_UNITS } from "@/lib/calc/units";
import { BOLT_PATTERNS, cautionSchema, MEASUREMENT_GEOMETRIES, torquePassSchema } from "@/lib/procedures/template-schema";
import { WORK_ORDER_STATUSES } from "@/lib/work-orders/status";
import { cursorSchema, OPERATION_KINDS } from "./operations";
import { VERDICTS } from "./readings";

const id = z.uuid();
const time = z.iso.datetime({ offset: true });
const person = z.object({ id, name: z.string() });

const benchBikeSchema = z.object({
  id,
  make: z.string(),
  model: z.string(),
  year: z.number().int().nullable(),
  tagCode: z.string(),
  colour: z.string().nullable(),
  displacementCc: z.number().int().nullable(),
});

/** One line of GET /api/bench/jobs. */
const benchJobSummarySchema = z.object({
  id,
  number: z.number().int(),
  title: z.string(),
  status: z.enum(WORK_ORDER_STATUSES),
  statusLabel: z.string(),
  assignedMechanic: person.nullable(),
  assignedToMe: z.boolean(),
  /** Whether the signed-in user may record work on it (see lib/sync/merge-rules mayWorkOn). */
  mayWork: z.boolean(),
  bike: benchBikeSchema,
  updatedAt: time,
});
export const benchJobListSchema = z.object({ jobs: z.array(benchJobSummarySchema) });

/** GET /api/bench/tags/[code]. */
export const tagLookupSchema = z.object({
  workOrderId: id,
  number: z.number().int(),
  bike: z.object({ id, tagCode: z.string(), make: z.string(), model: z.string() }),
});

/** GET /api/bench/tags/[code] for a bike with no open job whose last job was handed over (a possible come-back). */
export const handedOverLookupSchema = z.object({
  handedOver: z.object({
    workOrderId: id,
    number: z.number().int(),
    title: z.string(),
    tagCode: z.string(),
    handedOverOn: z.string().nullable(),
    openComeBack: z.object({ id, number: z.number().int() }).nullable(),
    /** Whether the person asking may open a come-back (office or supervisor). */
    canOpenComeBack: z.boolean(),
  }),
});

const torqueSpecSnapshotSchema = z.object({
  id,
  label: z.string(),
  finalValue: z.number(),
  unit: z.enum(TORQUE_UNITS),
  passes: z.array(torquePassSchema),
  anglePasses: z.array(z.number()),
  pattern: z.enum(BOLT_PATTERNS),
  boltCount: z.number().int(),
  lubricant: z.string(),
  torqueToYield: z.boolean(),
});

const measurementSpecSnapshotSchema = z.object({
  id,
  key: z.string(),
  label: z.string(),
  nominal: z.number().nullable(),
  min: z.number(),
  max: z.number(),
  unit: z.enum(MEASUREMENT_UNITS),
  readingLabels: z.array(z.string()),
  geometry: z.enum(MEASUREMENT_GEOMETRIES).nullable(),
});

const timerSpecSnapshotSchema = z.object({
  id,
  label: z.string(),
  durationS: z.number().int(),
  blocksStepKey: z.string().nullable(),
});

const stepSnapshotSchema = z.object({
  id,
  key: z.string(),
  title: z.string(),
  position: z.number().int(),
  instructions: z.string(),
  cautions: z.array(cautionSchema),
  requiresPhoto: z.boolean(),
  waitsForStepKey: z.string().nullable(),
  torqueSpecs: z.array(torqueSpecSnapshotSchema),
  measurementSpecs: z.array(measurementSpecSnapshotSchema),
  timerSpecs: z.array(timerSpecSnapshotSchema),
});

const stageSnapshotSchema = z.object({
  key: z.string(),
  title: z.string(),
  position: z.number().int(),
  steps: z.array(stepSnapshotSchema),
});

const procedureSnapshotSchema = z.object({
  jobProcedureId: id,
  position: z.number().int(),
  templateVersionId: id,
  templateKey: z.string(),
  name: z.string(),
  version: z.number().int(),
  exampleOnly: z.boolean(),
  stages: z.array(stageSnapshotSchema),
});

const completionSnapshotSchema = z.object({
  id,
  stepId: id,
  completedBy: id,
  deviceTime: time,
  receivedAt: time,
  flagged: z.boolean(),
  flagReason: z.string().nullable(),
  seq: cursorSchema,
});

const readingSnapshotSchema = z.object({
  id,
  stepId: id,
  specId: id,
  readingIndex: z.number().int(),
  /** The value as a number, for tablets of earlier versions. */
  value: z.number(),
  /** The value exactly as typed and stored, trailing zeros included ("0.030"). */
  valueText: z.string().optional(),
  unit: z.enum(MEASUREMENT_UNITS),
  verdict: z.enum(VERDICTS),
  note: z.string(),
  supersedesId: id.nullable(),
  /** The current reading of its spot (latest stamp, not superseded). */
  current: z.boolean(),
  recordedBy: id,
  deviceId: z.string(),
  deviceTime: time,
  stamp: z.string(),
  flagged: z.boolean(),
  flagReason: z.string().nullable(),
});

const torqueRecordSnapshotSchema = z.object({
  id,
  stepId: id,
  torqueSpecId: id,
  passIndex: z.number().int(),
  bolt: z.number().int(),
  wrenchReading: z.number().nullable(),
  /** The wrench reading as typed ("31.50"), kept to the digit; show this one. (Absent from older servers.) */
  wrenchReadingText: z.string().nullable().optional(),
  wrenchUnit: z.string().nullable(),
  recordedBy: id,
  deviceTime: time,
  /** Marked for the supervisor by the sync (e.g. the bolt and pass were recorded twice). */
  flagged: z.boolean().optional(),
  flagReason: z.string().nullable().optional(),
});

const timerSnapshotSchema = z.object({
  id,
  stepId: id,
  timerSpecId: id.nullable(),
  label: z.string(),
  durationS: z.number().int(),
  startedAt: time,
  startedBy: id,
  stoppedAt: time.nullable(),
  overrideBy: id.nullable(),
  overrideReason: z.string().nullable(),
  /** When the override was made (the hold is released from then). */
  overrideAt: time.nullable().optional(),
  stoppedBy: id.nullable().optional(),
  stopReason: z.string().nullable().optional(),
  /** Cancelled: started by mistake, it no longer counts. */
  cancelledAt: time.nullable().optional(),
  cancelledBy: id.nullable().optional(),
  cancelReason: z.string().nullable().optional(),
});

/** An entry taken back (`entry.withdrawn`): the entry stays in the snapshot, and this marks it. */
const withdrawalSnapshotSchema = z.object({
  id,
  /** The operation withdrawn (a completion's, bolt's or sign-off's own id; a photo's or part's `operationId`). */
  operationId: id,
  kind: z.enum(OPERATION_KINDS),
  withdrawnBy: id,
  reason: z.string(),
  deviceTime: time,
  receivedAt: time,
});

const signOffSnapshotSchema = z.object({
  id,
  jobProcedureId: id,
  stageKey: z.string(),
  signedBy: id,
  deviceTime: time,
  receivedAt: time,
  seq: cursorSchema,
});

/** The latest decision on each sign-off. */
const reviewDecisionSnapshotSchema = z.object({
  id,
  signOffId: id,
  jobProcedureId: id,
  stageKey: z.string(),
  decision: z.enum(["approved", "sent_back"]),
  reason: z.string(),
  reopenedStepIds: z.array(id),
  decidedBy: id,
  decidedAt: time,
  seq: cursorSchema,
});

const photoSnapshotSchema = z.object({
  id,
  stepId: id.nullable(),
  contentType: z.string(),
  byteSize: z.number().int(),
  caption: z.string(),
  awaitingUpload: z.boolean(),
  createdAt: time,
  /** The operation that queued it on a tablet (null for a photo from the office). */
  operationId: id.nullable().optional(),
  uploadedBy: id.nullable().optional(),
});

/** A part fitted to the job: from the bench (`part.fitted`, with any flag) or from the office (no step, perhaps). */
const partSnapshotSchema = z.object({
  id,
  stepId: id.nullable(),
  partNumber: z.string(),
  description: z.string(),
  supplier: z.string(),
  serial: z.string().nullable(),
  batch: z.string().nullable(),
  quantity: z.number().int(),
  fittedBy: id.nullable(),
  fittedAt: time,
  flagged: z.boolean(),
  flagReason: z.string().nullable(),
  /** The bench operation that recorded it (null when the office did). */
  operationId: id.nullable().optional(),
});

/** A clock on the job (time at the bench) and the records that end it (lib/clock/spans.ts works out when it ended). */
const clockSnapshotSchema = z.object({
  id,
  mechanicId: id,
  jobProcedureId: id.nullable(),
  stageKey: z.string().nullable(),
  startedAt: time,
  /** The operation that clocked on. */
  operationId: id,
  ends: z.array(
    z.object({
      kind: z.enum(["clocked-off", "closed-by-supervisor"]),
      endedAt: time,
      recordedBy: id,
      reason: z.string().nullable(),
      operationId: id.nullable(),
    }),
  ),
});

/** GET /api/bench/jobs/[id]: everything the bench needs for one job, and the cursor it is current to. */
export const jobSnapshotSchema = z.object({
  workOrder: z.object({
    id,
    number: z.number().int(),
    title: z.string(),
    complaint: z.string(),
    status: z.enum(WORK_ORDER_STATUSES),
    statusLabel: z.string(),
    openForBenchWork: z.boolean(),
    assignedMechanic: person.nullable(),
    assignedToMe: z.boolean(),
    mayWork: z.boolean(),
  }),
  bike: benchBikeSchema,
  /** Bench users of the shop, to show who did what. */
  people: z.array(person.extend({ role: z.enum(["mechanic", "supervisor"]) })),
  procedures: z.array(procedureSnapshotSchema),
  state: z.object({
    completions: z.array(completionSnapshotSchema),
    readings: z.array(readingSnapshotSchema),
    torqueRecords: z.array(torqueRecordSnapshotSchema),
    timers: z.array(timerSnapshotSchema),
    signOffs: z.array(signOffSnapshotSchema),
    reviewDecisions: z.array(reviewDecisionSnapshotSchema),
    photos: z.array(photoSnapshotSchema),
    parts: z.array(partSnapshotSchema),
    withdrawals: z.array(withdrawalSnapshotSchema).optional(),
    /** Time at the bench on this job (absent from copies stored before clocks existed). */
    clocks: z.array(clockSnapshotSchema).optional(),
  }),
  /**
   * The shop's change cursor the snapshot is current to. A device with no cursor yet starts syncing
   * from it; a device that has one keeps its own (changes are keyed by id, so one seen twice is harmless).
   */
  cursor: cursorSchema,
});

export type BenchJobSummary = z.output<typeof benchJobSummarySchema>;
export type TagLookup = z.output<typeof tagLookupSchema>;
export type HandedOverLookup = z.output<typeof handedOverLookupSchema>["handedOver"];
export type JobSnapshot = z.output<typeof jobSnapshotSchema>;
export type ClockSnapshot = z.output<typeof clockSnapshotSchema>;
