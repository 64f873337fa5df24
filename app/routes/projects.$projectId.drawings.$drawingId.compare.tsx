import { Form, Link } from "react-router";
import type { Route } from "./+types/projects.$projectId.drawings.$drawingId.compare";
import { compareRevisions } from "~/drawings/compare.server";
import { Legend, Overlay, TextChanges } from "~/drawings/compare-view";
import { forPage } from "~/drawings/http.server";
import { getDrawing } from "~/drawings/register.server";
import { StatusBadge } from "~/drawings/status-badge";
import { requireProjectAction } from "~/projects/projects.server";
import { Button } from "~/ui/button";
import { Panel } from "~/ui/shell";

export async function loader({ context, request, params }: Route.LoaderArgs) {
  const { project } = requireProjectAction(context, request, "drawings.view");
  return forPage(async () => {
    const drawing = await getDrawing(project.id, params.drawingId);
    const q = new URL(request.url).searchParams;
    const revs = drawing.revisions; // newest first
    const to = q.get("to") ?? revs[0]?.id;
    const from = q.get("from") ?? revs.find((r) => r.id !== to)?.id;
    const page = Math.max(1, Number(q.get("page")) || 1);
    const result = to && from ? await compareRevisions(project.id, drawing.id, from, to, page) : null;
    return { projectId: project.id, drawing, result };
  });
}

export default function Compare({ loaderData }: Route.ComponentProps) {
  const { drawing, result, projectId } = loaderData;
  const base = `/projects/${projectId}/drawings/${drawing.id}`;
  return (
    <div className="space-y-6">
      <div>
        <p className="text-sm text-ink-soft"><Link to={base} className="underline underline-offset-4">Sheet {drawing.sheetNumber}</Link></p>
        <h2 className="text-2xl font-bold">Compare revisions of {drawing.sheetNumber}</h2>
      </div>
      <Form method="get" className="flex flex-wrap items-end gap-3 text-sm">
        {(["from", "to"] as const).map((k) => (
          <label key={k} className="flex flex-col gap-1 font-semibold">
            {k === "from" ? "Older (removed from)" : "Newer (added in)"}
            <select name={k} defaultValue={result?.[k].id} className="rounded-md border border-rule bg-sheet px-3 py-2 font-normal">
              {drawing.revisions.map((r) => <option key={r.id} value={r.id}>{r.label}</option>)}
            </select>
          </label>
        ))}
        {result && result.pageCount > 1 ? (
          <label className="flex flex-col gap-1 font-semibold">Page
            <input type="number" name="page" min={1} max={result.pageCount} defaultValue={result.page} className="w-20 rounded-md border border-rule bg-sheet px-3 py-2 font-normal" />
          </label>
        ) : null}
        <Button type="submit" variant="quiet">Compare</Button>
      </Form>
      {!result ? (
        <Panel><p>This sheet has only one revision so far: there is nothing to compare yet.</p></Panel>
      ) : (
        <>
          <Panel>
            <div className="mb-3 flex flex-wrap items-center justify-between gap-3">
              <h3 className="text-lg font-bold">Drawing: {result.from.label} → {result.to.label}, page {result.page}</h3>
              <Legend />
            </div>
            {!result.visual.sameSize ? <p className="mb-2 text-sm text-warn" role="note">The two pages differ in size; they are aligned at the top-left corner at the same scale.</p> : null}
            <Overlay visual={result.visual} src={`${base}/overlay?from=${result.from.id}&to=${result.to.id}&page=${result.page}`} />
          </Panel>
          <div className="grid gap-6 lg:grid-cols-2">
            <Panel>
              <h3 className="mb-3 text-lg font-bold">Text</h3>
              {result.text.available ? <TextChanges diff={result.text} /> : <p className="text-sm text-ink-soft" role="status">{result.text.reason}</p>}
            </Panel>
            <Panel>
              <h3 className="mb-3 text-lg font-bold">What the revisions say changed</h3>
              <div className="grid gap-4 sm:grid-cols-2 text-sm">
                {(["from", "to"] as const).map((k) => (
                  <div key={k}>
                    <p className="mb-1 flex items-center gap-2 font-bold">{result[k].label} <StatusBadge status={result[k].status} /></p>
                    <p className="whitespace-pre-line" data-testid={`description-${k}`}>{result.descriptions[k] || <span className="text-ink-soft">No description.</span>}</p>
                  </div>
                ))}
              </div>
            </Panel>
          </div>
        </>
      )}
    </div>
  );
}

export const meta: Route.MetaFunction = ({ data }) => [{ title: `Compare ${data?.drawing.sheetNumber ?? ""} · Countersign` }];
