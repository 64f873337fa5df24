// The engineer's decision: worked on as a draft against the version under review, then recorded once, with an
// assessment per principle, numbered conditions or reasons, and the drawing revisions it rests on. Recording is
// the request's "decide" move, so the rules, the lock check, the audit event and the e-mail share one transaction.
import { Op, type Transaction } from "sequelize";
import { AssessmentRow, Attachment, Decision, DeviationRequest, DrawingRevision, RequestVersion, sequelize, User, type EvidenceLink } from "../../db/models";
import { currentRevision, listRevisionBriefs, type RevisionBrief } from "../drawings/register.server";
import { RequestError, UUID } from "../requests/errors";
import { checkLock, getRequest, lockRequest, zodIssues, type Actor, type RequestView } from "../requests/requests.server";
import { moveRequest } from "../requests/transitions.server";
import { MOVES, STATE_LABELS } from "../requests/workflow";
import { DECISION_LABELS, decisionProblems, PRINCIPLES, type DecisionOutcome, type PrincipleOutcome } from "./principles";
import { decisionFormSchema, toDraft, type DecisionForm } from "./schemas";

export interface AssessmentView {
  principleId: string;
  outcome: PrincipleOutcome | null;
  reasoning: string;
  evidence: EvidenceLink[];
}

export interface DecisionView {
  id: string;
  versionN: number;
  outcome: DecisionOutcome | null;
  conditions: { n: number; text: string }[];
  reasons: string;
  restsOn: string[];
  decidedBy: string;
  recordedAt: string | null;
  assessments: AssessmentView[];
}

function toView(d: Decision, versionN: number): DecisionView {
  const x = d as Decision & { assessments?: AssessmentRow[]; decidedBy?: User };
  return {
    id: d.id,
    versionN,
    outcome: d.outcome ?? null,
    conditions: d.conditions,
    reasons: d.reasons,
    restsOn: d.restsOn,
    decidedBy: x.decidedBy?.name ?? "—",
    recordedAt: d.recordedAt?.toISOString() ?? null,
    assessments: (x.assessments ?? [])
      .map((a) => ({ principleId: a.principle, outcome: a.outcome, reasoning: a.reasoning, evidence: a.evidence }))
      .sort((a, b) => PRINCIPLES.findIndex((p) => p.id === a.principleId) - PRINCIPLES.findIndex((p) => p.id === b.principleId)),
  };
}

export interface RevisionChoice {
  id: string;
  label: string;
}

/** Drawing revisions a decision may rest on: each sheet's current revision, unless withdrawn or superseded. */
export async function currentRevisions(projectId: string): Promise<RevisionChoice[]> {
  const bySheet = new Map<string, RevisionBrief[]>();
  for (const r of await listRevisionBriefs(projectId)) {
    if (!bySheet.has(r.drawingId)) bySheet.set(r.drawingId, []);
    bySheet.get(r.drawingId)!.push(r);
  }
  return [...bySheet.values()]
    .map((revisions) => currentRevision(revisions)!)
    .filter((c) => c.status !== "withdrawn" && c.status !== "superseded")
    .map((c) => ({ id: c.id, label: `${c.sheetNumber} revision ${c.label} — ${c.title}` }));
}

/** Every decision on the request: the recorded ones, and the draft on the version under review. */
export async function listDecisions(requestId: string) {
  const rows = await Decision.findAll({
    where: { requestId },
    include: [
      { model: AssessmentRow, as: "assessments" },
      { model: User, as: "decidedBy", attributes: ["name"] },
    ],
    order: [["createdAt", "ASC"]],
  });
  const versions = await RequestVersion.findAll({ where: { requestId }, attributes: ["id", "n"] });
  const n = new Map(versions.map((v) => [v.id, v.n]));
  return rows.map((d) => toView(d, n.get(d.requestVersionId) ?? 0));
}

export interface ReviewDesk {
  request: RequestView;
  draft: DecisionView | null;
  recorded: DecisionView[];
  revisions: RevisionChoice[];
}

export async function getReviewDesk(projectId: string, requestId: string, viewer: { id: string; role: Actor["role"] }): Promise<ReviewDesk> {
  const request = await getRequest(projectId, requestId, viewer);
  const [decisions, revisions] = await Promise.all([listDecisions(requestId), currentRevisions(projectId)]);
  const draft = request.sent ? (decisions.find((d) => !d.recordedAt && d.versionN === request.sent!.n) ?? null) : null;
  return { request, draft, recorded: decisions.filter((d) => d.recordedAt), revisions };
}

export function parseDecision(input: unknown): DecisionForm {
  const parsed = decisionFormSchema.safeParse(input);
  if (!parsed.success) throw new RequestError("The decision form needs attention.", 422, "invalid", zodIssues(parsed.error));
  return parsed.data;
}

async function checkLinks(projectId: string, requestId: string, form: DecisionForm, transaction: Transaction) {
  const evidence = [...new Set(form.principles.flatMap((p) => p.evidence))];
  if (evidence.length) {
    const found = await Attachment.count({ where: { id: { [Op.in]: evidence }, requestId, projectId }, transaction });
    if (found !== evidence.length) throw new RequestError("Evidence can only link to files attached to this request.", 422, "invalid", [{ path: "principles", message: "Choose evidence from this request's files." }]);
  }
  const restsOn = [...new Set(form.restsOn)];
  if (restsOn.length) {
    const found = await DrawingRevision.count({ where: { id: { [Op.in]: restsOn }, projectId, status: { [Op.notIn]: ["withdrawn", "superseded"] } }, transaction });
    if (found !== restsOn.length) {
      throw new RequestError("A decision can only rest on this project's current drawing revisions.", 422, "invalid", [{ path: "restsOn", message: "Choose from the current revisions listed." }]);
    }
  }
  return restsOn;
}

/** Writes the decision row (created on first save) and its assessments for the version under review. */
async function writeDecision(actor: Actor, requestId: string, form: DecisionForm, restsOn: string[], record: boolean, transaction: Transaction) {
  const version = await RequestVersion.findOne({ where: { requestId, submittedAt: { [Op.ne]: null } }, order: [["n", "DESC"]], transaction });
  if (!version) throw new RequestError("This request has not been submitted, so there is nothing to decide.", 409);
  const draft = toDraft(form);
  const fields = {
    outcome: record ? (form.outcome ?? null) : null,
    conditions: draft.conditions.map((text, i) => ({ n: i + 1, text })),
    reasons: form.reasons,
    restsOn,
    decidedById: actor.id,
    recordedAt: record ? new Date() : null,
  };
  let decision = await Decision.findOne({ where: { requestVersionId: version.id }, transaction, lock: transaction.LOCK.UPDATE });
  if (decision?.recordedAt) throw new RequestError("A decision on this version is already recorded.", 409);
  if (decision) await decision.update(fields, { transaction });
  else decision = await Decision.create({ requestId, requestVersionId: version.id, ...fields }, { transaction });
  await AssessmentRow.destroy({ where: { decisionId: decision.id }, transaction });
  await AssessmentRow.bulkCreate(
    draft.assessments.map((a) => ({ decisionId: decision.id, principle: a.principleId, outcome: a.outcome, reasoning: a.reasoning, evidence: a.evidence })),
    { transaction },
  );
  return { decisionId: decision.id, versionN: version.n };
}

function assertReviewer(actor: Actor) {
  if (actor.role !== "engineer") throw new RequestError("Only an engineer on this project can work on the decision.", 403);
}

/** Saves the engineer's work in progress; no rules apply until it is recorded. */
export async function saveDecisionDraft(actor: Actor, projectId: string, requestId: string, input: unknown) {
  assertReviewer(actor);
  const form = parseDecision(input);
  return sequelize.transaction(async (transaction) => {
    const request = await lockRequest(projectId, requestId, transaction);
    checkLock(request, form.lockVersion);
    if (request.state !== "in_review") throw new RequestError("Start the review before working on a decision.", 409, "wrong_state");
    if (request.assigneeId && request.assigneeId !== actor.id) throw new RequestError("This request is assigned to another engineer.", 403, "not_assignee");
    const restsOn = await checkLinks(projectId, requestId, form, transaction);
    return writeDecision(actor, requestId, form, restsOn, false, transaction);
  });
}

/** Records the decision, if the rules allow it, and moves the request to decided. */
export async function recordDecision(actor: Actor, projectId: string, requestId: string, input: unknown) {
  assertReviewer(actor);
  const form = parseDecision(input);
  if (!UUID.test(requestId)) throw new RequestError("No such request in this project.", 404);
  // The state first: rules about the content mean nothing for a request that cannot be decided now.
  const current = await DeviationRequest.findOne({ where: { id: requestId, projectId }, attributes: ["state"] });
  if (current && !MOVES.decide.from.includes(current.state)) {
    throw new RequestError(`This request is ${STATE_LABELS[current.state].toLowerCase()}, so a decision cannot be recorded now.`, 409, "wrong_state");
  }
  if (!form.outcome) throw new RequestError("Choose the decision.", 422, "invalid", [{ path: "outcome", message: "Choose the decision." }]);
  const problems = decisionProblems(toDraft(form));
  if (problems.length) throw new RequestError(`The decision cannot be recorded yet: ${problems[0]!.message}`, 422, "decision_rules", problems);
  let written: { decisionId: string; versionN: number } | undefined;
  const moved = await moveRequest(actor, projectId, requestId, { action: "decide", lockVersion: form.lockVersion, note: DECISION_LABELS[form.outcome] }, async (_request, transaction) => {
    const restsOn = await checkLinks(projectId, requestId, form, transaction);
    written = await writeDecision(actor, requestId, form, restsOn, true, transaction);
    return { decisionId: written.decisionId, outcome: form.outcome, restsOn, conditions: toDraft(form).conditions.length };
  });
  return { ...moved, ...written!, outcome: form.outcome };
}
