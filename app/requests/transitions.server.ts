// Moving a request through its workflow. One transaction per move: the row is locked, its lock_version checked
// (stale → 409, nothing changed), the move checked against the workflow table and the caller's role, the
// move's own work done, the audit event written and the e-mail queued — all or nothing.
import type { Transaction } from "sequelize";
import { DeviationRequest, RequestVersion, sequelize } from "../../db/models";
import { audit } from "../platform/audit.server";
import { addWorkingDays, REVIEW_WORKING_DAYS } from "./due";
import { RequestError } from "./errors";
import { notify, type NoticeEvent } from "./notifications.server";
import { checkLock, latestVersion, lockRequest, pickEngineer, zodIssues, type Actor } from "./requests.server";
import { readySchema } from "./schemas";
import { ACTION_LABELS, checkMove, MOVES, STATE_LABELS, type RequestAction, type RequestState } from "./workflow";

export interface MoveInput {
  action: RequestAction;
  lockVersion: number;
  note?: string;
}

export interface MoveResult {
  from: RequestState;
  to: RequestState;
  lockVersion: number;
}

/** Work a move does inside its transaction (the decision writes itself here). */
export type MoveHook = (request: DeviationRequest, transaction: Transaction) => Promise<Record<string, unknown> | void>;

const NOTICE: Partial<Record<RequestAction, NoticeEvent>> = {
  submit: "submitted",
  request_info: "info_requested",
  resubmit: "resubmitted",
  decide: "decided",
  withdraw: "withdrawn",
};

/** Freezes the latest version for the engineer; a resubmission without edits still gets its own version. */
async function sendVersion(actor: Actor, request: DeviationRequest, transaction: Transaction) {
  const latest = (await latestVersion(request.id, transaction))!;
  const ready = readySchema.safeParse(latest.get({ plain: true }));
  if (!ready.success) {
    throw new RequestError("Before it goes to the engineer, the request needs a site constraint and a proposal.", 422, "not_ready", zodIssues(ready.error));
  }
  const now = new Date();
  if (latest.submittedAt) {
    const copy = latest.get({ plain: true });
    await RequestVersion.create(
      { requestId: request.id, n: latest.n + 1, title: copy.title, provision: copy.provision, clauseRef: copy.clauseRef, siteConstraint: copy.siteConstraint, proposal: copy.proposal, measurements: copy.measurements, createdById: actor.id, submittedAt: now },
      { transaction },
    );
    return latest.n + 1;
  }
  await latest.update({ submittedAt: now }, { transaction });
  return latest.n;
}

export async function moveRequest(actor: Actor, projectId: string, requestId: string, input: MoveInput, hook?: MoveHook): Promise<MoveResult> {
  const note = input.note?.trim() ?? "";
  return sequelize.transaction(async (transaction) => {
    const request = await lockRequest(projectId, requestId, transaction);
    checkLock(request, input.lockVersion);
    const from = request.state;
    if (!MOVES[input.action].from.includes(from)) {
      throw new RequestError(`This request is ${STATE_LABELS[from].toLowerCase()}, so “${ACTION_LABELS[input.action]}” is not possible now.`, 409, "wrong_state");
    }
    const check = checkMove(from, input.action, { role: actor.role, isRequester: request.createdById === actor.id });
    if (!check.ok) throw new RequestError(check.reason, 403, "wrong_role");
    const byEngineer = MOVES[input.action].by.includes("engineer") && actor.role === "engineer";
    if (byEngineer && request.assigneeId && request.assigneeId !== actor.id && input.action !== "supersede") {
      throw new RequestError("This request is assigned to another engineer. A project manager can reassign it.", 403, "not_assignee");
    }

    const data: Record<string, unknown> = { from, to: check.to, note, lockVersion: request.lockVersion + 1 };
    const changes: { submittedAt?: Date; dueAt?: Date; assigneeId?: string | null } = {};
    const now = new Date();
    let to = [request.assigneeId];
    switch (input.action) {
      case "submit":
      case "resubmit": {
        data.versionN = await sendVersion(actor, request, transaction);
        changes.submittedAt = now;
        changes.dueAt = addWorkingDays(now, REVIEW_WORKING_DAYS);
        if (!request.assigneeId) changes.assigneeId = await pickEngineer(projectId, transaction);
        to = [changes.assigneeId ?? request.assigneeId];
        break;
      }
      case "start_review":
        if (!request.assigneeId) changes.assigneeId = actor.id;
        break;
      case "request_info":
        if (!note) throw new RequestError("Say what information you need.", 422, "invalid", [{ path: "note", message: "Say what information you need." }]);
        to = [request.createdById];
        break;
      case "decide":
        if (!hook) throw new RequestError("Record the decision on the review desk, against each principle.", 422, "use_review_desk");
        to = [request.createdById];
        break;
      case "withdraw":
        to = [request.createdById, request.assigneeId];
        break;
      case "supersede":
        to = [];
        break;
    }
    if (hook) Object.assign(data, (await hook(request, transaction)) ?? {});
    await request.update({ ...changes, state: check.to, stateChangedAt: now, lockVersion: request.lockVersion + 1 }, { transaction });
    if (changes.assigneeId) data.assigneeId = changes.assigneeId;
    await audit({ action: `request.${input.action}`, actorId: actor.id, projectId, subjectType: "deviation_request", subjectId: request.id, data }, transaction);
    const event = NOTICE[input.action];
    if (event) await notify({ event, projectId, request, actor, to, note: note || undefined }, transaction);
    return { from, to: check.to, lockVersion: request.lockVersion };
  });
}
