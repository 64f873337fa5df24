// Numbered pins placing a request on a sheet: the plumber who raised it places and removes them while the
// request is editable; every member who can see the request sees them. Numbers are kept once given, so
// "pin 2" in the text keeps meaning the same pin after another is removed.
import { z } from "zod";
import { RequestPin, sequelize } from "../../db/models";
import { audit } from "../platform/audit.server";
import { revisionPage } from "../review/markups.server";
import { RequestError, UUID } from "./errors";
import { EDITABLE_STATES, getRequest, lockRequest, parseInput, type Actor } from "./requests.server";

export interface PinView {
  id: string;
  n: number;
  revisionId: string;
  page: number;
  xPt: number;
  yPt: number;
}

const pinSchema = z.object({
  revisionId: z.string().regex(UUID, "Choose a drawing revision."),
  page: z.coerce.number().int().min(1, "Pages start at 1."),
  xPt: z.coerce.number().finite("Give the pin's position in points."),
  yPt: z.coerce.number().finite("Give the pin's position in points."),
});

const toView = (p: RequestPin): PinView => ({ id: p.id, n: p.n, revisionId: p.revisionId, page: p.page, xPt: p.xPt, yPt: p.yPt });

export async function listPins(projectId: string, requestId: string, viewer: { id: string; role: Actor["role"] }) {
  await getRequest(projectId, requestId, viewer);
  return pinsOf(requestId);
}

/** The request's pins, for a caller that has already checked the viewer may see the request. */
export async function pinsOf(requestId: string) {
  return (await RequestPin.findAll({ where: { requestId }, order: [["n", "ASC"]] })).map(toView);
}

async function lockEditable(actor: Actor, projectId: string, requestId: string, transaction: Parameters<typeof lockRequest>[2]) {
  const request = await lockRequest(projectId, requestId, transaction);
  if (request.createdById !== actor.id) throw new RequestError("Only the plumber who raised this request can place or remove its pins.", 403);
  if (!EDITABLE_STATES.includes(request.state)) throw new RequestError("This request is with the engineer, so its pins cannot change now. Add a comment instead.", 409, "not_editable");
  return request;
}

export async function addPin(actor: Actor, projectId: string, requestId: string, input: unknown) {
  const v = parseInput(pinSchema, input, "The pin needs attention.");
  return sequelize.transaction(async (transaction) => {
    await lockEditable(actor, projectId, requestId, transaction);
    const size = await revisionPage(projectId, v.revisionId, v.page, transaction);
    if (v.xPt < 0 || v.yPt < 0 || v.xPt > size.widthPt || v.yPt > size.heightPt) {
      throw new RequestError("The pin lies off the page.", 422, "invalid", [{ path: "xPt", message: `Place the pin within the ${size.widthPt.toFixed(0)} × ${size.heightPt.toFixed(0)} pt page.` }]);
    }
    const last = (await RequestPin.max("n", { where: { requestId }, transaction })) as number | null;
    const pin = await RequestPin.create({ requestId, revisionId: v.revisionId, page: v.page, xPt: v.xPt, yPt: v.yPt, n: (last ?? 0) + 1, createdById: actor.id }, { transaction });
    await audit({ action: "request.pin_placed", actorId: actor.id, projectId, subjectType: "deviation_request", subjectId: requestId, data: { n: pin.n, revisionId: v.revisionId, page: v.page } }, transaction);
    return toView(pin);
  });
}

export async function removePin(actor: Actor, projectId: string, requestId: string, pinId: string) {
  return sequelize.transaction(async (transaction) => {
    await lockEditable(actor, projectId, requestId, transaction);
    const pin = UUID.test(pinId) ? await RequestPin.findOne({ where: { id: pinId, requestId }, transaction }) : null;
    if (!pin) throw new RequestError("No such pin on this request.", 404);
    await pin.destroy({ transaction });
    await audit({ action: "request.pin_removed", actorId: actor.id, projectId, subjectType: "deviation_request", subjectId: requestId, data: { n: pin.n } }, transaction);
    return { id: pin.id };
  });
}
