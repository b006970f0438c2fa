/** Parts fitted and photos, per step: on record and waiting on this tablet. A withdrawn one stays listed, marked, and no longer counts. */
import { serialKey } from "@/lib/sync/parts";
import type { PendingWork } from "./pending";
import type { PartView, PhotoView, Snapshot, StepView, WithdrawalView, WorkOrderView } from "./types";

export function partsByStep(
  snapshot: Snapshot,
  work: PendingWork,
  withdrawn: ReadonlyMap<string, WithdrawalView>,
): Map<string, PartView[]> {
  const byStep = new Map<string, PartView[]>();
  const marked = (operationId: string | null) => (operationId === null ? null : (withdrawn.get(operationId) ?? null));
  const parts: Array<PartView & { stepId: string | null }> = [
    // A snapshot stored before parts were part of it has none.
    ...(snapshot.state.parts ?? []).map(({ flagged: _flagged, operationId, ...p }) => ({
      ...p,
      operationId: operationId ?? null,
      pending: false,
      withdrawn: marked(operationId ?? null),
    })),
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
      operationId: o.id,
      pending: true,
      withdrawn: marked(o.id),
    })),
  ];
  for (const { stepId, ...p } of parts) if (stepId) byStep.set(stepId, [...(byStep.get(stepId) ?? []), p]);
  return byStep;
}

/** Photos per step, on record and waiting; a photo is named by the operation that queued it, and a withdrawn one is marked. */
export function photosByStep(
  snapshot: Snapshot,
  work: PendingWork,
  withdrawn: ReadonlyMap<string, WithdrawalView>,
): Map<string, PhotoView[]> {
  const byStep = new Map<string, PhotoView[]>();
  const add = (stepId: string, p: PhotoView) => byStep.set(stepId, [...(byStep.get(stepId) ?? []), p]);
  for (const p of snapshot.state.photos) {
    if (!p.stepId) continue;
    const operationId = p.operationId ?? null;
    add(p.stepId, {
      attachmentId: p.id,
      operationId,
      takenBy: p.uploadedBy ?? null,
      withdrawn: operationId ? (withdrawn.get(operationId) ?? null) : null,
    });
  }
  for (const o of work.ofKind("photo.queued")) {
    add(o.payload.stepId, {
      attachmentId: o.payload.attachmentId,
      operationId: o.id,
      takenBy: o.authorId,
      withdrawn: withdrawn.get(o.id) ?? null,
    });
  }
  return byStep;
}

/** The step of this work order where a part with this part number and serial number is already recorded (and not withdrawn), if any. */
export function stepWithSerial(view: WorkOrderView, partNumber: string, serial: string): StepView | null {
  const key = serialKey(partNumber, serial);
  return (
    view.steps.find((s) => s.parts.some((p) => !p.withdrawn && p.serial !== null && serialKey(p.partNumber, p.serial) === key)) ?? null
  );
}
