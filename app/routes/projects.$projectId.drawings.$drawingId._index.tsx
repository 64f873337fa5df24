import { lazy, Suspense, useCallback } from "react";
import { data, Form, Link } from "react-router";
import type { Route } from "./+types/projects.$projectId.drawings.$drawingId._index";
import { ClientOnly } from "~/ui/client-only";
import { formatBytes, formatDate, paperSize } from "~/drawings/format";
import { describeFailure, forPage } from "~/drawings/http.server";
import { retryProcessing } from "~/drawings/processing.server";
import { getDrawing } from "~/drawings/register.server";
import { retrySchema, withdrawSchema } from "~/drawings/schemas";
import { ProcessingBadge, StatusBadge } from "~/drawings/status-badge";
import { withdrawRevision } from "~/drawings/transmittals.server";
import { usePollWhile } from "~/drawings/use-poll";
import type { ViewState } from "~/drawings/viewer.client";
import { can } from "~/projects/permissions";
import { requireProjectAction } from "~/projects/projects.server";
import { Button, ButtonLink } from "~/ui/button";
import { FormErrors } from "~/ui/form";
import { Panel } from "~/ui/shell";

const Viewer = lazy(() => import("~/drawings/viewer.client"));

export async function loader({ context, request, params }: Route.LoaderArgs) {
  const { project, role } = requireProjectAction(context, request, "drawings.view");
  const drawing = await forPage(() => getDrawing(project.id, params.drawingId));
  const q = new URL(request.url).searchParams;
  const selected = drawing.revisions.find((r) => r.id === q.get("rev")) ?? drawing.current;
  const num = (k: string) => (q.get(k) !== null && Number.isFinite(Number(q.get(k))) ? Number(q.get(k)) : undefined);
  const view: ViewState = { page: Math.max(1, Math.floor(num("page") ?? 1)), zoom: Math.min(8, Math.max(0.25, num("zoom") ?? 1)), x: num("x"), y: num("y") };
  return { projectId: project.id, drawing, selected, view, canUpload: can(role, "drawings.upload"), canIssue: can(role, "drawings.issue") };
}

export async function action({ context, request }: Route.ActionArgs) {
  const form = await request.formData();
  const intent = String(form.get("intent"));
  try {
    if (intent === "retry") {
      const { user, project } = requireProjectAction(context, request, "drawings.upload");
      const v = retrySchema.safeParse(Object.fromEntries(form));
      if (!v.success) return data({ error: "Choose the revision to process again." }, { status: 400 });
      await retryProcessing(user.id, project.id, v.data.revisionId);
      return { error: null };
    }
    if (intent === "withdraw") {
      const { user, project } = requireProjectAction(context, request, "drawings.issue");
      const v = withdrawSchema.safeParse(Object.fromEntries(form));
      if (!v.success) return data({ error: v.error.issues[0]!.message }, { status: 400 });
      await withdrawRevision(user.id, project.id, v.data.revisionId, v.data.reason);
      return { error: null };
    }
  } catch (error) {
    const known = describeFailure(error);
    if (known) return data({ error: known.message }, { status: known.status });
    throw error;
  }
  return data({ error: "Unknown action." }, { status: 400 });
}

export default function DrawingPage({ loaderData, actionData }: Route.ComponentProps) {
  const { drawing, selected, view, projectId, canUpload, canIssue } = loaderData;
  usePollWhile(drawing.revisions.some((r) => r.processing === "queued" || r.processing === "running"));
  const base = `/projects/${projectId}/drawings/${drawing.id}`;
  const onViewChange = useCallback((v: ViewState) => {
    const url = new URL(window.location.href);
    if (selected) url.searchParams.set("rev", selected.id);
    url.searchParams.set("page", String(v.page));
    url.searchParams.set("zoom", String(v.zoom));
    for (const k of ["x", "y"] as const) v[k] === undefined ? url.searchParams.delete(k) : url.searchParams.set(k, String(v[k]));
    window.history.replaceState(window.history.state, "", url);
  }, [selected]);
  const thumbUrl = useCallback((n: number) => (selected?.processing === "done" ? `${base}/revisions/${selected.id}/thumbs/${n}` : null), [base, selected]);
  const previous = selected ? drawing.revisions.find((r) => r.id !== selected.id && r.status !== "withdrawn") : undefined;

  return (
    <div className="space-y-6">
      <div className="flex flex-wrap items-end justify-between gap-3">
        <div>
          <p className="text-sm text-ink-soft"><Link to={`/projects/${projectId}/drawings`} className="underline underline-offset-4">Register</Link> · {drawing.discipline}{drawing.scaleText ? ` · ${drawing.scaleText}` : ""}</p>
          <h2 className="text-2xl font-bold">Sheet {drawing.sheetNumber} — {drawing.title}</h2>
        </div>
        <div className="flex flex-wrap gap-2">
          {selected && previous ? <ButtonLink variant="quiet" to={`${base}/compare?from=${previous.id}&to=${selected.id}`}>Compare</ButtonLink> : null}
          {canIssue && selected ? <ButtonLink to={`/projects/${projectId}/transmittals?revision=${selected.id}`}>Issue</ButtonLink> : null}
        </div>
      </div>
      <FormErrors errors={actionData?.error ? [actionData.error] : undefined} />
      {selected ? (
        <Panel className="!p-3 sm:!p-4">
          <div className="mb-3 flex flex-wrap items-center gap-3 text-sm">
            <span className="text-lg font-bold">Revision {selected.label}</span>
            <StatusBadge status={selected.status} />
            <ProcessingBadge state={selected.processing} done={selected.processedPages} total={selected.pageCount} error={selected.processingError} />
            <span className="text-ink-soft">{selected.pageCount} page(s) · {selected.pages[0] ? paperSize(selected.pages[0].widthPt, selected.pages[0].heightPt) : ""} · {formatBytes(selected.byteSize)}</span>
          </div>
          <ClientOnly fallback={<p className="p-6 text-ink-soft">Opening the sheet…</p>}>
            {() => (
              <Suspense fallback={<p className="p-6 text-ink-soft">Opening the sheet…</p>}>
                <Viewer key={selected.id} fileUrl={`${base}/revisions/${selected.id}/file`} pages={selected.pages} thumbUrl={thumbUrl} initial={view} onViewChange={onViewChange} />
              </Suspense>
            )}
          </ClientOnly>
        </Panel>
      ) : null}
      <Panel>
        <h3 className="mb-3 text-lg font-bold">Revisions</h3>
        <ul className="divide-y divide-rule text-sm">
          {drawing.revisions.map((r) => (
            <li key={r.id} className="flex flex-wrap items-start justify-between gap-3 py-3" data-testid={`revision-${r.label}`}>
              <div className="space-y-1">
                <p className="flex flex-wrap items-center gap-2">
                  <Link to={`${base}?rev=${r.id}`} className="font-bold text-copper-deep underline-offset-4 hover:underline" aria-current={r.id === selected?.id ? "true" : undefined}>{r.label}</Link>
                  <StatusBadge status={r.status} />
                  <ProcessingBadge state={r.processing} done={r.processedPages} total={r.pageCount} error={r.processingError} />
                </p>
                <p>{r.description || <span className="text-ink-soft">No description of the change.</span>}</p>
                <p className="text-xs text-ink-soft">Uploaded by {r.uploadedBy}, {formatDate(r.uploadedAt)}{r.issuedAt ? ` · issued by ${r.issuedBy}, ${formatDate(r.issuedAt)}` : ""} · SHA-256 {r.sha256.slice(0, 12)}…</p>
              </div>
              <div className="flex flex-wrap gap-2">
                {canUpload && r.processing === "failed" ? (
                  <Form method="post"><input type="hidden" name="intent" value="retry" /><input type="hidden" name="revisionId" value={r.id} /><Button variant="quiet" className="px-3 py-1.5">Retry processing</Button></Form>
                ) : null}
                {canIssue && (r.status === "draft" || r.status === "for_review" || r.status === "accepted") ? (
                  <Form method="post" className="flex gap-2" onSubmit={(e) => { if (!confirm(`Withdraw revision ${r.label}?`)) e.preventDefault(); }}>
                    <input type="hidden" name="intent" value="withdraw" /><input type="hidden" name="revisionId" value={r.id} />
                    <label className="sr-only" htmlFor={`why-${r.id}`}>Why withdraw {r.label}</label>
                    <input id={`why-${r.id}`} name="reason" required minLength={3} placeholder="Why withdraw?" className="w-36 rounded-md border border-rule bg-sheet px-2 py-1" />
                    <Button variant="danger" className="px-3 py-1.5">Withdraw</Button>
                  </Form>
                ) : null}
              </div>
            </li>
          ))}
        </ul>
      </Panel>
    </div>
  );
}

export const meta: Route.MetaFunction = ({ data }) => [{ title: `${data?.drawing.sheetNumber ?? "Sheet"} · Countersign` }];
