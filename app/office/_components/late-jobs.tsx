import Link from "next/link";
import type { LateJob } from "@/db/calendar/promises";
import { dayLabel } from "@/lib/aftercare/reminders";
import { STATUS_LABELS } from "@/lib/work-orders/status";

// Jobs past the day promised to the customer and not yet ready: shown first on the office's page.
export function LateJobs({ jobs }: { jobs: LateJob[] }) {
  if (!jobs.length) return null;
  return (
    <section className="mt-6 rounded-xl border-2 border-fail bg-white p-4" data-testid="late-jobs">
      <h2 className="text-2xl font-bold text-fail">
        <span aria-hidden="true">✖ </span>Late against the promised date ({jobs.length})
      </h2>
      <ul className="mt-2 grid gap-2">
        {jobs.map((j) => (
          <li key={j.workOrderId} className="text-lg" data-testid="late-job">
            <Link href={`/office/work-orders/${j.workOrderId}`} className="font-bold underline">
              Job #{j.number}
            </Link>{" "}
            · {j.make} {j.model} · {STATUS_LABELS[j.status]} · promised {dayLabel(j.promisedOn)} ({j.daysLate}{" "}
            {j.daysLate === 1 ? "day" : "days"} late; set by {j.setBy})
          </li>
        ))}
      </ul>
    </section>
  );
}
