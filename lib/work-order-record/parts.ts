/** Parts fitted and photos, per step: on record and waiting on this tablet. */
import { serialKey } from "@/lib/sync/parts";
import type { PendingWork } from "./pending";
import type { PartView, Snapshot, StepView, WorkOrderView } from "./types";

export function partsByStep(snapshot: Snapshot, work: PendingWork): Map<string, PartView[]> {
  const byStep = new Map<string, PartView[]>();
  const parts: Array<PartView & { stepId: string | null }> = [
    // A snapshot stored before parts were part of it has none.
    ...(snapshot.state.parts ?? []).map(({ flagged: _flagged, ...p }) => ({ ...p, pending: false })),
    ...work.ofKind("part.fitted").map((o) => ({
      id: o.payload.partFittedId,
      stepId: o.payload.stepId,
      partNumber: o.payload.partNumber,
      description: o.payload.description,
      supplier: o.payload.supplier ?? "",
      serial: o.payload.serial ?? null,
      batch: o.payload.batch ?? null,
      quantity: o.payload.quantity,
      fittedBy: o.authorId,
      fittedAt: o.deviceTime,
      flagReason: null,
      pending: true,
    })),
  ];
  for (const { stepId, ...p } of parts) if (stepId) byStep.set(stepId, [...(byStep.get(stepId) ?? []), p]);
  return byStep;
}

export function photoCountByStep(snapshot: Snapshot, work: PendingWork): Map<string, number> {
  const byStep = new Map<string, number>();
  for (const p of snapshot.state.photos) if (p.stepId) byStep.set(p.stepId, (byStep.get(p.stepId) ?? 0) + 1);
  for (const o of work.ofKind("photo.queued")) byStep.set(o.payload.stepId, (byStep.get(o.payload.stepId) ?? 0) + 1);
  return byStep;
}

/** The step of this work order where a part with this part number and serial number is already recorded, if any. */
export function stepWithSerial(view: WorkOrderView, partNumber: string, serial: string): StepView | null {
  const key = serialKey(partNumber, serial);
  return view.steps.find((s) => s.parts.some((p) => p.serial !== null && serialKey(p.partNumber, p.serial) === key)) ?? null;
}
