import { data, Form, Link, redirect, useNavigation, useSearchParams } from "react-router";
import type { Route } from "./+types/projects.$projectId.approvals.$approvalId";
import { diffApprovals } from "~/approvals/diff";
import { RecordView, type RecordViewData } from "~/approvals/record-view";
import { getApproval, recordInstallation, SiteError } from "~/approvals/site.server";
import { ApprovalState } from "~/approvals/state";
import { readFormWithFile, sniffImage } from "~/platform/small-upload.server";
import { can } from "~/projects/permissions";
import { requireProjectAction } from "~/projects/projects.server";
import { OUTCOME_LABELS, type PrincipleOutcome } from "~/review/principles";
import { Button } from "~/ui/button";
import { FormErrors } from "~/ui/form";
import { Panel } from "~/ui/shell";

export async function loader({ context, request, params }: Route.LoaderArgs) {
  const { project, role } = requireProjectAction(context, request, "approvals.view");
  try {
    const view = await getApproval(project.id, params.approvalId);
    const diff = view.previousSnapshot ? diffApprovals(view.previousSnapshot as never, view.snapshot as never) : null;
    return { ...view, diff, projectId: project.id, canRecord: can(role, "installations.record"), today: new Date().toISOString().slice(0, 10) };
  } catch (error) {
    if (error instanceof SiteError) throw data({ message: error.message }, { status: error.status });
    throw error;
  }
}

export async function action({ context, request, params }: Route.ActionArgs) {
  const { project, user, role } = requireProjectAction(context, request, "installations.record");
  const { fields, file, problem } = await readFormWithFile(request, { maxBytes: 15 * 1024 * 1024, sniff: sniffImage, wrongType: "The photo must be a JPEG, PNG or WebP image." });
  if (problem) return data({ error: problem }, { status: 422 });
  const installedOn = fields.installedOn ?? "";
  if (!/^\d{4}-\d{2}-\d{2}$/.test(installedOn) || new Date(installedOn) > new Date()) return data({ error: "Enter the date it was installed (not in the future)." }, { status: 400 });
  try {
    await recordInstallation({ id: user.id, name: user.name, role }, project.id, params.approvalId, { installedOn, note: fields.note?.slice(0, 2000), photos: file ? [file] : [] });
  } catch (error) {
    if (error instanceof SiteError) return data({ error: error.message }, { status: error.status });
    throw error;
  }
  throw redirect(`/projects/${project.id}/approvals/${params.approvalId}`);
}

export default function ApprovalPage({ loaderData, actionData }: Route.ComponentProps) {
  const { approval, snapshot, diff, projectId, canRecord, installations, versions, packSha256, today } = loaderData;
  const [params] = useSearchParams();
  const navigation = useNavigation();
  return (
    <div className="space-y-6">
      {params.get("signed") ? <p role="status" className="rounded-md border border-ok/40 bg-ok/5 px-4 py-3 text-sm text-ok">✓ Signed. The pack is stored and the team has been told.</p> : null}
      <div className="flex flex-wrap items-center justify-between gap-3">
        <div>
          <p className="text-sm font-semibold text-copper-deep">{approval.reference} · approval v{approval.n}</p>
          <h2 className="text-2xl font-bold">{approval.title}</h2>
          <p className="text-sm text-ink-soft">Signed by {approval.signer} · {approval.signedAt.replace("T", " ").slice(0, 16)} UTC</p>
        </div>
        <div className="flex flex-wrap items-center gap-3">
          <ApprovalState state={approval.state} />
          <a href={`/projects/${projectId}/approvals/${approval.id}/pack`} className="rounded-md bg-copper px-4 py-2.5 text-sm font-semibold text-white hover:bg-copper-deep">Download signed pack</a>
        </div>
      </div>
      {approval.stateReason ? <p className="text-sm"><strong>Why:</strong> {approval.stateReason}</p> : null}
      <div className="grid gap-6 lg:grid-cols-3">
        <Panel className="lg:col-span-2"><RecordView record={snapshot as unknown as RecordViewData} /></Panel>
        <div className="space-y-6">
          <Panel>
            <h3 className="font-bold">Check a copy</h3>
            <p className="mt-1 text-sm text-ink-soft">Anyone can check a pack at <Link className="underline" to={`/verify/${approval.verifyCode}`}>its verification page</Link>.</p>
            <p className="mt-2 break-all text-xs text-ink-soft">Pack SHA-256 {packSha256}</p>
            <a href={`/projects/${projectId}/approvals/${approval.id}/compliance-record.pdf`} className="mt-3 inline-block text-sm font-semibold text-copper-deep underline underline-offset-4">Compliance record (PDF) for the certificate</a>
          </Panel>
          <Panel>
            <h3 className="font-bold">Versions</h3>
            <ul className="mt-2 space-y-1 text-sm">{versions.map((v) => <li key={v.id}><Link className={v.id === approval.id ? "font-bold" : "underline"} to={`/projects/${projectId}/approvals/${v.id}`}>v{v.n}</Link> · {v.state.replace("_", " ")}</li>)}</ul>
            {diff ? (
              <div className="mt-3 space-y-1 text-sm" data-testid="version-diff">
                <p className="font-semibold">Changed since v{approval.n - 1}</p>
                {diff.conditionsAdded.map((c) => <p key={`+${c}`}>+ condition: {c}</p>)}
                {diff.conditionsRemoved.map((c) => <p key={`-${c}`}>− condition: {c}</p>)}
                {diff.principlesChanged.map((p) => <p key={p.label}>~ {p.label}: {p.from ? OUTCOME_LABELS[p.from as PrincipleOutcome] : "—"} → {p.to ? OUTCOME_LABELS[p.to as PrincipleOutcome] : "—"}</p>)}
                {diff.drawingsAdded.map((d) => <p key={`+${d}`}>+ drawing {d}</p>)}
                {diff.drawingsRemoved.map((d) => <p key={`-${d}`}>− drawing {d}</p>)}
              </div>
            ) : null}
          </Panel>
          <Panel>
            <h3 className="font-bold">Installation</h3>
            {installations.length ? installations.map((i) => <p key={i.id} className="mt-2 text-sm">✓ Installed as approved on {i.on} by {i.by}{i.photos ? ` · ${i.photos} photo` : ""}{i.note ? ` — ${i.note}` : ""}</p>) : null}
            {canRecord && approval.state === "current" && !installations.length ? (
              <Form method="post" encType="multipart/form-data" className="mt-3 space-y-3">
                <FormErrors errors={actionData?.error ? [actionData.error] : undefined} />
                <label className="block text-sm font-semibold" htmlFor="installedOn">Installed on</label>
                <input id="installedOn" name="installedOn" type="date" defaultValue={today} max={today} required className="block w-full rounded-md border border-rule bg-sheet px-3 py-2" />
                <label className="block text-sm font-semibold" htmlFor="photo">Photo (optional)</label>
                <input id="photo" name="photo" type="file" accept="image/*" capture="environment" className="block w-full text-sm" />
                <label className="block text-sm font-semibold" htmlFor="note">Note (optional)</label>
                <textarea id="note" name="note" rows={2} className="block w-full rounded-md border border-rule bg-sheet px-3 py-2" />
                <Button type="submit" className="w-full" disabled={navigation.state === "submitting"}>Record installed as approved</Button>
              </Form>
            ) : !installations.length ? <p className="mt-2 text-sm text-ink-soft">Not recorded yet.</p> : null}
          </Panel>
        </div>
      </div>
    </div>
  );
}
