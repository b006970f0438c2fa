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

// The status predicates, written once: queries filter by these lists, code asks the functions.

/** Statuses in which bench work (steps, readings, torque, timers) is expected. */
export const OPEN_FOR_BENCH_WORK = ["in_build", "in_review", "on_dyno"] as const satisfies readonly WorkOrderStatus[];
/** Closed: the record is finished (handed over) or abandoned (cancelled); nothing more happens. */
export const CLOSED_STATUSES = ["handed_over", "cancelled"] as const satisfies readonly WorkOrderStatus[];
/** Being built: the customer sees the build's progress (steps and stages) while in these. */
const BEING_BUILT = ["in_build", "in_review"] as const satisfies readonly WorkOrderStatus[];
/** Dyno runs can be recorded and read: from the build on, the handed-over record included. */
export const DYNO_STATUSES = ["in_build", "in_review", "on_dyno", "ready", "handed_over"] as const satisfies readonly WorkOrderStatus[];

/** A quote may be written (or revised) until the customer approves one. */
const QUOTABLE = ["booked_in", "inspected", "quoted"] as const satisfies readonly WorkOrderStatus[];

export function isQuotable(status: WorkOrderStatus): boolean {
  return (QUOTABLE as readonly WorkOrderStatus[]).includes(status);
}

export function isOpenForBenchWork(status: WorkOrderStatus): boolean {
  return (OPEN_FOR_BENCH_WORK as readonly WorkOrderStatus[]).includes(status);
}

export function isClosed(status: WorkOrderStatus): boolean {
  return (CLOSED_STATUSES as readonly WorkOrderStatus[]).includes(status);
}

export function isBeingBuilt(status: WorkOrderStatus): boolean {
  return (BEING_BUILT as readonly WorkOrderStatus[]).includes(status);
}
