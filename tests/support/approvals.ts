// A decided request ready for signing, made the way people make one: a sheet uploaded to the register, a request
// raised and submitted by the plumber, reviewed and decided (with conditions) by the engineer, through the API.
import { DeviationRequest } from "../../db/models";
import { makeSheet, upload } from "./drawings";
import type { Client } from "./http";
import { api, CONTENT, principles } from "./requests";

let n = 0;

export async function decidedRequest(projectId: string, as: { architect: Client; site_plumber: Client; engineer: Client }, title = CONTENT.title) {
  const sheet = `AP-${Date.now().toString(36)}-${n++}`;
  const up = await upload(as.architect, projectId, await makeSheet({ tag: sheet }), { sheetNumber: sheet, title: "Roof plumbing" });
  if (up.status !== 201) throw new Error(`upload failed: ${JSON.stringify(up.body)}`);
  const revisionId = up.body.stored[0].revisionId as string;
  const created = await api(as.site_plumber, "POST", `/api/projects/${projectId}/requests`, { ...CONTENT, title });
  if (created.status !== 201) throw new Error(`create failed: ${JSON.stringify(created.body)}`);
  const id = created.body.request.id as string;
  const move = async (who: Client, action: string, extra: Record<string, unknown> = {}) => {
    const current = (await DeviationRequest.findByPk(id))!;
    const res = await api(who, "POST", `/api/projects/${projectId}/requests/${id}/transitions`, { action, lockVersion: current.lockVersion, ...extra });
    if (res.status !== 200) throw new Error(`${action} failed: ${JSON.stringify(res.body)}`);
  };
  await move(as.site_plumber, "submit");
  await move(as.engineer, "start_review");
  const judged = principles();
  judged[2] = { principleId: "safe_discharge", outcome: "maintained", reasoning: "28 mm from the valve outlet keeps the run within its limit." };
  await move(as.engineer, "decide", { outcome: "approved_with_conditions", principles: judged, conditions: ["Insulate the exposed run.", "Label the termination point."], restsOn: [revisionId] });
  return { id, revisionId, sheet };
}
