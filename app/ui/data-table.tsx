"use client";

import { keepPreviousData, useQuery } from "@tanstack/react-query";
import { flexRender, getCoreRowModel, useReactTable, type ColumnDef, type SortingState } from "@tanstack/react-table";
import { useEffect, useState, type ReactNode } from "react";
import { noReasonGiven } from "@/lib/errors";

// A table whose rows come page by page from a route handler: sorting, a search box and extra
// filters are sent as query parameters (server-side paging with TanStack Table + react-query).
export function DataTable<Row>({
  endpoint,
  rowsKey,
  columns,
  initialSort,
  filters,
  searchLabel,
  toolbar,
  testId,
  pageSize = 15,
  onSearchChange,
}: {
  endpoint: string;
  rowsKey: string;
  columns: ColumnDef<Row, unknown>[];
  initialSort: SortingState;
  filters?: Record<string, string>;
  searchLabel: string;
  toolbar?: ReactNode;
  testId: string;
  pageSize?: number;
  /** Told the search text the table sends (after the typing pause), e.g. for an export link. */
  onSearchChange?: (q: string) => void;
}) {
  const [sorting, setSorting] = useState<SortingState>(initialSort);
  const [pagination, setPagination] = useState({ pageIndex: 0, pageSize });
  const [search, setSearch] = useState("");
  const [q, setQ] = useState("");
  useEffect(() => {
    const t = setTimeout(() => setQ(search.trim()), 250);
    return () => clearTimeout(t);
  }, [search]);
  useEffect(() => onSearchChange?.(q), [q, onSearchChange]);
  const filterKey = JSON.stringify(filters ?? {});
  useEffect(() => setPagination((p) => ({ ...p, pageIndex: 0 })), [q, filterKey]);

  const params = new URLSearchParams({ page: String(pagination.pageIndex), size: String(pagination.pageSize), q });
  if (sorting[0]) {
    params.set("sort", sorting[0].id);
    params.set("dir", sorting[0].desc ? "desc" : "asc");
  }
  for (const [k, v] of Object.entries(filters ?? {})) if (v) params.set(k, v);
  const url = `${endpoint}?${params}`;
  const query = useQuery({
    queryKey: [endpoint, url],
    queryFn: async () => {
      const res = await fetch(url);
      const data = await res.json().catch(() => ({}));
      if (!res.ok) throw new Error(data.error ?? noReasonGiven(res.status));
      return data as { total: number; more?: boolean } & Record<string, Row[]>;
    },
    placeholderData: keepPreviousData,
  });
  const rows = (query.data?.[rowsKey] as Row[] | undefined) ?? [];
  const total = query.data?.total ?? 0;
  // A capped count (`more`): the server counted `total` and there are more; Next stays open.
  const more = query.data?.more === true;
  // Sorting happens on the server: a sortable column needs an accessor for TanStack to offer it.
  const cols = columns.map((c) =>
    c.enableSorting === false || "accessorFn" in c ? c : { ...c, accessorFn: () => null, sortDescFirst: false },
  );
  const table = useReactTable({
    data: rows,
    columns: cols,
    state: { sorting, pagination },
    onSortingChange: setSorting,
    onPaginationChange: setPagination,
    manualSorting: true,
    manualPagination: true,
    manualFiltering: true,
    rowCount: total,
    getCoreRowModel: getCoreRowModel(),
  });
  const pages = Math.max(1, Math.ceil(total / pagination.pageSize));

  return (
    <div className="mt-4" data-testid={testId}>
      <div className="flex flex-wrap items-end gap-3">
        <label className="flex flex-col gap-1 text-base font-bold">
          {searchLabel}
          <input
            type="search"
            value={search}
            onChange={(e) => setSearch(e.target.value)}
            className="min-h-12 w-72 rounded-lg border-2 border-steel-700 bg-white px-3 text-lg font-normal"
          />
        </label>
        {toolbar}
      </div>
      {query.isError && (
        <p role="alert" className="mt-3 font-bold text-fail">
          {(query.error as Error).message}
        </p>
      )}
      <div className="mt-4 overflow-x-auto">
        <table className="w-full border-collapse text-left text-base">
          <thead>
            {table.getHeaderGroups().map((hg) => (
              <tr key={hg.id} className="border-b-2 border-steel-700">
                {hg.headers.map((h) => {
                  const sorted = h.column.getIsSorted();
                  return (
                    <th
                      key={h.id}
                      className="py-2 pr-3 align-bottom"
                      aria-sort={sorted === "asc" ? "ascending" : sorted === "desc" ? "descending" : undefined}
                    >
                      {h.column.getCanSort() ? (
                        <button
                          type="button"
                          onClick={h.column.getToggleSortingHandler()}
                          className="flex min-h-10 items-center gap-1 font-bold underline-offset-4 hover:underline"
                        >
                          {flexRender(h.column.columnDef.header, h.getContext())}
                          <span aria-hidden="true">{sorted === "asc" ? "▲" : sorted === "desc" ? "▼" : "↕"}</span>
                        </button>
                      ) : (
                        flexRender(h.column.columnDef.header, h.getContext())
                      )}
                    </th>
                  );
                })}
              </tr>
            ))}
          </thead>
          <tbody>
            {table.getRowModel().rows.map((r) => (
              <tr key={r.id} className="border-b border-steel-300">
                {r.getVisibleCells().map((c) => (
                  <td key={c.id} className="py-2 pr-3">
                    {flexRender(c.column.columnDef.cell, c.getContext())}
                  </td>
                ))}
              </tr>
            ))}
            {!query.isLoading && rows.length === 0 && (
              <tr>
                <td colSpan={columns.length} className="py-4 text-lg">
                  Nothing matches.
                </td>
              </tr>
            )}
          </tbody>
        </table>
      </div>
      <div className="mt-3 flex flex-wrap items-center gap-3">
        <button
          type="button"
          className="min-h-12 rounded-lg border-2 border-steel-700 bg-white px-4 font-bold disabled:opacity-40"
          onClick={() => table.previousPage()}
          disabled={!table.getCanPreviousPage()}
        >
          ◀ Previous
        </button>
        <span data-testid={`${testId}-page`}>
          {more
            ? `Page ${pagination.pageIndex + 1} · more than ${total.toLocaleString("en-GB")} in all`
            : `Page ${pagination.pageIndex + 1} of ${pages} · ${total} in all`}
        </span>
        <button
          type="button"
          className="min-h-12 rounded-lg border-2 border-steel-700 bg-white px-4 font-bold disabled:opacity-40"
          onClick={() => table.nextPage()}
          disabled={!more && pagination.pageIndex + 1 >= pages}
        >
          Next ▶
        </button>
      </div>
    </div>
  );
}
