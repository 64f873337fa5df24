// A saved calculation, reopened: who ran it and when, its sheet, and the editor with its inputs. Changes are
// saved as a new calculation, so what an approval rests on never moves under it.
import { Link } from "react-router";
import type { Route } from "./+types/projects.$projectId.calculations.$calculationId";
import { saveFromForm } from "~/calculations/actions.server";
import { getCalculation } from "~/calculations/calculations.server";
import { Calculator } from "~/calculations/calculator";
import { formatDateTime } from "~/calculations/format";
import { forPage } from "~/calculations/http.server";
import { KIND_DEFINITIONS } from "~/calculations/kinds";
import { PageBack } from "~/calculations/page-back";
import { VerdictBadge } from "~/calculations/ui";
import { ENGINE_VERSION } from "~/engineering";
import { can } from "~/projects/permissions";
import { requireProjectAction } from "~/projects/projects.server";

export async function loader({ context, request, params }: Route.LoaderArgs) {
  const { project, role } = requireProjectAction(context, request, "calculations.run");
  const calculation = await forPage(() => getCalculation(project.id, params.calculationId));
  const justSaved = new URL(request.url).searchParams.has("saved");
  return { projectId: project.id, calculation, canSave: can(role, "calculations.save"), justSaved };
}

export async function action({ context, request, params }: Route.ActionArgs) {
  const { project } = requireProjectAction(context, request, "calculations.save");
  const calculation = await forPage(() => getCalculation(project.id, params.calculationId));
  return saveFromForm(context, request, calculation.kind);
}

export default function SavedCalculation({ loaderData, actionData }: Route.ComponentProps) {
  const { projectId, calculation: c, canSave, justSaved } = loaderData;
  const def = KIND_DEFINITIONS[c.kind];
  return (
    <div className="space-y-4">
      <PageBack projectId={projectId} />
      {justSaved ? <p role="status" className="rounded-md border border-ok/40 bg-ok/5 px-4 py-3 text-sm text-ok">✓ Saved. The server recomputed the results from the inputs.</p> : null}
      <div className="flex flex-wrap items-start justify-between gap-4">
        <div>
          <p className="text-sm text-ink-soft">{def.label}</p>
          <h2 className="flex flex-wrap items-center gap-3 text-2xl font-bold">
            {c.title}
            {def.hasVerdict ? <VerdictBadge ok={c.ok} passLabel="Passed" failLabel="Failed" /> : null}
          </h2>
          <p className="mt-1 text-sm text-ink-soft">
            Saved by {c.createdBy.name}, {formatDateTime(c.createdAt)} · engine {c.engineVersion}
            {c.engineVersion !== ENGINE_VERSION ? ` (the engine is now ${ENGINE_VERSION}: results below are recomputed with it)` : ""}
          </p>
        </div>
        <div className="flex gap-3 text-sm font-semibold">
          <a href={`/projects/${projectId}/calculations/${c.id}/sheet.pdf`} download className="rounded-md border border-rule bg-sheet px-4 py-2.5 hover:border-copper">Download sheet (PDF)</a>
          <Link to={`/projects/${projectId}/calculations`} className="rounded-md border border-rule bg-sheet px-4 py-2.5 hover:border-copper">Compare…</Link>
        </div>
      </div>
      <Calculator
        key={c.id}
        kind={c.kind}
        initialInput={c.inputs}
        canSave={canSave}
        defaultTitle={`${c.title} (revised)`}
        saveLabel="Save as a new calculation"
        lastResult={actionData?.result}
        serverIssues={actionData?.issues}
      />
    </div>
  );
}

export const meta: Route.MetaFunction = ({ data }) => [{ title: `${data?.calculation.title ?? "Calculation"} · Countersign` }];
