"use client";

import type { ReactNode } from "react";
import { STATUS_LABELS, type WorkOrderStatus } from "@/lib/work-orders/status";
import { BigButton } from "./big-button";
import { TagKeypad } from "./tag-keypad";

export interface HomeJob {
  id: string;
  number: number;
  title: string;
  status: WorkOrderStatus;
  bike: { tagCode: string; make: string; model: string };
  assignedToMe: boolean;
  /** The job's whole copy is stored on this tablet (it opens offline). */
  onTablet: boolean;
}

/**
 * The bench's first screen as markup: scan or type a tag, or pick a job on this tablet. Rendered
 * twice: by the server inside the bench's shell (keypad and all, before any bench script has
 * loaded; `jobs` is null there) and by the bench itself with the tablet's jobs.
 */
export function HomeView({
  jobs,
  busy,
  notice,
  onScan,
  onOpenTag,
  onOpenJob,
}: {
  jobs: HomeJob[] | null;
  busy: boolean;
  notice?: ReactNode;
  onScan: () => void;
  onOpenTag: (code: string) => void;
  onOpenJob: (id: string) => void;
}) {
  return (
    <div className="flex flex-col gap-6 p-4">
      <section aria-labelledby="tag-heading" className="flex flex-col gap-4">
        <h1 id="tag-heading" className="text-3xl font-bold">
          Bench
        </h1>
        <BigButton tone="primary" onClick={onScan} className="min-h-24 text-2xl">
          Scan a bike&apos;s tag
        </BigButton>
        <p className="text-lg font-bold">Or type the tag code:</p>
        <TagKeypad onSubmit={onOpenTag} busy={busy} />
        {notice}
      </section>
      <section aria-labelledby="jobs-heading">
        <h2 id="jobs-heading" className="text-2xl font-bold">
          Jobs on this tablet
        </h2>
        {jobs === null && <p className="mt-3 text-lg">Reading this tablet&apos;s store…</p>}
        {jobs?.length === 0 && <p className="mt-3 text-lg">None yet. They arrive with the first sync.</p>}
        <ul className="mt-3 grid gap-3 md:grid-cols-2">
          {jobs?.map((j) => (
            <li key={j.id}>
              <button
                type="button"
                onClick={() => onOpenJob(j.id)}
                className="flex min-h-24 w-full flex-col items-start rounded-xl border-4 border-steel-700 bg-white px-4 py-3 text-left"
              >
                <span className="font-mono text-lg text-steel-700">
                  #{j.number} · {j.bike.tagCode} · {STATUS_LABELS[j.status]}
                  {j.assignedToMe ? " · yours" : ""}
                  {j.onTablet ? " · on tablet" : ""}
                </span>
                <span className="text-xl font-bold">
                  {j.bike.make} {j.bike.model}
                </span>
                <span className="text-lg">{j.title}</span>
              </button>
            </li>
          ))}
        </ul>
      </section>
    </div>
  );
}
