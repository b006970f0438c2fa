"use client";

import type { ColumnDef } from "@tanstack/react-table";
import Link from "next/link";
import { useState } from "react";
import { DataTable } from "@/app/ui/data-table";
import { formatDayTime } from "@/lib/format/dates";
import { JobNumberFilter, SelectFilter, jobNumberFilter } from "@/app/ui/table-filters";
import type { QueueRow } from "@/db/review/queue";

const READINGS = [
  { value: "", label: "All" },
  { value: "yes", label: "With readings out of tolerance" },
  { value: "no", label: "All readings in tolerance" },
];

const columns: ColumnDef<QueueRow, unknown>[] = [
  {
    id: "signed",
    header: "Signed off",
    cell: ({ row }) => (
      <span>
        {formatDayTime(row.original.deviceTime)}
        {row.original.resubmitted && <span className="block text-sm font-bold">↺ after a send-back</span>}
        {row.original.backAfterApproval && (
          <span className="block text-sm font-bold text-warn" data-testid="queue-back-after-approval">
            ⚑ approved, but{" "}
            {row.original.backAfterApproval === "flagged"
              ? "new flagged work after approval"
              : "a reading out of tolerance came in after approval"}
          </span>
        )}
      </span>
    ),
  },
  {
    id: "job",
    header: "Job",
    cell: ({ row }) => (
      <span>
        <span className="font-mono font-bold">#{row.original.number}</span>
        {row.original.jobStatus === "handed_over" && (
          <span className="block text-sm font-bold text-fail" data-testid="queue-handed-over">
            {row.original.handedOverWithOpenItems ? "✖ handed over with open items" : "✖ handed over"}
          </span>
        )}
      </span>
    ),
  },
  {
    id: "bike",
    header: "Bike",
    cell: ({ row }) => (
      <span>
        {row.original.make} {row.original.model}{" "}
        <span className="block whitespace-nowrap font-mono text-steel-700">{row.original.tagCode}</span>
      </span>
    ),
  },
  {
    id: "stage",
    header: "Stage",
    enableSorting: false,
    cell: ({ row }) => (
      <span>
        <span className="font-bold">{row.original.stageTitle}</span>
        <span className="block text-sm text-steel-700">{row.original.procedureName}</span>
      </span>
    ),
  },
  { id: "mechanic", header: "Signed by", cell: ({ row }) => row.original.mechanicName },
  {
    id: "outOfTolerance",
    header: "Out of tolerance",
    cell: ({ row }) =>
      row.original.outOfTolerance > 0 ? (
        <span
          className="inline-flex items-center gap-1 rounded border-2 border-fail bg-fail-light px-2 font-bold text-fail"
          data-testid="queue-oot"
        >
          <span aria-hidden="true">▲</span>
          {row.original.outOfTolerance} reading{row.original.outOfTolerance === 1 ? "" : "s"}
        </span>
      ) : (
        <span className="text-steel-700">none</span>
      ),
  },
  {
    id: "open",
    header: "",
    enableSorting: false,
    cell: ({ row }) => (
      <span className="flex flex-col items-start gap-1">
        <Link
          href={`/review/${row.original.signOffId}`}
          className="flex min-h-12 items-center rounded-lg bg-steel-900 px-4 font-bold text-white"
          aria-label={`Review #${row.original.number} ${row.original.stageTitle}`}
        >
          Review
        </Link>
        {row.original.flagReason && <span className="text-sm font-bold text-warn">⚑ flagged by the sync</span>}
      </span>
    ),
  },
];

/** The queue: server-side paged and sorted; filters by job, bike (search box), mechanic and readings out of tolerance. */
export function ReviewQueue({ people }: { people: Array<{ id: string; name: string }> }) {
  const [job, setJob] = useState("");
  const [mechanic, setMechanic] = useState("");
  const [outOfTolerance, setOutOfTolerance] = useState("");
  return (
    <DataTable<QueueRow>
      endpoint="/api/review/queue"
      rowsKey="signOffs"
      columns={columns}
      initialSort={[{ id: "signed", desc: true }]}
      filters={{ job: jobNumberFilter(job).value, mechanic, outOfTolerance }}
      searchLabel="Bike (tag, make or model)"
      testId="review-queue"
      toolbar={
        <>
          <JobNumberFilter value={job} onChange={setJob} />
          <SelectFilter
            label="Signed by"
            value={mechanic}
            onChange={setMechanic}
            options={[{ value: "", label: "Anyone" }, ...people.map((p) => ({ value: p.id, label: p.name }))]}
          />
          <SelectFilter label="Readings" value={outOfTolerance} onChange={setOutOfTolerance} options={READINGS} />
        </>
      }
    />
  );
}
