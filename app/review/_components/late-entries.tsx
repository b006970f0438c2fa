"use client";

import Link from "next/link";
import { useRouter } from "next/navigation";
import { useState } from "react";
import { EntryAcceptanceForm } from "@/app/ui/entry-acceptance-form";
import { FormMessage } from "@/app/ui/form-field";
import { entryAcceptedOnItsOwn, openItemLine, type OpenItem } from "@/lib/work-orders/open-items";

export interface LateEntriesJob {
  workOrderId: string;
  number: number;
  title: string;
  items: OpenItem[];
}

/**
 * Flagged entries of closed jobs that no sign-off can carry (their stage's sign-off withdrawn or
 * never made): they are not in the queue above, since there is no sign-off to decide on. On a job
 * handed over they hold back the stored report's revisions until someone who did not record them
 * accepts them. The viewer's own entries are not listed (someone else accepts those).
 */
export function LateEntries({ jobs, officeLinks }: { jobs: LateEntriesJob[]; officeLinks: boolean }) {
  const router = useRouter();
  const [accepted, setAccepted] = useState<string | null>(null);
  if (jobs.length === 0 && !accepted) return null;
  return (
    <section
      className="mt-8 rounded-xl border-4 border-warn bg-white p-4"
      aria-labelledby="late-entries-heading"
      data-testid="late-entries"
    >
      <h2 id="late-entries-heading" className="text-2xl font-bold">
        <span aria-hidden="true">⚠ </span>Late entries with no sign-off to review
      </h2>
      <p className="mt-1 text-lg">
        Flagged work on closed jobs (handed over or cancelled), on stages with no sign-off to decide on. Each one stays open until someone
        who did not record it accepts it in writing; on a job handed over, the stored build report is revised only then.
      </p>
      {accepted && (
        <div className="mt-2">
          <FormMessage ok={accepted} />
        </div>
      )}
      {jobs.map((j) => (
        <div key={j.workOrderId} className="mt-4" data-testid="late-entries-job">
          <h3 className="text-xl font-bold">
            {officeLinks ? (
              <Link href={`/office/work-orders/${j.workOrderId}`} className="underline">
                <span className="font-mono">#{j.number}</span> {j.title}
              </Link>
            ) : (
              <>
                <span className="font-mono">#{j.number}</span> {j.title}
              </>
            )}
          </h3>
          <ul className="mt-1 divide-y-2 divide-steel-300 border-y-2 border-steel-300">
            {j.items.map((i) => (
              <li key={i.key} className="py-2 text-lg" data-testid="late-entry">
                <p>{openItemLine(i)}</p>
                <EntryAcceptanceForm
                  workOrderId={j.workOrderId}
                  operationId={entryAcceptedOnItsOwn(i, true)!}
                  onAccepted={(m) => {
                    setAccepted(`#${j.number}: ${m}`);
                    router.refresh();
                  }}
                />
              </li>
            ))}
          </ul>
        </div>
      ))}
    </section>
  );
}
