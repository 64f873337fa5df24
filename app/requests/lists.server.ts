// Lists of requests: one project's, or across all of mine, filtered (state, provision, assignee, overdue), with
// counts per state and whatever needs my action first. Drafts are seen only by their author. The database counts,
// orders and pages (a project holds thousands of requests): one page of rows is read, never the whole list.
import { literal, Op, type WhereOptions } from "sequelize";
import { DeviationRequest, Project, ProjectMember, sequelize, User } from "../../db/models";
import type { Role } from "../projects/permissions";
import { isOverdue, requestCode, waitedFor } from "./due";
import { NEEDS_ACTION_RULES, needsMyAction } from "./needs-action";
import { PROVISION_IDS } from "./provisions";
import { OPEN_STATES, REQUEST_STATES, type RequestState } from "./workflow";
import { z } from "zod";

export const listFilterSchema = z.object({
  state: z.enum(REQUEST_STATES).optional().catch(undefined),
  provision: z.enum(PROVISION_IDS).optional().catch(undefined),
  assignee: z.union([z.literal("me"), z.literal("none"), z.uuid()]).optional().catch(undefined),
  overdue: z.literal("1").optional().catch(undefined),
  page: z.coerce.number().int().min(1).optional().catch(undefined),
  limit: z.coerce.number().int().min(1).max(200).optional().catch(undefined),
});
export type ListFilter = z.infer<typeof listFilterSchema>;

export function readFilter(url: URL): ListFilter {
  const raw = Object.fromEntries([...url.searchParams].filter(([, v]) => v !== ""));
  return listFilterSchema.parse(raw);
}

export interface RequestRow {
  id: string;
  projectId: string;
  projectName: string;
  code: string;
  number: number;
  title: string;
  provision: string;
  state: RequestState;
  assignee: string | null;
  assigneeId: string | null;
  createdBy: string;
  dueAt: string | null;
  overdue: boolean;
  waiting: string;
  needsMe: boolean;
}

export const PAGE_SIZE = 50;

export interface RequestList {
  /** One page of the requests that match, what needs my action first. */
  rows: RequestRow[];
  /** Per state, over every state (the state filter aside). */
  counts: Partial<Record<RequestState, number>>;
  /** Requests listed, any state; `matching` those that pass every filter. */
  total: number;
  matching: number;
  page: number;
  pageSize: number;
  engineers: { id: string; name: string }[];
}

/** The needs-my-action rules as one SQL condition on the list's rows, for the given roles per project. */
function needsMeSql(me: string, roles: Map<string, Role>) {
  const q = (v: string) => sequelize.escape(v);
  const list = (vs: readonly string[]) => vs.map(q).join(", ");
  const parts = NEEDS_ACTION_RULES.flatMap((rule) => {
    const inState = `"DeviationRequest"."state" IN (${list(rule.states)})`;
    if (rule.who === "requester") return [`(${inState} AND "DeviationRequest"."created_by_id" = ${q(me)})`];
    const projects = [...roles].filter(([, role]) => role === rule.who).map(([id]) => id);
    if (!projects.length) return [];
    const assignee =
      rule.assignee === "none" ? ` AND "DeviationRequest"."assignee_id" IS NULL`
      : rule.assignee === "me-or-none" ? ` AND ("DeviationRequest"."assignee_id" IS NULL OR "DeviationRequest"."assignee_id" = ${q(me)})`
      : "";
    return [`(${inState} AND "DeviationRequest"."project_id" IN (${list(projects)})${assignee})`];
  });
  return parts.length ? parts.join(" OR ") : "FALSE";
}

const LISTED_OPEN = OPEN_STATES.filter((s) => s !== "draft");

export async function listRequests(me: { id: string }, filter: ListFilter, projectId?: string): Promise<RequestList> {
  const pageSize = filter.limit ?? PAGE_SIZE;
  const page = filter.page ?? 1;
  const memberships = await ProjectMember.findAll({
    where: projectId ? { userId: me.id, projectId } : { userId: me.id },
    attributes: ["projectId", "role"],
    include: [{ model: Project, as: "project", attributes: ["id", "name"] }],
  });
  const roles = new Map(memberships.map((m) => [m.projectId, m.role as Role]));
  const names = new Map(memberships.map((m) => [m.projectId, (m as ProjectMember & { project: Project }).project.name]));
  if (!roles.size) return { rows: [], counts: {}, total: 0, matching: 0, page, pageSize, engineers: [] };

  const where: WhereOptions[] = [
    { projectId: { [Op.in]: [...roles.keys()] } },
    { [Op.or]: [{ state: { [Op.ne]: "draft" } }, { createdById: me.id }] },
  ];
  if (filter.provision) where.push({ provision: filter.provision });
  if (filter.assignee === "me") where.push({ assigneeId: me.id });
  else if (filter.assignee === "none") where.push({ assigneeId: null });
  else if (filter.assignee) where.push({ assigneeId: filter.assignee });
  if (filter.overdue) where.push({ dueAt: { [Op.lt]: new Date() }, state: { [Op.in]: LISTED_OPEN } });
  const rowsWhere = filter.state ? [...where, { state: filter.state }] : where;
  const overdueSql = `("DeviationRequest"."due_at" < now() AND "DeviationRequest"."state" IN (${LISTED_OPEN.map((s) => sequelize.escape(s)).join(", ")}))`;

  const [perState, found, engineers] = await Promise.all([
    DeviationRequest.findAll({ where: { [Op.and]: where }, attributes: ["state", [literal("count(*)"), "n"]], group: ["state"], raw: true }) as unknown as Promise<{ state: RequestState; n: string }[]>,
    DeviationRequest.findAll({
      where: { [Op.and]: rowsWhere },
      attributes: ["id", "projectId", "number", "title", "provision", "state", "assigneeId", "createdById", "dueAt", "stateChangedAt"],
      include: [
        { model: User, as: "assignee", attributes: ["name"] },
        { model: User, as: "createdBy", attributes: ["name"] },
      ],
      // What needs my action, then what is overdue, then the soonest due, then the newest.
      order: [
        [literal(`(${needsMeSql(me.id, roles)})`), "DESC"],
        [literal(overdueSql), "DESC"],
        ["dueAt", "ASC NULLS LAST"],
        ["number", "DESC"],
        ["id", "ASC"],
      ],
      limit: pageSize,
      offset: (page - 1) * pageSize,
    }),
    ProjectMember.findAll({
      where: { projectId: { [Op.in]: [...roles.keys()] }, role: "engineer" },
      attributes: ["userId"],
      include: [{ model: User, as: "user", attributes: ["name"] }],
    }),
  ]);

  const counts: Partial<Record<RequestState, number>> = {};
  for (const c of perState) counts[c.state] = Number(c.n);
  const total = perState.reduce((n, c) => n + Number(c.n), 0);
  const rows = found.map((r): RequestRow => {
    const x = r as DeviationRequest & { assignee: User | null; createdBy: User };
    const open = OPEN_STATES.includes(r.state) && r.state !== "draft";
    return {
      id: r.id,
      projectId: r.projectId,
      projectName: names.get(r.projectId)!,
      code: requestCode(r.number),
      number: r.number,
      title: r.title,
      provision: r.provision,
      state: r.state,
      assignee: x.assignee?.name ?? null,
      assigneeId: r.assigneeId ?? null,
      createdBy: x.createdBy.name,
      dueAt: r.dueAt?.toISOString() ?? null,
      overdue: isOverdue(r.dueAt, open),
      waiting: waitedFor(r.stateChangedAt),
      needsMe: needsMyAction(r, { id: me.id, role: roles.get(r.projectId)! }),
    };
  });
  const seen = new Map<string, string>();
  for (const e of engineers) seen.set(e.userId, (e as ProjectMember & { user: User }).user.name);
  return {
    rows,
    counts,
    total,
    matching: filter.state ? (counts[filter.state] ?? 0) : total,
    page,
    pageSize,
    engineers: [...seen].map(([id, name]) => ({ id, name })).sort((a, b) => a.name.localeCompare(b.name)),
  };
}
