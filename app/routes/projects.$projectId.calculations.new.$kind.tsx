// A new calculation of one kind, started from a small worked example; engineers can save it.
import { prefillFromMeasurements } from "~/calculations/prefill";
import { requestMeasurements } from "~/requests/requests.server";
import type { Route } from "./+types/projects.$projectId.calculations.new.$kind";
import { saveFromForm } from "~/calculations/actions.server";
import { Calculator } from "~/calculations/calculator";
import { isKind, KIND_DEFINITIONS } from "~/calculations/kinds";
import { notFound } from "~/platform/http.server";
import { can } from "~/projects/permissions";
import { requireProjectAction } from "~/projects/projects.server";
import { PageBack } from "~/calculations/page-back";

function kindOf(value: string) {
  if (!isKind(value)) notFound("There is no such calculator.");
  return value;
}

export async function loader({ context, request, params }: Route.LoaderArgs) {
  const { project, role } = requireProjectAction(context, request, "calculations.run");
  const kind = kindOf(params.kind);
  const url = new URL(request.url);
  // A length measured on a sheet arrives as ?lengthM= (the segment calculator's run length).
  const lengthM = Number(url.searchParams.get("lengthM"));
  // ?from=<request> starts from the measurements the plumber recorded on that request.
  const measured = await requestMeasurements(project.id, url.searchParams.get("from"));
  return { projectId: project.id, kind, canSave: can(role, "calculations.save"), lengthM: kind === "segment" && lengthM > 0 && lengthM < 10_000 ? lengthM : null, measured };
}

export async function action({ context, request, params }: Route.ActionArgs) {
  return saveFromForm(context, request, kindOf(params.kind));
}

export default function NewCalculation({ loaderData, actionData }: Route.ComponentProps) {
  const { kind, projectId, canSave, lengthM, measured } = loaderData;
  const def = KIND_DEFINITIONS[kind];
  return (
    <div className="space-y-4">
      <PageBack projectId={projectId} />
      <div>
        <h2 className="text-2xl font-bold">{def.label}</h2>
        <p className="mt-1 text-ink-soft">{def.summary} {measured ? `Started from the measurements on ${measured.code}; check every input against the site.` : "Started from a worked example: change it to your installation."}</p>
      </div>
      <Calculator
        key={kind}
        kind={kind}
        initialInput={measured ? prefillFromMeasurements(kind, def.example(), measured.measurements) : lengthM !== null ? { ...(def.example() as object), lengthM } : def.example()}
        canSave={canSave}
        defaultTitle=""
        saveLabel="Save calculation"
        lastResult={actionData?.result}
        serverIssues={actionData?.issues}
      />
    </div>
  );
}

export const meta: Route.MetaFunction = ({ data }) => [{ title: `New ${data ? KIND_DEFINITIONS[data.kind].label.toLowerCase() : "calculation"} · Countersign` }];
