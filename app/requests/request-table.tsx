// A list of requests: counts per state, filters (a plain GET form, so the URL is shareable), and the table
// itself (stacked rows on a phone). What needs the viewer's action comes first, marked in words.
import { createColumnHelper, flexRender, getCoreRowModel, useReactTable } from "@tanstack/react-table";
import { Form, Link, useSearchParams, useSubmit } from "react-router";
import { AlertIcon } from "~/ui/icons";
import { formatWhen } from "./format";
import type { ListFilter, RequestList, RequestRow } from "./lists.server";
import { PROVISIONS, provisionLabel } from "./provisions";
import { StateBadge } from "./state-badge";
import { REQUEST_STATES, STATE_LABELS } from "./workflow";

const col = createColumnHelper<RequestRow>();

function columns(showProject: boolean) {
  return [
    col.accessor("code", {
      header: "Request",
      cell: (c) => (
        <div>
          <Link to={`/projects/${c.row.original.projectId}/requests/${c.row.original.id}`} className="font-semibold text-copper-deep underline-offset-4 hover:underline">
            {c.getValue()} · {c.row.original.title}
          </Link>
          {showProject ? <p className="text-ink-soft">{c.row.original.projectName}</p> : null}
          {c.row.original.needsMe ? <p className="mt-1 text-xs font-bold uppercase tracking-wide text-copper">▶ Needs your action</p> : null}
        </div>
      ),
    }),
    col.accessor("provision", { header: "Provision", cell: (c) => provisionLabel(c.getValue()) }),
    col.accessor("state", { header: "State", cell: (c) => <StateBadge state={c.getValue()} /> }),
    col.accessor("assignee", { header: "Engineer", cell: (c) => c.getValue() ?? <span className="text-ink-soft">Not assigned</span> }),
    col.accessor("dueAt", {
      header: "Due",
      cell: (c) => (
        <span className="flex flex-col">
          <span className={c.row.original.overdue ? "font-semibold text-fail" : ""}>
            {c.row.original.overdue ? <AlertIcon className="mr-1 inline" /> : null}
            {c.getValue() ? formatWhen(c.getValue(), false) : "—"}
            {c.row.original.overdue ? " (overdue)" : ""}
          </span>
          <span className="text-xs text-ink-soft">waiting {c.row.original.waiting}</span>
        </span>
      ),
    }),
  ];
}

export function RequestTable({ list, filter, showProject = false, me }: { list: RequestList; filter: ListFilter; showProject?: boolean; me: string }) {
  const table = useReactTable({ data: list.rows, columns: columns(showProject), getCoreRowModel: getCoreRowModel() });
  const submit = useSubmit();
  const select = "mt-1 block w-full rounded-md border border-rule bg-sheet px-2 py-2 text-sm";
  return (
    <div className="space-y-4">
      <ul className="flex flex-wrap gap-2 text-sm" aria-label="Requests per state">
        {REQUEST_STATES.filter((s) => list.counts[s]).map((s) => (
          <li key={s} className="rounded-md border border-rule bg-sheet px-3 py-1.5" data-testid={`count-${s}`}>
            {STATE_LABELS[s]}: <span className="font-bold tabular-nums">{list.counts[s]}</span>
          </li>
        ))}
        {list.total === 0 ? <li className="text-ink-soft">No requests yet.</li> : null}
      </ul>
      <Form method="get" className="grid gap-3 rounded-lg border border-rule bg-sheet p-4 text-sm sm:grid-cols-5" onChange={(e) => submit(e.currentTarget)}>
        <label className="font-semibold">State
          <select name="state" defaultValue={filter.state ?? ""} className={select}>
            <option value="">Any</option>
            {REQUEST_STATES.map((s) => <option key={s} value={s}>{STATE_LABELS[s]}</option>)}
          </select>
        </label>
        <label className="font-semibold sm:col-span-2">Provision
          <select name="provision" defaultValue={filter.provision ?? ""} className={select}>
            <option value="">Any</option>
            {PROVISIONS.map((p) => <option key={p.id} value={p.id}>{p.label}</option>)}
          </select>
        </label>
        <label className="font-semibold">Engineer
          <select name="assignee" defaultValue={filter.assignee ?? ""} className={select}>
            <option value="">Anyone</option>
            <option value="me">Me</option>
            <option value="none">Not assigned</option>
            {list.engineers.filter((e) => e.id !== me).map((e) => <option key={e.id} value={e.id}>{e.name}</option>)}
          </select>
        </label>
        <label className="flex items-center gap-2 font-semibold sm:mt-6">
          <input type="checkbox" name="overdue" value="1" defaultChecked={!!filter.overdue} className="h-4 w-4 accent-copper" /> Overdue only
        </label>
        <noscript><button type="submit">Filter</button></noscript>
      </Form>
      <table className="w-full text-sm" data-testid="request-table">
        <thead className="hidden text-left text-ink-soft sm:table-header-group">
          {table.getHeaderGroups().map((g) => (
            <tr key={g.id}>{g.headers.map((h) => <th key={h.id} className="pb-2 pr-3 font-semibold">{flexRender(h.column.columnDef.header, h.getContext())}</th>)}</tr>
          ))}
        </thead>
        <tbody className="divide-y divide-rule">
          {table.getRowModel().rows.map((row) => (
            <tr key={row.id} className="flex flex-col gap-1.5 py-3 sm:table-row" data-testid="request-row">
              {row.getVisibleCells().map((cell) => <td key={cell.id} className="align-top sm:py-3 sm:pr-3">{flexRender(cell.column.columnDef.cell, cell.getContext())}</td>)}
            </tr>
          ))}
        </tbody>
      </table>
      {list.total > 0 && list.rows.length === 0 ? <p className="text-sm text-ink-soft">No request matches these filters.</p> : null}
      <Pager list={list} />
    </div>
  );
}

/** Previous / next page links that keep the filters; the list comes a page at a time. */
function Pager({ list }: { list: RequestList }) {
  const [params] = useSearchParams();
  if (list.matching <= list.pageSize && list.page === 1) return null;
  const last = Math.max(1, Math.ceil(list.matching / list.pageSize));
  const to = (page: number) => {
    const next = new URLSearchParams(params);
    next.set("page", String(page));
    return `?${next}`;
  };
  const first = list.matching ? (list.page - 1) * list.pageSize + 1 : 0;
  const link = "rounded-md border border-rule bg-sheet px-3 py-1.5 font-semibold text-copper-deep";
  return (
    <nav aria-label="Pages of requests" className="flex flex-wrap items-center gap-3 text-sm">
      <span className="text-ink-soft">
        Showing {first}–{Math.min(list.matching, first + list.rows.length - 1)} of {list.matching} · page {list.page} of {last}
      </span>
      {list.page > 1 ? <Link to={to(list.page - 1)} className={link} rel="prev">Previous page</Link> : null}
      {list.page < last ? <Link to={to(list.page + 1)} className={link} rel="next">Next page</Link> : null}
    </nav>
  );
}
