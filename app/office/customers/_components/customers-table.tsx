"use client";

import type { ColumnDef } from "@tanstack/react-table";
import Link from "next/link";
import type { ReplyOf } from "@/app/_server/route";
import type { GET } from "@/app/api/office/customers/route";
import type { Wire } from "@/app/ui/api-client";
import { DataTable } from "@/app/ui/data-table";

/** One row of GET /api/office/customers, taken from the route. */
type Row = Wire<ReplyOf<typeof GET>>["customers"][number];

const columns: ColumnDef<Row, unknown>[] = [
  {
    id: "name",
    header: "Name",
    cell: ({ row }) => (
      <Link className="font-bold underline" href={`/office/customers/${row.original.id}`}>
        {row.original.name}
      </Link>
    ),
  },
  { id: "email", header: "E-mail", enableSorting: false, cell: ({ row }) => row.original.email ?? "—" },
  { id: "phone", header: "Phone", enableSorting: false, cell: ({ row }) => row.original.phone ?? "—" },
  { id: "bikes", header: "Bikes", cell: ({ row }) => row.original.bikeCount },
];

export function CustomersTable() {
  return (
    <DataTable<Row>
      endpoint="/api/office/customers"
      rowsKey="customers"
      columns={columns}
      initialSort={[{ id: "name", desc: false }]}
      searchLabel="Search name, e-mail, phone or tag"
      testId="customers-table"
    />
  );
}
