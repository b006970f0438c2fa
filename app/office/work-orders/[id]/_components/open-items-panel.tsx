"use client";

import Link from "next/link";
import { useState } from "react";
import { EntryAcceptanceForm } from "@/app/ui/entry-acceptance-form";
import { FormMessage } from "@/app/ui/form-field";
import { useQueryClient } from "@tanstack/react-query";
import { formatDayTime } from "@/lib/format/dates";
import { entryAcceptedOnItsOwn, openItemLine, openItemsSummary } from "@/lib/work-orders/open-items";
import { isClosed, STATUS_LABELS } from "@/lib/work-orders/status";
import type { WorkOrderData } from "./types";

type Item = WorkOrderData["openItems"][number];

// What a person can do about an item: the supervisor's review screen, or the build progress
// (the bench's part) further down this page.
function ItemLink({ item, closed }: { item: Item; closed: boolean }) {
  if (entryAcceptedOnItsOwn(item, closed)) return null;
  if (item.signOffId)
    return (
      <Link href={`/review/${item.signOffId}`} className="underline" data-testid="open-item-link">
        Open the review
      </Link>
    );
  return (
    <a href="#build-progress" className="underline" data-testid="open-item-link">
      See the build progress
    </a>
  );
}

/**
 * The checklist of what is still open on the record — what the gates on "ready" and "handed over"
 * check (lib/work-orders/open-items.ts) — and every override the office recorded on this job.
 */
export function OpenItemsPanel({ data, highlight }: { data: WorkOrderData; highlight: boolean }) {
  const items = data.openItems;
  const closed = isClosed(data.workOrder.status);
  // what an acceptance made here did (its form goes with the item it settled)
  const [accepted, setAccepted] = useState<string | null>(null);
  const qc = useQueryClient();
  const onAccepted = (message: string) => {
    setAccepted(message);
    void qc.invalidateQueries({ queryKey: ["work-order", data.workOrder.id] });
  };
  if (items.length === 0 && data.overrides.length === 0 && closed && !accepted) return null;
  return (
    <section
      id="open-items"
      aria-labelledby="open-items-heading"
      data-testid="open-items"
      className={`rounded-xl border-4 bg-white p-4 ${items.length && highlight ? "border-fail" : "border-steel-300"}`}
    >
      <h2 id="open-items-heading" className="text-2xl font-bold">
        Still open on the record
      </h2>
      {accepted && (
        <div className="mt-1">
          <FormMessage ok={accepted} />
        </div>
      )}
      {items.length === 0 ? (
        <p className="mt-1 text-lg text-pass" data-testid="open-items-none">
          <span aria-hidden="true">✔</span> Nothing open: every stage is signed off and approved, every flagged entry accepted.
        </p>
      ) : (
        <>
          <p className="mt-1 text-lg font-bold" data-testid="open-items-summary">
            <span aria-hidden="true">✖</span> {openItemsSummary(items)}. The job cannot move to “{STATUS_LABELS.ready}” or “
            {STATUS_LABELS.handed_over}” until these are settled, unless you override with a written reason.
          </p>
          <ul className="mt-3 divide-y-2 divide-steel-300 border-y-2 border-steel-300">
            {items.map((i) => (
              <li key={i.key} className="flex flex-wrap items-baseline gap-x-4 gap-y-1 py-2 text-lg" data-testid="open-item">
                <span aria-hidden="true" className="font-bold text-fail">
                  ☐
                </span>
                <span className="min-w-0 flex-1">
                  {i.stage && (
                    <span className="font-bold">
                      {i.stage.title}
                      {i.step ? ` › ${i.step.title}` : ""}
                    </span>
                  )}
                  <span className="block">{i.reason}</span>
                </span>
                <ItemLink item={i} closed={closed} />
                {entryAcceptedOnItsOwn(i, closed) && (
                  <EntryAcceptanceForm
                    workOrderId={data.workOrder.id}
                    operationId={entryAcceptedOnItsOwn(i, closed)!}
                    onAccepted={onAccepted}
                  />
                )}
              </li>
            ))}
          </ul>
        </>
      )}
      {data.overrides.length > 0 && (
        <div className="mt-4" data-testid="overrides">
          <h3 className="text-xl font-bold">Moved on with items open</h3>
          <ul className="mt-1 space-y-3">
            {data.overrides.map((o) => (
              <li key={o.id} className="rounded-lg border-2 border-warn bg-warn-light p-3 text-lg" data-testid="override">
                <p className="font-bold text-warn">
                  <span aria-hidden="true">⚠</span> {STATUS_LABELS[o.from]} → {STATUS_LABELS[o.to]} with {openItemsSummary(o.openItems)}
                </p>
                <p>
                  {o.byName}, {formatDayTime(o.at)}: “{o.reason}”
                </p>
                <details>
                  <summary className="cursor-pointer font-bold">Open at that moment ({o.openItems.length})</summary>
                  <ul className="ml-5 list-disc text-base">
                    {o.openItems.map((i) => (
                      <li key={i.key}>{openItemLine(i)}</li>
                    ))}
                  </ul>
                </details>
              </li>
            ))}
          </ul>
        </div>
      )}
    </section>
  );
}
