import { parseWithZod } from "@conform-to/zod/v4";
import { data } from "react-router";
import type { Route } from "./+types/projects.$projectId.settings";
import { ProjectForm } from "~/projects/project-form";
import { requireProjectAction, updateProject } from "~/projects/projects.server";
import { projectSchema } from "~/projects/schemas";
import { Panel } from "~/ui/shell";

export async function loader({ context, request }: Route.LoaderArgs) {
  const { project } = requireProjectAction(context, request, "project.edit");
  return { project };
}

export async function action({ context, request }: Route.ActionArgs) {
  const { user, project } = requireProjectAction(context, request, "project.edit");
  const submission = parseWithZod(await request.formData(), { schema: projectSchema });
  if (submission.status !== "success") return data({ result: submission.reply(), saved: false }, { status: 400 });
  await updateProject(user.id, project.id, submission.value);
  return { result: submission.reply(), saved: true };
}

export default function ProjectSettings({ loaderData, actionData }: Route.ComponentProps) {
  const { project } = loaderData;
  return (
    <div className="max-w-2xl">
      {actionData?.saved ? <p role="status" className="mb-4 rounded-md border border-ok/40 bg-ok/5 px-4 py-3 text-sm text-ok">✓ Project details saved.</p> : null}
      <Panel>
        <ProjectForm
          lastResult={actionData?.result}
          submitLabel="Save details"
          defaultValue={{ name: project.name, siteAddress: project.siteAddress, clientName: project.clientName ?? "", description: project.description ?? "" }}
        />
      </Panel>
    </div>
  );
}
