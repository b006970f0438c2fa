/**
 * Each operation of a batch checked on its own: POST /api/sync checks the envelope
 * (`syncEnvelopeSchema`), then every operation here. A malformed one is refused alone, with its
 * reason in workshop words, and the rest of the batch is merged. Pure; shared with the tests.
 */
import { isUuid } from "@/lib/ids";
import { storableCopy } from "@/lib/safe-values";
import { workshopErrors } from "@/lib/zod-issues";
import { OPERATION_KINDS, operationSchema, type Operation, type OperationKind, type SyncBatch } from "./operations";

/** An operation the wire format refuses: how to name it in the answer, why, and a copy the audit log can store. */
export interface MalformedOperation {
  /** Its id when it has one a tablet can match (a string); else its place in the batch, "operations.<n>". */
  id: string;
  reason: string;
  /** Its kind when it names a known one (for the audit log's action). */
  kind: OperationKind | null;
  /** Its work order id when that is a UUID (the audit log links it only when the job is in the shop). */
  workOrderId: string | null;
  /** The operation as sent, made storable (storableCopy). */
  copy: unknown;
}

/** The batch split into operations to merge and operations refused for their form. */
export interface ParsedBatch extends SyncBatch {
  malformed: MalformedOperation[];
}

const MAX_ID_CHARS = 200;
/** Problems named in one refusal (the first few are enough to act on). */
const MAX_PROBLEMS = 3;

/** What the mechanic can do about an entry the server cannot read. */
export const RECORD_AGAIN = "The server cannot store this entry as it is: record the work again, then discard this entry with a reason.";

function field(raw: unknown, key: string): unknown {
  return raw !== null && typeof raw === "object" && !Array.isArray(raw) ? (raw as Record<string, unknown>)[key] : undefined;
}

/** The id to answer with: the operation's own id when it is a short storable string, else its place. */
function answerId(raw: unknown, index: number): string {
  const id = field(raw, "id");
  if (typeof id === "string" && id.length > 0 && id.length <= MAX_ID_CHARS) {
    const safe = storableCopy(id);
    if (safe === id) return id;
  }
  return `operations.${index}`;
}

/** One operation checked against the wire format. */
export function parseOperation(raw: unknown, index: number): { ok: true; op: Operation } | { ok: false; refusal: MalformedOperation } {
  const parsed = operationSchema.safeParse(raw, { error: workshopErrors() });
  if (parsed.success) return { ok: true, op: parsed.data };
  const problems = [...new Set(parsed.error.issues.map((i) => i.message.replace(/\.$/, "")))];
  const shown = problems.slice(0, MAX_PROBLEMS).join("; ");
  const more = problems.length > MAX_PROBLEMS ? ` (and ${problems.length - MAX_PROBLEMS} more)` : "";
  const kind = field(raw, "kind");
  const workOrderId = field(raw, "workOrderId");
  return {
    ok: false,
    refusal: {
      id: answerId(raw, index),
      reason: `${shown}${more}. ${RECORD_AGAIN}`,
      kind: OPERATION_KINDS.includes(kind as OperationKind) ? (kind as OperationKind) : null,
      workOrderId: typeof workOrderId === "string" && isUuid(workOrderId) ? workOrderId : null,
      copy: storableCopy(raw),
    },
  };
}

/** Checks every operation of an envelope on its own. */
export function parseBatch(envelope: { deviceId: string; cursor: string | null; operations: readonly unknown[] }): ParsedBatch {
  const operations: Operation[] = [];
  const malformed: MalformedOperation[] = [];
  envelope.operations.forEach((raw, i) => {
    const r = parseOperation(raw, i);
    if (r.ok) operations.push(r.op);
    else malformed.push(r.refusal);
  });
  return { deviceId: envelope.deviceId, cursor: envelope.cursor, operations, malformed };
}
