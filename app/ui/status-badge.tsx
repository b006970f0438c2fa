import { STATUS_LABELS, type WorkOrderStatus } from "@/lib/work-orders/status";

// Status in words, with a shape cue; never colour alone.
export function StatusBadge({ status }: { status: WorkOrderStatus }) {
  return (
    <span className="inline-flex items-center gap-2 rounded border-2 border-steel-700 px-2 py-0.5 text-sm font-bold">
      <span aria-hidden="true">▸</span>
      {STATUS_LABELS[status]}
    </span>
  );
}
