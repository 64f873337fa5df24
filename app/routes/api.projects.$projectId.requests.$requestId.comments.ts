// GET /api/projects/:projectId/requests/:requestId/comments — the conversation. POST JSON { body, attachmentIds }
// — a message; "@Full Name" or "@e-mail" of a member mentions them (and mails them).
import type { Route } from "./+types/api.projects.$projectId.requests.$requestId.comments";
import { addComment, listComments } from "~/requests/comments.server";
import { forApi, readBody } from "~/requests/http.server";
import { getRequest } from "~/requests/requests.server";
import { requireApiProjectAction } from "~/projects/projects.server";

export async function loader({ context, params }: Route.LoaderArgs) {
  const { project, role, user } = await requireApiProjectAction(context, params.projectId, "requests.view");
  return forApi(async () => {
    await getRequest(project.id, params.requestId, { id: user.id, role });
    return Response.json({ comments: await listComments(project.id, params.requestId) });
  });
}

export async function action({ context, params, request }: Route.ActionArgs) {
  const { project, role, user } = await requireApiProjectAction(context, params.projectId, "requests.view");
  return forApi(async () => {
    await getRequest(project.id, params.requestId, { id: user.id, role });
    const comment = await addComment({ ...user, role }, project.id, params.requestId, await readBody(request));
    return Response.json({ comment }, { status: 201 });
  });
}
