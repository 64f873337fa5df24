import type { Route } from "./+types/projects.$projectId.drawings._index";
import { listRegister, toRegisterRows } from "~/drawings/register.server";
import { RegisterTable } from "~/drawings/register-table";
import { UploadPanel } from "~/drawings/upload-panel";
import { usePollWhile } from "~/drawings/use-poll";
import { env } from "~/platform/env.server";
import { can } from "~/projects/permissions";
import { requireProjectAction } from "~/projects/projects.server";
import { Panel } from "~/ui/shell";

export async function loader({ context, request }: Route.LoaderArgs) {
  const { project, role } = requireProjectAction(context, request, "drawings.view");
  return {
    projectId: project.id,
    drawings: toRegisterRows(await listRegister(project.id)),
    canUpload: can(role, "drawings.upload"),
    isPlumber: role === "site_plumber",
    limits: { maxBytes: env.UPLOAD_MAX_BYTES, maxPages: env.UPLOAD_MAX_PAGES },
  };
}

export default function Register({ loaderData }: Route.ComponentProps) {
  const { drawings, projectId, canUpload, isPlumber, limits } = loaderData;
  usePollWhile(drawings.some((d) => d.revisions.some((r) => r.processing === "queued" || r.processing === "running")));
  return (
    <div className="space-y-6">
      <Panel>
        <div className="mb-4 flex flex-wrap items-center justify-between gap-3">
          <h2 className="text-lg font-bold">Register</h2>
          <a href={`/projects/${projectId}/drawings/csv`} className="text-sm font-semibold text-copper-deep underline underline-offset-4" download>
            Export CSV
          </a>
        </div>
        <RegisterTable drawings={drawings} projectId={projectId} />
      </Panel>
      {canUpload ? <UploadPanel projectId={projectId} isPlumber={isPlumber} maxBytes={limits.maxBytes} maxPages={limits.maxPages} /> : null}
    </div>
  );
}

export const meta: Route.MetaFunction = () => [{ title: "Register · Countersign" }];
