"use client";

import type { ColumnDef } from "@tanstack/react-table";
import Link from "next/link";
import { useState } from "react";
import { STATUS_LABELS, WORK_ORDER_STATUSES } from "@/lib/work-orders/status";
import { DataTable } from "@/app/ui/data-table";
import { StatusBadge } from "@/app/ui/status-badge";
import type { ReplyOf } from "@/app/_server/route";
import type { GET } from "@/app/api/office/work-orders/route";
import type { Wire } from "@/app/ui/api-client";
import { formatDay } from "@/lib/format/dates";

/** One row of GET /api/office/work-orders, taken from the route. */
type Row = Wire<ReplyOf<typeof GET>>["workOrders"][number];

const columns: ColumnDef<Row, unknown>[] = [
  {
    id: "number",
    header: "No.",
    cell: ({ row }) => (
      <Link className="font-mono font-bold underline" href={`/office/work-orders/${row.original.id}`}>
        {row.original.number}
      </Link>
    ),
  },
  {
    id: "tag",
    header: "Bike",
    cell: ({ row }) => (
      <span>
        {row.original.make} {row.original.model} <span className="font-mono text-steel-700">{row.original.tagCode}</span>
      </span>
    ),
  },
  { id: "customer", header: "Customer", cell: ({ row }) => row.original.customerName },
  { id: "title", header: "Job", enableSorting: false, cell: ({ row }) => row.original.title },
  {
    id: "status",
    header: "Status",
    cell: ({ row }) => (
      <span className="flex flex-col items-start gap-1">
        <StatusBadge status={row.original.status} />
        {row.original.readyForBuild && (
          <span className="text-sm font-bold text-pass" data-testid="list-ready-for-build">
            <span aria-hidden="true">✔</span> Deposit paid: ready to go into build
          </span>
        )}
      </span>
    ),
  },
  { id: "mechanic", header: "Mechanic", enableSorting: false, cell: ({ row }) => row.original.mechanicName ?? "—" },
  { id: "updated", header: "Last change", cell: ({ row }) => formatDay(row.original.updatedAt) },
];

export function WorkOrdersTable() {
  const [status, setStatus] = useState("");
  return (
    <DataTable<Row>
      endpoint="/api/office/work-orders"
      rowsKey="workOrders"
      columns={columns}
      initialSort={[{ id: "number", desc: true }]}
      filters={{ status }}
      searchLabel="Search number, tag, customer, bike or job"
      testId="work-orders-table"
      toolbar={
        <label className="flex flex-col gap-1 text-base font-bold">
          Status
          <select
            value={status}
            onChange={(e) => setStatus(e.target.value)}
            className="min-h-12 rounded-lg border-2 border-steel-700 bg-white px-3 text-lg font-normal"
          >
            <option value="">Any</option>
            {WORK_ORDER_STATUSES.map((s) => (
              <option key={s} value={s}>
                {STATUS_LABELS[s]}
              </option>
            ))}
          </select>
        </label>
      }
    />
  );
}
