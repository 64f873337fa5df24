import { Form } from "react-router";
import type { Route } from "./+types/projects.$projectId.requests._index";
import { forAction } from "~/requests/http.server";
import { listRequests, readFilter } from "~/requests/lists.server";
import { isMuted, setMuted } from "~/requests/notifications.server";
import { RequestTable } from "~/requests/request-table";
import { can } from "~/projects/permissions";
import { requireProjectAction } from "~/projects/projects.server";
import { Button, ButtonLink } from "~/ui/button";
import { MailIcon, PlusIcon } from "~/ui/icons";

export async function loader({ context, request }: Route.LoaderArgs) {
  const { project, role, user } = requireProjectAction(context, request, "requests.view");
  const filter = readFilter(new URL(request.url));
  const [list, muted] = await Promise.all([listRequests(user, filter, project.id), isMuted(project.id, user.id)]);
  return { projectId: project.id, list, filter, muted, canRaise: can(role, "requests.raise"), me: user.id };
}

export async function action({ context, request }: Route.ActionArgs) {
  const { project, user } = requireProjectAction(context, request, "requests.view");
  const form = await request.formData();
  return forAction("mute", async () => {
    const muted = form.get("muted") === "1";
    await setMuted(project.id, user.id, muted);
    return { message: muted ? "You will get no e-mail about this project's requests." : "You will get e-mail about this project's requests again." };
  });
}

export default function ProjectRequests({ loaderData, actionData }: Route.ComponentProps) {
  const { list, filter, muted, canRaise, projectId, me } = loaderData;
  return (
    <div className="space-y-6">
      <div className="flex flex-wrap items-center justify-between gap-3">
        <h2 className="text-xl font-bold">Requests</h2>
        <div className="flex flex-wrap items-center gap-2">
          <Form method="post">
            <input type="hidden" name="muted" value={muted ? "0" : "1"} />
            <Button variant="quiet" type="submit"><MailIcon className="text-copper" /> {muted ? "Unmute e-mail" : "Mute e-mail for this project"}</Button>
          </Form>
          {canRaise ? <ButtonLink to={`/projects/${projectId}/requests/new`}><PlusIcon /> New request</ButtonLink> : null}
        </div>
      </div>
      {actionData?.message ? <p role="status" className="text-sm font-semibold text-ok">✓ {actionData.message}</p> : null}
      <RequestTable list={list} filter={filter} me={me} />
    </div>
  );
}

export const meta: Route.MetaFunction = () => [{ title: "Requests · Countersign" }];
