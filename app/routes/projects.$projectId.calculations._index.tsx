// The project's calculations: start a new one of any kind, the saved ones, and picking two to compare.
import { Form, Link } from "react-router";
import type { Route } from "./+types/projects.$projectId.calculations._index";
import { listCalculations } from "~/calculations/calculations.server";
import { formatDateTime } from "~/calculations/format";
import { forPage } from "~/calculations/http.server";
import { KIND_DEFINITIONS, KINDS } from "~/calculations/kinds";
import { VerdictBadge } from "~/calculations/ui";
import { can } from "~/projects/permissions";
import { requireProjectAction } from "~/projects/projects.server";
import { Button } from "~/ui/button";
import { Panel } from "~/ui/shell";

export async function loader({ context, request }: Route.LoaderArgs) {
  const { project, role } = requireProjectAction(context, request, "calculations.run");
  const calculations = await forPage(() => listCalculations(project.id));
  return { projectId: project.id, calculations, canSave: can(role, "calculations.save") };
}

const select = "mt-1 block w-full rounded-md border border-rule bg-sheet px-3 py-2 text-sm";

export default function CalculationsPage({ loaderData }: Route.ComponentProps) {
  const { projectId, calculations, canSave } = loaderData;
  const base = `/projects/${projectId}/calculations`;
  return (
    <div className="space-y-6">
      <Panel>
        <h2 className="text-lg font-bold">New calculation</h2>
        <p className="mt-1 text-sm text-ink-soft">{canSave ? "Results update as you type; save the ones a design rests on." : "Results update as you type. Engineers on the project save calculations."}</p>
        <ul className="mt-4 grid gap-3 sm:grid-cols-2 lg:grid-cols-3">
          {KINDS.map((k) => (
            <li key={k}>
              <Link to={`${base}/new/${k}`} className="block h-full rounded-md border border-rule p-4 hover:border-copper">
                <span className="font-semibold text-copper-deep">{KIND_DEFINITIONS[k].label}</span>
                <span className="mt-1 block text-sm text-ink-soft">{KIND_DEFINITIONS[k].summary}</span>
              </Link>
            </li>
          ))}
        </ul>
      </Panel>
      <Panel>
        <h2 className="text-lg font-bold">Saved calculations</h2>
        {calculations.length === 0 ? (
          <p className="mt-2 text-sm text-ink-soft">None saved yet.</p>
        ) : (
          <ul className="mt-3 divide-y divide-rule text-sm" data-testid="saved-calculations">
            {calculations.map((c) => (
              <li key={c.id} className="flex flex-wrap items-center gap-x-4 gap-y-1 py-2.5">
                <Link to={`${base}/${c.id}`} className="font-semibold text-copper-deep underline-offset-4 hover:underline">{c.title}</Link>
                <span className="text-ink-soft">{c.kindLabel}</span>
                {KIND_DEFINITIONS[c.kind].hasVerdict ? <VerdictBadge ok={c.ok} /> : null}
                <span className="text-ink-soft">{c.createdBy.name}, {formatDateTime(c.createdAt)}</span>
                <a href={`${base}/${c.id}/sheet.pdf`} className="ml-auto underline underline-offset-4">Sheet (PDF)</a>
              </li>
            ))}
          </ul>
        )}
      </Panel>
      {calculations.length > 1 ? (
        <Panel>
          <h2 className="text-lg font-bold">Compare two</h2>
          <Form method="get" action={`${base}/compare`} className="mt-3 grid gap-4 sm:grid-cols-[1fr_1fr_auto] sm:items-end">
            {(["a", "b"] as const).map((side, i) => (
              <label key={side} className="text-sm font-semibold">
                {side === "a" ? "First" : "Second"}
                <select name={side} className={select} defaultValue={calculations[i]?.id}>
                  {calculations.map((c) => <option key={c.id} value={c.id}>{c.title} ({c.kindLabel})</option>)}
                </select>
              </label>
            ))}
            <Button type="submit" variant="quiet">Compare</Button>
          </Form>
          <p className="mt-2 text-xs text-ink-soft">Only calculations of the same kind can be compared.</p>
        </Panel>
      ) : null}
    </div>
  );
}

export const meta: Route.MetaFunction = () => [{ title: "Calculations · Countersign" }];
