import { parseWithZod } from "@conform-to/zod/v4";
import { data, redirect } from "react-router";
import type { Route } from "./+types/projects.new";
import { requireUser } from "~/accounts/auth.server";
import { ProjectForm } from "~/projects/project-form";
import { createProject } from "~/projects/projects.server";
import { projectSchema } from "~/projects/schemas";
import { PageTitle, Panel } from "~/ui/shell";

export async function loader({ context, request }: Route.LoaderArgs) {
  requireUser(context, request);
  return null;
}

export async function action({ context, request }: Route.ActionArgs) {
  const user = requireUser(context, request);
  const submission = parseWithZod(await request.formData(), { schema: projectSchema });
  if (submission.status !== "success") return data(submission.reply(), { status: 400 });
  const project = await createProject(user.id, submission.value);
  throw redirect(`/projects/${project.id}`);
}

export default function NewProject({ actionData }: Route.ComponentProps) {
  return (
    <div className="mx-auto max-w-2xl">
      <PageTitle title="New project" lead="You become its project manager, and can invite the team next." />
      <Panel><ProjectForm lastResult={actionData} submitLabel="Create project" /></Panel>
    </div>
  );
}

export const meta: Route.MetaFunction = () => [{ title: "New project · Countersign" }];
