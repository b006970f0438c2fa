/**
 * Withdrawing an entry recorded by mistake (`entry.withdrawn`): the entry stays on record, marked
 * withdrawn with who, when and why, and stops counting — a withdrawn bolt must be tightened again,
 * a withdrawn completion leaves the step to do, a withdrawn sign-off reopens the stage for
 * sign-off, a withdrawn part or photo no longer counts for the step. Readings are not withdrawn:
 * they are corrected (a new reading naming the old one). Pure; used by the merge and the tablet.
 */
import type { Role } from "@/lib/auth/roles";
import type { OperationKind } from "./operations";

/** The kinds of entry that can be withdrawn, and what each is called at the bench. */
export const WITHDRAWABLE: Partial<Record<OperationKind, string>> = {
  "torque.bolt-confirmed": "torque bolt",
  "step.completed": "step completion",
  "part.fitted": "part fitted",
  "photo.queued": "photo",
  "stage.signed-off": "stage sign-off",
};

export function isWithdrawable(kind: OperationKind): boolean {
  return WITHDRAWABLE[kind] !== undefined;
}

/**
 * What the merge knows of an entry a withdrawal may name: on file, or accepted earlier in the merge.
 * A withdrawal whose entry has not arrived is held on the server until it does (./merge-rules.ts).
 */
export interface EntryFacts {
  workOrderId: string;
  kind: OperationKind;
  authorId: string;
  /** Already withdrawn (the first withdrawal stands). */
  withdrawn: boolean;
  /** For a torque bolt: its key in `MergeState.bolts`. */
  boltKey?: string;
  /** For a serial-numbered part: its key in `MergeState.partSerials`. */
  serialKey?: string;
  /** For a sign-off: whether a supervisor has decided on it. */
  decided?: boolean;
  /** For work on a step: the step. */
  stepId?: string;
  /** Kept flagged and not (yet) accepted by a supervisor. */
  flaggedOpen?: boolean;
}

/** The outcome of looking up something an operation names: found, or not on record (yet). */
export type TargetLookup<T> = { found: true; target: T } | { found: false; reason: string };

/** Why `actor` may not withdraw `entry`, or null when they may. */
export function withdrawalRefusal(actor: { id: string; role: Role }, entry: EntryFacts): string | null {
  if (entry.kind === "measurement.recorded") {
    return "A reading is not withdrawn: it is corrected. Record the right value on the same spot; the earlier reading stays on record, marked as corrected.";
  }
  if (entry.kind === "entry.withdrawn") return "A withdrawal cannot itself be withdrawn: record the work again instead.";
  if (entry.kind.startsWith("timer.")) return "A timer is stopped or cancelled (with a reason), not withdrawn.";
  if (!isWithdrawable(entry.kind)) return `Entries of this kind (${entry.kind}) cannot be withdrawn.`;
  if (entry.authorId !== actor.id && actor.role !== "supervisor") {
    return `Only the person who recorded this ${WITHDRAWABLE[entry.kind]}, or a supervisor, may withdraw it: a mechanic cannot take back someone else's entry (that would be recording in their name).`;
  }
  return null;
}

/** What a withdrawn entry was, in workshop words, from the facts the record keeps about it. */
export interface WithdrawnEntryFacts {
  kind: OperationKind;
  stepTitle: string | null;
  torque: { specLabel: string; passIndex: number; bolt: number } | null;
  part: { partNumber: string; description: string; serial: string | null; batch: string | null; quantity: number } | null;
  stageTitle: string | null;
}

export function describeWithdrawn(e: WithdrawnEntryFacts): string {
  const at = e.stepTitle ? ` at “${e.stepTitle}”` : "";
  switch (e.kind) {
    case "torque.bolt-confirmed":
      return e.torque ? `Bolt ${e.torque.bolt}, pass ${e.torque.passIndex} of ${e.torque.specLabel}${at}` : `A torque bolt${at}`;
    case "step.completed":
      return `Step marked done${at}`;
    case "part.fitted": {
      const p = e.part;
      if (!p) return `A part fitted${at}`;
      const ids = [p.serial && `serial ${p.serial}`, p.batch && `batch ${p.batch}`].filter(Boolean).join(", ");
      return `${p.quantity} × ${p.partNumber} ${p.description}${ids ? ` (${ids})` : ""}${at}`;
    }
    case "photo.queued":
      return `A photo${at}`;
    case "stage.signed-off":
      return `Sign-off of stage “${e.stageTitle ?? "?"}”`;
    default:
      return `An entry (${e.kind})`;
  }
}
