// What the review sheet page shows: the request, the project's sheet revisions to choose from (by default the
// first the decision rests on, else the latest accepted), the chosen revision's markups and the request's pins.
import { Decision } from "../../db/models";
import { listRegister } from "../drawings/register.server";
import { can } from "../projects/permissions";
import { listPins } from "../requests/pins.server";
import { getRequest, type Actor } from "../requests/requests.server";
import { listMarkups } from "./markups.server";

export interface SheetChoice {
  id: string;
  drawingId: string;
  label: string;
  status: string;
  scaleText: string | null;
  pages: { widthPt: number; heightPt: number }[];
  fileUrl: string;
}

export async function getReviewSheet(projectId: string, requestId: string, viewer: { id: string; role: Actor["role"] }, wanted: string | null) {
  const request = await getRequest(projectId, requestId, viewer);
  const [register, decision, pins] = await Promise.all([
    listRegister(projectId),
    Decision.findOne({ where: { requestId }, order: [["createdAt", "DESC"]], attributes: ["restsOn"] }),
    listPins(projectId, requestId, viewer),
  ]);
  const choices: (SheetChoice & { uploadedAt: string })[] = register.flatMap((d) =>
    d.revisions
      .filter((r) => r.status !== "withdrawn" && r.pages.length)
      .map((r) => ({
        id: r.id,
        drawingId: d.id,
        label: `${d.sheetNumber} revision ${r.label} — ${d.title}`,
        status: r.status,
        scaleText: d.scaleText,
        pages: r.pages,
        fileUrl: `/projects/${projectId}/drawings/${d.id}/revisions/${r.id}/file`,
        uploadedAt: r.uploadedAt,
      })),
  );
  const restsOn = decision?.restsOn ?? [];
  const latestAccepted = [...choices].filter((c) => c.status === "accepted").sort((a, b) => b.uploadedAt.localeCompare(a.uploadedAt))[0];
  const pinned = choices.find((c) => pins.some((p) => p.revisionId === c.id));
  const selected =
    choices.find((c) => c.id === wanted) ?? choices.find((c) => restsOn.includes(c.id)) ?? latestAccepted ?? pinned ?? choices[0] ?? null;
  const markups = selected ? await listMarkups(projectId, requestId, viewer, { revisionId: selected.id }) : [];
  return {
    request: { id: request.id, code: request.code, title: request.title, state: request.state, projectId },
    choices: choices.map(({ uploadedAt: _, ...c }) => c),
    selected,
    markups,
    pins: pins.filter((p) => p.revisionId === selected?.id),
    canMarkUp: can(viewer.role, "requests.review") && !["draft", "withdrawn", "superseded"].includes(request.state),
    canPin: request.canEdit,
  };
}
