"use client";

import type { ColumnDef } from "@tanstack/react-table";
import Link from "next/link";
import { DataTable } from "@/app/ui/data-table";

interface Row {
  id: string;
  name: string;
  email: string | null;
  phone: string | null;
  bikeCount: number;
}

const columns: ColumnDef<Row, unknown>[] = [
  { id: "name", header: "Name", cell: ({ row }) => <Link className="font-bold underline" href={`/office/customers/${row.original.id}`}>{row.original.name}</Link> },
  { id: "email", header: "E-mail", enableSorting: false, cell: ({ row }) => row.original.email ?? "—" },
  { id: "phone", header: "Phone", enableSorting: false, cell: ({ row }) => row.original.phone ?? "—" },
  { id: "bikes", header: "Bikes", cell: ({ row }) => row.original.bikeCount },
];

export function CustomersTable() {
  return <DataTable<Row> endpoint="/api/office/customers" rowsKey="customers" columns={columns} initialSort={[{ id: "name", desc: false }]} searchLabel="Search name, e-mail, phone or tag" testId="customers-table" />;
}
