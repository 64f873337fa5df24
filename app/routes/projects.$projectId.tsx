import { NavLink, Outlet } from "react-router";
import type { Route } from "./+types/projects.$projectId";
import { can, type Action } from "~/projects/permissions";
import { loadProjectAccess, requireProjectAction } from "~/projects/projects.server";
import { RoleBadge } from "~/ui/role-badge";

export const middleware: Route.MiddlewareFunction[] = [
  async ({ context, request, params }, next) => {
    await loadProjectAccess(context, request, params.projectId);
    return next();
  },
];

export async function loader({ context, request }: Route.LoaderArgs) {
  const { project, role } = requireProjectAction(context, request, "project.view");
  return { project, role };
}

const TABS: { to: string; label: string; action: Action; end?: boolean }[] = [
  { to: "", label: "Overview", action: "project.view", end: true },
  { to: "drawings", label: "Register", action: "drawings.view" },
  { to: "transmittals", label: "Transmittals", action: "drawings.view" },
  { to: "requests", label: "Requests", action: "requests.view" },
  { to: "calculations", label: "Calculations", action: "calculations.run" },
  { to: "site", label: "Site page", action: "approvals.view" },
  { to: "members", label: "Members", action: "members.view" },
  { to: "settings", label: "Settings", action: "project.edit" },
];

export default function ProjectLayout({ loaderData }: Route.ComponentProps) {
  const { project, role } = loaderData;
  return (
    <div>
      <div className="mb-6 border-b border-rule pb-4">
        <p className="text-sm text-ink-soft">{project.siteAddress}</p>
        <div className="mt-1 flex flex-wrap items-center gap-3">
          <h1 className="text-3xl font-bold tracking-tight">{project.name}</h1>
          <RoleBadge role={role} />
        </div>
        <nav aria-label="Project" className="-mb-4 mt-4 flex gap-1 overflow-x-auto text-sm font-semibold">
          {TABS.filter((t) => can(role, t.action)).map((t) => (
            <NavLink
              key={t.label}
              to={t.to}
              end={t.end}
              className={({ isActive }) =>
                `whitespace-nowrap border-b-2 px-3 py-2.5 ${isActive ? "border-copper text-copper-deep" : "border-transparent text-ink-soft hover:text-ink"}`
              }
            >
              {t.label}
            </NavLink>
          ))}
        </nav>
      </div>
      <Outlet />
    </div>
  );
}

export const meta: Route.MetaFunction = ({ data }) => [{ title: `${data?.project.name ?? "Project"} · Countersign` }];
