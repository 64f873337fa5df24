import { Link } from "react-router";
import type { Route } from "./+types/projects._index";
import { requireUser } from "~/accounts/auth.server";
import { listMyProjects } from "~/projects/projects.server";
import { ButtonLink } from "~/ui/button";
import { PlusIcon } from "~/ui/icons";
import { RoleBadge } from "~/ui/role-badge";
import { PageTitle } from "~/ui/shell";

export async function loader({ context, request }: Route.LoaderArgs) {
  const user = requireUser(context, request);
  return { projects: await listMyProjects(user.id) };
}

export default function MyProjects({ loaderData }: Route.ComponentProps) {
  const { projects } = loaderData;
  return (
    <div>
      <PageTitle
        title="My projects"
        lead="Every project you belong to, with your role on it."
        actions={<ButtonLink to="/projects/new"><PlusIcon /> New project</ButtonLink>}
      />
      {projects.length === 0 ? (
        <div className="rounded-lg border border-dashed border-rule bg-sheet p-10 text-center">
          <p className="text-lg font-semibold">No projects yet</p>
          <p className="mt-2 text-ink-soft">Start one, or ask a project manager to invite you to theirs.</p>
        </div>
      ) : (
        <ul className="grid gap-4 md:grid-cols-2">
          {projects.map((p) => (
            <li key={p.id}>
              <Link to={`/projects/${p.id}`} className="block h-full rounded-lg border border-rule bg-sheet p-5 shadow-sm transition hover:border-copper">
                <div className="flex flex-wrap items-start justify-between gap-2">
                  <h2 className="text-lg font-bold">{p.name}</h2>
                  <RoleBadge role={p.role} />
                </div>
                <p className="mt-1 text-sm text-ink-soft">{p.siteAddress}</p>
                {p.clientName ? <p className="mt-3 text-sm"><span className="text-ink-soft">Client:</span> {p.clientName}</p> : null}
              </Link>
            </li>
          ))}
        </ul>
      )}
    </div>
  );
}

export const meta: Route.MetaFunction = () => [{ title: "My projects · Countersign" }];
