// What the review sheet page shows: the request, the project's sheet revisions to choose from (by default the
// first the decision rests on, else the latest accepted), the chosen revision's markups and the request's pins.
import { Decision } from "../../db/models";
import { listRevisionBriefs } from "../drawings/register.server";
import { can } from "../projects/permissions";
import { pinsOf } from "../requests/pins.server";
import { getRequest, type Actor } from "../requests/requests.server";
import { markupsOf } from "./markups.server";

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
  // The request first: it checks the viewer may see it, so what follows reads without checking again.
  const request = await getRequest(projectId, requestId, viewer);
  const [revisions, decision, pins] = await Promise.all([
    listRevisionBriefs(projectId),
    Decision.findOne({ where: { requestId }, order: [["createdAt", "DESC"]], attributes: ["restsOn"] }),
    pinsOf(requestId),
  ]);
  const choices: (SheetChoice & { uploadedAt: string })[] = revisions
    .filter((r) => r.status !== "withdrawn" && r.pages.length)
    .map((r) => ({
      id: r.id,
      drawingId: r.drawingId,
      label: `${r.sheetNumber} revision ${r.label} — ${r.title}`,
      status: r.status,
      scaleText: r.scaleText,
      pages: r.pages,
      fileUrl: `/projects/${projectId}/drawings/${r.drawingId}/revisions/${r.id}/file`,
      uploadedAt: r.uploadedAt,
    }));
  const restsOn = decision?.restsOn ?? [];
  const latestAccepted = [...choices].filter((c) => c.status === "accepted").sort((a, b) => b.uploadedAt.localeCompare(a.uploadedAt))[0];
  const pinned = choices.find((c) => pins.some((p) => p.revisionId === c.id));
  const found = choices.find((c) => c.id === wanted) ?? choices.find((c) => restsOn.includes(c.id)) ?? latestAccepted ?? pinned ?? choices[0] ?? null;
  const selected = found ? (({ uploadedAt: _, ...c }) => c)(found) : null;
  const markups = selected ? await markupsOf(projectId, requestId, { revisionId: selected.id }) : [];
  return {
    request: { id: request.id, code: request.code, title: request.title, state: request.state, projectId },
    // The picker needs only what it shows; the chosen revision carries its pages and file.
    choices: choices.map((c) => ({ id: c.id, label: c.label })),
    selected,
    markups,
    pins: pins.filter((p) => p.revisionId === selected?.id),
    canMarkUp: can(viewer.role, "requests.review") && !["draft", "withdrawn", "superseded"].includes(request.state),
    canPin: request.canEdit,
  };
}
