// Saved calculations: list, open, save and compare, always scoped to one project. Saving reruns the engine on
// the server from the inputs alone; whatever outputs a caller sends are never stored.
import { Calculation, sequelize, User } from "../../db/models";
import { ENGINE_VERSION } from "~/engineering";
import { audit } from "../platform/audit.server";
import { compare } from "./compare";
import type { InputIssue } from "./issues";
import { isKind, KIND_DEFINITIONS, runCalculation, type CalculationKind } from "./kinds";

export class CalculationError extends Error {
  constructor(
    readonly status: 400 | 404 | 422,
    message: string,
    readonly issues: InputIssue[] = [],
  ) {
    super(message);
  }
}

export const TITLE_MAX = 200;

export interface CalculationView {
  id: string;
  kind: CalculationKind;
  kindLabel: string;
  title: string;
  inputs: any;
  outputs: any;
  ok: boolean;
  engineVersion: string;
  createdAt: string;
  createdBy: { id: string; name: string };
  requestId: string | null;
}

const UUID = /^[0-9a-f]{8}-[0-9a-f]{4}-[0-9a-f]{4}-[0-9a-f]{4}-[0-9a-f]{12}$/i;

function invalid(issues: InputIssue[]): CalculationError {
  const n = issues.length;
  return new CalculationError(422, `The input cannot be calculated: ${n} problem${n === 1 ? "" : "s"} to fix (${issues[0]?.message ?? "invalid input"}).`, issues);
}

/** Runs one kind on the server; throws a 404 for an unknown kind and a 422 with field paths for bad input. */
export function calculate(kind: string, raw: unknown) {
  if (!isKind(kind)) throw new CalculationError(404, `There is no calculator called "${kind}".`);
  const result = runCalculation(kind, raw);
  if (!result.ok) throw invalid(result.issues);
  return { kind, input: result.input, output: result.output, engineVersion: ENGINE_VERSION };
}

function view(row: Calculation): CalculationView {
  const creator = (row as unknown as { creator?: User }).creator;
  const kind = row.kind as CalculationKind;
  return {
    id: row.id,
    kind,
    kindLabel: KIND_DEFINITIONS[kind].label,
    title: row.title,
    inputs: row.inputs,
    outputs: row.outputs,
    ok: Boolean((row.outputs as { ok?: boolean }).ok),
    engineVersion: row.engineVersion,
    createdAt: row.createdAt.toISOString(),
    createdBy: { id: row.createdBy, name: creator?.name ?? "Unknown" },
    requestId: row.requestId,
  };
}

const withCreator = { model: User, as: "creator", attributes: ["id", "name"] };

export async function listCalculations(projectId: string, kind?: CalculationKind) {
  const rows = await Calculation.findAll({
    where: kind ? { projectId, kind } : { projectId },
    attributes: ["id", "projectId", "kind", "title", "outputs", "engineVersion", "createdBy", "requestId", "createdAt"],
    include: [withCreator],
    order: [["createdAt", "DESC"]],
  });
  // Lists carry the verdict, not the whole result.
  return rows.map((r) => {
    const { inputs: _i, outputs: _o, ...rest } = view(r);
    return rest;
  });
}

export async function getCalculation(projectId: string, id: string | undefined): Promise<CalculationView> {
  const row = id && UUID.test(id) ? await Calculation.findOne({ where: { id, projectId }, include: [withCreator] }) : null;
  if (!row) throw new CalculationError(404, "There is no such calculation in this project.");
  return view(row);
}

export interface SaveInput {
  kind: unknown;
  title: unknown;
  inputs: unknown;
}

export async function saveCalculation(projectId: string, userId: string, body: SaveInput): Promise<CalculationView> {
  const title = typeof body.title === "string" ? body.title.trim() : "";
  const titleIssues: InputIssue[] = [];
  if (!title) titleIssues.push({ path: ["title"], message: "Give the calculation a title" });
  else if (title.length > TITLE_MAX) titleIssues.push({ path: ["title"], message: `Keep the title under ${TITLE_MAX} characters` });
  if (!isKind(body.kind)) throw new CalculationError(422, "Choose a calculator kind.", [{ path: ["kind"], message: `Unknown kind "${String(body.kind)}"` }]);
  const result = runCalculation(body.kind, body.inputs);
  const issues = [...titleIssues, ...(result.ok ? [] : result.issues.map((i) => ({ path: ["inputs", ...i.path], message: i.message })))];
  if (issues.length || !result.ok) throw invalid(issues);
  const kind = body.kind;
  const row = await sequelize.transaction(async (transaction) => {
    const created = await Calculation.create(
      { projectId, kind, title, inputs: result.input, outputs: result.output, engineVersion: ENGINE_VERSION, createdBy: userId, requestId: null },
      { transaction },
    );
    await audit(
      { action: "calculation.saved", actorId: userId, projectId, subjectType: "calculation", subjectId: created.id, data: { kind, title, ok: result.output.ok, engineVersion: ENGINE_VERSION } },
      transaction,
    );
    return created;
  });
  return getCalculation(projectId, row.id);
}

export async function compareSaved(projectId: string, aId: string | undefined, bId: string | undefined) {
  const [a, b] = await Promise.all([getCalculation(projectId, aId), getCalculation(projectId, bId)]);
  if (a.kind !== b.kind) throw new CalculationError(400, `Only calculations of the same kind can be compared: "${a.title}" is ${a.kindLabel}, "${b.title}" is ${b.kindLabel}.`);
  return { a, b, comparison: compare(a, b) };
}
