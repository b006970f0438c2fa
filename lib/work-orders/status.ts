// The work-order state flow. Names are plain workshop English chosen for Benchtag.
export const WORK_ORDER_STATUSES = [
  "booked_in", // bike received, complaint/goal and odometer recorded
  "inspected", // teardown or inspection findings recorded
  "quoted", // quote sent to the customer
  "approved", // customer accepted the quote (deposit may be pending)
  "in_build", // on the bench
  "in_review", // stages signed off, waiting for the supervisor
  "on_dyno", // tuning and verification runs
  "ready", // report written, waiting for collection
  "handed_over", // collected; the record is closed
  "cancelled",
] as const;
export type WorkOrderStatus = (typeof WORK_ORDER_STATUSES)[number];

export const STATUS_LABELS: Record<WorkOrderStatus, string> = {
  booked_in: "Booked in",
  inspected: "Inspected",
  quoted: "Quoted",
  approved: "Approved",
  in_build: "In build",
  in_review: "In review",
  on_dyno: "On the dyno",
  ready: "Ready",
  handed_over: "Handed over",
  cancelled: "Cancelled",
};

const NEXT: Record<WorkOrderStatus, readonly WorkOrderStatus[]> = {
  booked_in: ["inspected", "cancelled"],
  inspected: ["quoted", "cancelled"],
  quoted: ["approved", "inspected", "cancelled"],
  approved: ["in_build", "cancelled"],
  in_build: ["in_review"],
  in_review: ["in_build", "on_dyno", "ready"],
  on_dyno: ["in_build", "ready"],
  ready: ["handed_over", "on_dyno"],
  handed_over: [],
  cancelled: [],
};

export function allowedNextStatuses(from: WorkOrderStatus): readonly WorkOrderStatus[] {
  return NEXT[from];
}

export function canTransition(from: WorkOrderStatus, to: WorkOrderStatus): boolean {
  return NEXT[from].includes(to);
}

// Statuses in which bench work (steps, readings, torque, timers) is expected.
export function isOpenForBenchWork(status: WorkOrderStatus): boolean {
  return status === "in_build" || status === "in_review" || status === "on_dyno";
}

export function isClosed(status: WorkOrderStatus): boolean {
  return status === "handed_over" || status === "cancelled";
}
