// The review sheet of a request: a drawing revision with the engineer's markups (drawn here by engineers,
// read-only for everyone else) and the requester's numbered pins.
import { lazy, Suspense } from "react";
import { Form, Link } from "react-router";
import type { Route } from "./+types/projects.$projectId.requests.$requestId.sheet";
import { ClientOnly } from "~/ui/client-only";
import { forPage } from "~/requests/http.server";
import { StateBadge } from "~/requests/state-badge";
import { getReviewSheet } from "~/review/sheet.server";
import { requireProjectAction } from "~/projects/projects.server";
import { Panel } from "~/ui/shell";

const MarkupCanvas = lazy(() => import("~/review/markup-canvas.client"));

export async function loader({ context, request, params }: Route.LoaderArgs) {
  const { project, role, user } = requireProjectAction(context, request, "requests.view");
  const wanted = new URL(request.url).searchParams.get("rev");
  const sheet = await forPage(() => getReviewSheet(project.id, params.requestId, { id: user.id, role }, wanted));
  return { ...sheet, me: { id: user.id, name: user.name } };
}

export default function ReviewSheet({ loaderData }: Route.ComponentProps) {
  const { request: r, choices, selected, markups, pins, me, canMarkUp, canPin } = loaderData;
  const base = `/projects/${r.projectId}/requests/${r.id}`;
  const opening = <p className="p-6 text-ink-soft">Opening the sheet…</p>;
  return (
    <div className="space-y-4">
      <div className="flex flex-wrap items-center gap-3">
        <h2 className="text-xl font-bold">Sheet · {r.code}</h2>
        <StateBadge state={r.state} />
        <Link to={base} className="text-sm font-semibold text-copper-deep underline underline-offset-4">Back to the request</Link>
      </div>
      {choices.length ? (
        <Form method="get" className="flex flex-wrap items-end gap-2 text-sm">
          <label className="flex flex-col">
            <span className="font-semibold">Revision</span>
            <select name="rev" defaultValue={selected?.id} className="rounded-md border border-rule bg-sheet px-2 py-1.5" onChange={(e) => e.currentTarget.form?.requestSubmit()}>
              {choices.map((c) => <option key={c.id} value={c.id}>{c.label}</option>)}
            </select>
          </label>
          <noscript><button className="rounded border border-rule px-3 py-1.5">Show</button></noscript>
        </Form>
      ) : null}
      <Panel className="!p-3 sm:!p-4">
        {selected ? (
          <ClientOnly fallback={opening}>
            {() => (
              <Suspense fallback={opening}>
                <MarkupCanvas key={selected.id} apiBase={`/api${base}`} calculatorUrl={`/projects/${r.projectId}/calculations/new/segment`} revision={selected} markups={markups} pins={pins} me={me} canMarkUp={canMarkUp} canPin={canPin} />
              </Suspense>
            )}
          </ClientOnly>
        ) : (
          <p className="text-sm text-ink-soft">This project has no drawing revisions yet. Upload a sheet to the register first.</p>
        )}
      </Panel>
    </div>
  );
}

export const meta: Route.MetaFunction = ({ data }) => [{ title: `Sheet · ${data?.request.code ?? "Request"} · Countersign` }];
