"use client";

import type { ColumnDef } from "@tanstack/react-table";
import { useCallback, useState } from "react";
import { DataTable } from "@/app/ui/data-table";
import { JobNumberFilter, SelectFilter, jobNumberFilter } from "@/app/ui/table-filters";
import type { AuditRow } from "@/db/audit/read";
import { AUDIT_RANGE_DEFAULT_DAYS, auditExportSchema, isoDay } from "@/lib/review/audit-range";
import { issuesOf } from "@/lib/zod-issues";
import { formatDayTimeSeconds } from "@/lib/format/dates";

const ACTIONS = [
  { value: "", label: "Anything" },
  { value: "review.", label: "Review decisions and e-mails" },
  { value: "sync.", label: "Bench work from tablets" },
  { value: "sync.measurement", label: "Readings" },
  { value: "sync.stage.signed-off", label: "Sign-offs" },
];

const OUTCOMES = [
  { value: "", label: "Either" },
  { value: "accepted", label: "Accepted" },
  { value: "refused", label: "Refused" },
];

const time = (v: string) => formatDayTimeSeconds(v);

const columns: ColumnDef<AuditRow, unknown>[] = [
  { id: "at", header: "When", cell: ({ row }) => <span className="whitespace-nowrap">{time(row.original.at)}</span> },
  {
    id: "job",
    header: "Job",
    cell: ({ row }) =>
      row.original.workOrderNumber === null ? "—" : <span className="font-mono font-bold">#{row.original.workOrderNumber}</span>,
  },
  {
    id: "actor",
    header: "Who",
    cell: ({ row }) => (
      <span>
        {row.original.actorName ?? "Benchtag"}
        {(row.original.actorRole || row.original.deviceId) && (
          <span className="block text-sm text-steel-700">
            {row.original.actorRole}
            {row.original.deviceId && <span className="block font-mono">tablet {row.original.deviceId}</span>}
          </span>
        )}
      </span>
    ),
  },
  { id: "action", header: "What", cell: ({ row }) => <span className="break-all font-mono text-sm">{row.original.action}</span> },
  {
    id: "outcome",
    header: "Outcome",
    cell: ({ row }) =>
      row.original.outcome === "accepted" ? (
        <span className="font-bold text-pass">✔ accepted</span>
      ) : (
        <span className="font-bold text-fail" data-testid="audit-refused">
          ✖ refused
        </span>
      ),
  },
  {
    id: "reason",
    header: "Why / details",
    enableSorting: false,
    cell: ({ row }) => (
      <span className="block max-w-md text-sm">
        {row.original.reason && <span className="block">{row.original.reason}</span>}
        <details>
          <summary className="cursor-pointer text-steel-700">details</summary>
          <pre className="whitespace-pre-wrap break-all text-xs">{JSON.stringify(row.original.detail, null, 1)}</pre>
        </details>
      </span>
    ),
  },
];

/** The shop's audit log, paged and sorted on the server, with a CSV download of what the filters select. */
export function AuditTable({ initialJob }: { initialJob: string }) {
  const [job, setJob] = useState(initialJob);
  const [outcome, setOutcome] = useState("");
  const [action, setAction] = useState("");
  const [q, setQ] = useState("");
  const onSearch = useCallback((v: string) => setQ(v), []);
  const [to, setTo] = useState(() => isoDay(new Date()));
  const [from, setFrom] = useState(() => isoDay(new Date(Date.now() - AUDIT_RANGE_DEFAULT_DAYS * 24 * 60 * 60 * 1000)));
  const filters = { job: jobNumberFilter(job).value, outcome, action };
  const exportQuery = { ...filters, q, from, to };
  // The same check the server makes: a bad range is said here, and the download is not offered.
  const checked = auditExportSchema().safeParse(exportQuery);
  const rangeProblem = checked.success
    ? null
    : issuesOf(checked.error)
        .map((i) => i.message)
        .join(" ");
  const exportUrl = `/api/audit/export?${new URLSearchParams(exportQuery)}`;
  return (
    <DataTable<AuditRow>
      endpoint="/api/audit"
      rowsKey="entries"
      columns={columns}
      initialSort={[{ id: "at", desc: true }]}
      filters={filters}
      searchLabel="Person, tablet or reason"
      testId="audit-table"
      pageSize={25}
      onSearchChange={onSearch}
      toolbar={
        <>
          <JobNumberFilter value={job} onChange={setJob} />
          <SelectFilter label="What" value={action} onChange={setAction} options={ACTIONS} />
          <SelectFilter label="Outcome" value={outcome} onChange={setOutcome} options={OUTCOMES} />
          <fieldset
            className="flex flex-wrap items-end gap-3 rounded-lg border-2 border-steel-300 px-3 pb-2"
            data-testid="audit-export-range"
          >
            <legend className="px-1 text-base font-bold">Download the days</legend>
            <DayField label="From" value={from} onChange={setFrom} />
            <DayField label="To" value={to} onChange={setTo} />
            {rangeProblem ? (
              <p role="alert" className="max-w-sm font-bold text-fail" data-testid="audit-export-problem">
                ✖ {rangeProblem}
              </p>
            ) : (
              <a
                href={exportUrl}
                download
                className="flex min-h-12 items-center rounded-lg bg-steel-900 px-4 text-lg font-bold text-white"
                data-testid="audit-export"
              >
                Download CSV
              </a>
            )}
          </fieldset>
        </>
      }
    />
  );
}

function DayField({ label, value, onChange }: { label: string; value: string; onChange: (v: string) => void }) {
  return (
    <label className="flex flex-col gap-1 text-base font-bold">
      {label}
      <input
        type="date"
        min="2000-01-01"
        max="2099-12-31"
        value={value}
        onChange={(e) => onChange(e.target.value)}
        className="min-h-12 rounded-lg border-2 border-steel-700 bg-white px-3 text-lg font-normal"
      />
    </label>
  );
}
