import type { Route } from "./+types/projects.$projectId._index";
import { listMembers } from "~/projects/members.server";
import { ROLE_LABELS, ROLES } from "~/projects/permissions";
import { requireProjectAction } from "~/projects/projects.server";
import { Panel } from "~/ui/shell";

export async function loader({ context, request }: Route.LoaderArgs) {
  const { project } = requireProjectAction(context, request, "project.view");
  const members = await listMembers(project.id);
  const counts = ROLES.map((role) => ({ role, count: members.filter((m) => m.role === role).length }));
  return { project, counts };
}

export default function ProjectOverview({ loaderData }: Route.ComponentProps) {
  const { project, counts } = loaderData;
  return (
    <div className="grid gap-6 lg:grid-cols-3">
      <Panel className="lg:col-span-2">
        <h2 className="text-lg font-bold">About this project</h2>
        <dl className="mt-4 grid gap-x-6 gap-y-3 text-sm sm:grid-cols-[10rem_1fr]">
          <dt className="font-semibold text-ink-soft">Site address</dt><dd>{project.siteAddress}</dd>
          <dt className="font-semibold text-ink-soft">Client / owner</dt><dd>{project.clientName ?? "—"}</dd>
          <dt className="font-semibold text-ink-soft">Description</dt><dd className="whitespace-pre-line">{project.description ?? "—"}</dd>
        </dl>
      </Panel>
      <Panel>
        <h2 className="text-lg font-bold">Team</h2>
        <ul className="mt-4 space-y-2 text-sm">
          {counts.map((c) => (
            <li key={c.role} className="flex justify-between border-b border-rule/60 pb-2 last:border-0">
              <span>{ROLE_LABELS[c.role]}</span><span className="font-semibold tabular-nums">{c.count}</span>
            </li>
          ))}
        </ul>
      </Panel>
    </div>
  );
}
