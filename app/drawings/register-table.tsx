// The register as a table (@tanstack/react-table v8): sortable columns, search across sheet, title and status,
// filters by status and discipline, the current revision per sheet, and each sheet's history on expand.
// Rows stack on a phone.
import {
  flexRender,
  getCoreRowModel,
  getExpandedRowModel,
  getFilteredRowModel,
  getSortedRowModel,
  useReactTable,
  type ColumnDef,
  type FilterFn,
  type SortingState,
} from "@tanstack/react-table";
import { Fragment, useMemo, useState } from "react";
import { Link } from "react-router";
import { formatDate } from "./format";
import type { RegisterRow } from "./register.server";
import { STATUS_LABELS, type RevisionStatus } from "./status";
import { ProcessingBadge, StatusBadge } from "./status-badge";

const searchFilter: FilterFn<RegisterRow> = (row, _id, value: string) => {
  const q = value.trim().toLowerCase();
  if (!q) return true;
  const d = row.original;
  const status = d.current ? STATUS_LABELS[d.current.status] : "";
  return [d.sheetNumber, d.title, d.discipline, status, d.current?.label ?? ""].some((s) => s.toLowerCase().includes(q));
};

export function RegisterTable({ drawings, projectId }: { drawings: RegisterRow[]; projectId: string }) {
  const [sorting, setSorting] = useState<SortingState>([{ id: "sheetNumber", desc: false }]);
  const [search, setSearch] = useState("");
  const [status, setStatus] = useState<"" | RevisionStatus>("");
  const [discipline, setDiscipline] = useState("");
  const disciplines = useMemo(() => [...new Set(drawings.map((d) => d.discipline))].sort(), [drawings]);

  const columns = useMemo<ColumnDef<RegisterRow>[]>(
    () => [
      {
        id: "sheetNumber",
        accessorKey: "sheetNumber",
        header: "Sheet",
        cell: ({ row }) => (
          <Link to={`/projects/${projectId}/drawings/${row.original.id}`} className="font-semibold text-copper-deep underline-offset-4 hover:underline">
            {row.original.sheetNumber}
          </Link>
        ),
      },
      { id: "title", accessorKey: "title", header: "Title" },
      { id: "discipline", accessorKey: "discipline", header: "Discipline", filterFn: "equalsString" },
      { id: "scale", accessorFn: (d) => d.scaleText ?? "", header: "Scale" },
      {
        id: "current",
        header: "Current revision",
        accessorFn: (d) => d.current?.status ?? "",
        filterFn: "equalsString",
        sortingFn: (a, b) => (a.original.current?.label ?? "").localeCompare(b.original.current?.label ?? ""),
        cell: ({ row }) => {
          const c = row.original.current;
          if (!c) return "—";
          return (
            <span className="flex flex-wrap items-center gap-2">
              <span className="font-bold tabular-nums">{c.label}</span>
              <StatusBadge status={c.status} />
              <ProcessingBadge state={c.processing} done={c.processedPages} total={c.pageCount} />
            </span>
          );
        },
      },
      { id: "updatedAt", accessorKey: "updatedAt", header: "Updated", cell: ({ getValue }) => formatDate(getValue() as string) },
      {
        id: "history",
        header: () => <span className="sr-only">History</span>,
        enableSorting: false,
        cell: ({ row }) => (
          <button
            type="button"
            onClick={row.getToggleExpandedHandler()}
            aria-expanded={row.getIsExpanded()}
            className="rounded-md border border-rule px-2 py-1 text-xs font-semibold hover:border-copper"
          >
            {row.getIsExpanded() ? "Hide" : "History"} ({row.original.revisions.length})
          </button>
        ),
      },
    ],
    [projectId],
  );

  // Stable references: a fresh filter array per render would make the table recompute and reset for ever.
  const columnFilters = useMemo(
    () => [...(status ? [{ id: "current", value: status }] : []), ...(discipline ? [{ id: "discipline", value: discipline }] : [])],
    [status, discipline],
  );
  const table = useReactTable({
    data: drawings,
    columns,
    state: { sorting, globalFilter: search, columnFilters },
    onSortingChange: setSorting,
    globalFilterFn: searchFilter,
    autoResetExpanded: false,
    getRowCanExpand: (row) => row.original.revisions.length > 0,
    getCoreRowModel: getCoreRowModel(),
    getSortedRowModel: getSortedRowModel(),
    getFilteredRowModel: getFilteredRowModel(),
    getExpandedRowModel: getExpandedRowModel(),
  });

  const rows = table.getRowModel().rows;
  return (
    <div>
      <div className="mb-4 flex flex-wrap items-end gap-3 text-sm">
        <label className="flex flex-col gap-1 font-semibold">
          Search
          <input type="search" value={search} onChange={(e) => setSearch(e.target.value)} placeholder="Sheet, title or status" className="rounded-md border border-rule bg-sheet px-3 py-2 font-normal" />
        </label>
        <label className="flex flex-col gap-1 font-semibold">
          Status
          <select value={status} onChange={(e) => setStatus(e.target.value as RevisionStatus | "")} className="rounded-md border border-rule bg-sheet px-3 py-2 font-normal">
            <option value="">Any status</option>
            {(Object.keys(STATUS_LABELS) as RevisionStatus[]).map((s) => <option key={s} value={s}>{STATUS_LABELS[s]}</option>)}
          </select>
        </label>
        <label className="flex flex-col gap-1 font-semibold">
          Discipline
          <select value={discipline} onChange={(e) => setDiscipline(e.target.value)} className="rounded-md border border-rule bg-sheet px-3 py-2 font-normal">
            <option value="">All</option>
            {disciplines.map((d) => <option key={d} value={d}>{d}</option>)}
          </select>
        </label>
        <p className="ml-auto text-ink-soft" aria-live="polite">{rows.length} of {drawings.length} sheets</p>
      </div>
      <table className="w-full text-sm" data-testid="register">
        <thead className="hidden text-left text-ink-soft sm:table-header-group">
          {table.getHeaderGroups().map((hg) => (
            <tr key={hg.id}>
              {hg.headers.map((h) => {
                const sorted = h.column.getIsSorted();
                return (
                  <th key={h.id} className="border-b border-rule pb-2 pr-3 font-semibold" aria-sort={sorted === "asc" ? "ascending" : sorted === "desc" ? "descending" : undefined}>
                    {h.column.getCanSort() ? (
                      <button type="button" onClick={h.column.getToggleSortingHandler()} className="inline-flex items-center gap-1 hover:text-copper-deep">
                        {flexRender(h.column.columnDef.header, h.getContext())}
                        <span aria-hidden>{sorted === "asc" ? "▲" : sorted === "desc" ? "▼" : "↕"}</span>
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
        <tbody className="divide-y divide-rule">
          {rows.map((row) => (
            <Fragment key={row.id}>
              <tr className="flex flex-col gap-1 py-3 sm:table-row" data-testid={`sheet-${row.original.sheetNumber}`}>
                {row.getVisibleCells().map((cell) => (
                  <td key={cell.id} className="sm:py-3 sm:pr-3">
                    <span className="mr-2 text-xs font-semibold text-ink-soft sm:hidden">{typeof cell.column.columnDef.header === "string" ? cell.column.columnDef.header : null}</span>
                    {flexRender(cell.column.columnDef.cell, cell.getContext())}
                  </td>
                ))}
              </tr>
              {row.getIsExpanded() ? (
                <tr className="block sm:table-row">
                  <td colSpan={row.getVisibleCells().length} className="block bg-paper/60 px-3 py-3 sm:table-cell">
                    <ol className="space-y-2" aria-label={`History of ${row.original.sheetNumber}`}>
                      {row.original.revisions.map((r) => (
                        <li key={r.id} className="flex flex-wrap items-center gap-x-3 gap-y-1">
                          <Link to={`/projects/${projectId}/drawings/${row.original.id}?rev=${r.id}`} className="font-bold text-copper-deep hover:underline">{r.label}</Link>
                          <StatusBadge status={r.status} />
                          <span className="text-ink-soft">{r.description || "No description"}</span>
                          <span className="text-xs text-ink-soft">uploaded by {r.uploadedBy}, {formatDate(r.uploadedAt)}{r.issuedAt ? ` · issued by ${r.issuedBy}, ${formatDate(r.issuedAt)}` : ""}</span>
                        </li>
                      ))}
                    </ol>
                  </td>
                </tr>
              ) : null}
            </Fragment>
          ))}
        </tbody>
      </table>
      {rows.length === 0 ? <p className="py-6 text-center text-ink-soft">{drawings.length ? "No sheet matches." : "The register is empty. Upload the first sheet."}</p> : null}
    </div>
  );
}
