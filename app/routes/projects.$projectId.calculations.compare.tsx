// Two saved calculations of one kind side by side: inputs and key figures, each row marked by word and icon.
import type { Route } from "./+types/projects.$projectId.calculations.compare";
import { compareSaved } from "~/calculations/calculations.server";
import { CompareTable } from "~/calculations/compare-table";
import { formatDateTime } from "~/calculations/format";
import { forPage } from "~/calculations/http.server";
import { PageBack } from "~/calculations/page-back";
import { Caution } from "~/calculations/ui";
import { CAUTION } from "~/engineering";
import { requireProjectAction } from "~/projects/projects.server";
import { Panel } from "~/ui/shell";

export async function loader({ context, request }: Route.LoaderArgs) {
  const { project } = requireProjectAction(context, request, "calculations.run");
  const url = new URL(request.url);
  const result = await forPage(() => compareSaved(project.id, url.searchParams.get("a") ?? undefined, url.searchParams.get("b") ?? undefined));
  const strip = ({ inputs: _i, outputs: _o, ...rest }: typeof result.a) => rest;
  return { projectId: project.id, a: strip(result.a), b: strip(result.b), comparison: result.comparison };
}

export default function ComparePage({ loaderData }: Route.ComponentProps) {
  const { projectId, a, b, comparison } = loaderData;
  const heads = [a, b].map((c) => ({ title: c.title, detail: `${c.createdBy.name}, ${formatDateTime(c.createdAt)}` }));
  return (
    <div className="space-y-4">
      <PageBack projectId={projectId} />
      <h2 className="text-2xl font-bold">Compare: {a.kindLabel}</h2>
      <Panel>
        <h3 className="mb-1 text-lg font-bold">Key figures</h3>
        <p className="mb-3 text-sm text-ink-soft">{comparison.changedFigures} of {comparison.figures.length} differ.</p>
        <CompareTable rows={comparison.figures} heads={heads} testId="compare-figures" />
      </Panel>
      <Panel>
        <h3 className="mb-1 text-lg font-bold">Inputs</h3>
        <p className="mb-3 text-sm text-ink-soft">{comparison.changedInputs} of {comparison.inputs.length} differ.</p>
        <CompareTable rows={comparison.inputs} heads={heads} testId="compare-inputs" />
      </Panel>
      <Caution text={CAUTION} />
    </div>
  );
}

export const meta: Route.MetaFunction = () => [{ title: "Compare calculations · Countersign" }];
