import { data, Form, useNavigation } from "react-router";
import type { Route } from "./+types/verify.$code";
import { checkCopy, publicApproval } from "~/approvals/public.server";
import { ApprovalState } from "~/approvals/state";
import { readFormWithFile } from "~/platform/small-upload.server";
import { DECISION_LABELS, type DecisionOutcome } from "~/review/principles";
import { Button } from "~/ui/button";
import { AlertIcon, CheckIcon } from "~/ui/icons";
import { Panel } from "~/ui/shell";

const PACK_MAX_BYTES = 80 * 1024 * 1024;

export async function loader({ params }: Route.LoaderArgs) {
  const approval = await publicApproval(params.code);
  if (!approval) throw data({ message: "No approval has this verification code. Check the code printed beside the QR code." }, { status: 404 });
  return { approval };
}

export async function action({ request, params }: Route.ActionArgs) {
  const approval = await publicApproval(params.code);
  if (!approval) throw data({ message: "No approval has this verification code." }, { status: 404 });
  const { file, problem } = await readFormWithFile(request, {
    maxBytes: PACK_MAX_BYTES,
    sniff: (b) => (b.subarray(0, 5).toString("latin1") === "%PDF-" ? "application/pdf" : null),
    wrongType: "That file is not a PDF.",
  });
  if (problem) return data({ verdict: "error" as const, detail: problem }, { status: 422 });
  if (!file) return data({ verdict: "error" as const, detail: "Choose the PDF you want to check." }, { status: 400 });
  return checkCopy(approval, file.bytes);
}

export default function Verify({ loaderData, actionData }: Route.ComponentProps) {
  const { approval } = loaderData;
  const navigation = useNavigation();
  const good = actionData?.verdict === "original";
  return (
    <div className="mx-auto max-w-2xl space-y-6">
      <div>
        <p className="text-sm font-semibold uppercase tracking-wider text-copper">Approval verification</p>
        <h1 className="mt-1 text-3xl font-bold">{approval.reference} · approval v{approval.version}</h1>
        <div className="mt-2 flex flex-wrap items-center gap-3"><ApprovalState state={approval.state} /><span className="text-sm">{DECISION_LABELS[approval.outcome as DecisionOutcome]}</span></div>
        {approval.newerVersion ? <p role="alert" className="mt-3 font-semibold text-warn">⚠ A newer version (v{approval.newerVersion}) exists. Ask for the current pack.</p> : null}
        {approval.state === "needs_reapproval" ? <p role="alert" className="mt-3 font-semibold text-warn">⚠ A drawing this approval rests on has been superseded: it needs re-approval before work relies on it.</p> : null}
      </div>
      <Panel>
        <dl className="grid gap-x-6 gap-y-2 text-sm sm:grid-cols-[11rem_1fr]">
          <dt className="font-semibold text-ink-soft">Engineer</dt><dd>{approval.engineer.name}</dd>
          <dt className="font-semibold text-ink-soft">Registration</dt><dd>{approval.engineer.registrationNumber} · {approval.engineer.registrationBody}</dd>
          <dt className="font-semibold text-ink-soft">Signed</dt><dd>{approval.signedAt.replace("T", " ").slice(0, 16)} UTC</dd>
          <dt className="font-semibold text-ink-soft">Pack SHA-256</dt><dd className="break-all font-mono text-xs">{approval.packSha256}</dd>
        </dl>
        <h2 className="mt-5 font-bold">Drawings it rests on</h2>
        <ul className="mt-2 space-y-2 text-sm">
          {approval.drawings.map((d) => <li key={d.sha256}><span className="font-semibold">{d.sheetNumber} rev {d.revisionLabel}</span> — {d.title}<br /><span className="break-all font-mono text-xs text-ink-soft">{d.sha256}</span></li>)}
        </ul>
      </Panel>
      <Panel>
        <h2 className="font-bold">Check a copy you hold</h2>
        <p className="mt-1 text-sm text-ink-soft">Choose the PDF: it is checked here against the signed original (its fingerprint and its digital signature).</p>
        <Form method="post" encType="multipart/form-data" className="mt-3 flex flex-wrap items-center gap-3">
          <label htmlFor="pack" className="sr-only">PDF to check</label>
          <input id="pack" name="pack" type="file" accept="application/pdf" required className="text-sm" />
          <Button type="submit" disabled={navigation.state === "submitting"}>Check this file</Button>
        </Form>
        {actionData ? (
          <p role="status" data-verdict={actionData.verdict} className={`mt-4 flex gap-2 rounded-md border p-3 text-sm font-medium ${good ? "border-ok/40 bg-ok/5 text-ok" : "border-fail/40 bg-fail/5 text-fail"}`}>
            {good ? <CheckIcon className="mt-0.5 shrink-0" /> : <AlertIcon className="mt-0.5 shrink-0" />} {actionData.detail}
          </p>
        ) : null}
      </Panel>
      <p className="text-xs text-ink-soft">An approval records an engineer's rational design; it supports, and does not replace, the applicable standards, local regulations and the inspector's judgement.</p>
    </div>
  );
}

export const meta: Route.MetaFunction = ({ data }) => [{ title: `${data?.approval.reference ?? "Approval"} verification · Countersign` }, { name: "robots", content: "noindex" }];
