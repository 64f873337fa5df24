// Lists of requests: one project's, or across all of mine, filtered (state, provision, assignee, overdue), with
// counts per state and whatever needs my action first. Drafts are seen only by their author.
import { Op, type WhereOptions } from "sequelize";
import { DeviationRequest, Project, ProjectMember, User } from "../../db/models";
import type { Role } from "../projects/permissions";
import { isOverdue, requestCode, waitedFor } from "./due";
import { needsMyAction } from "./needs-action";
import { PROVISION_IDS } from "./provisions";
import { OPEN_STATES, REQUEST_STATES, type RequestState } from "./workflow";
import { z } from "zod";

export const listFilterSchema = z.object({
  state: z.enum(REQUEST_STATES).optional().catch(undefined),
  provision: z.enum(PROVISION_IDS).optional().catch(undefined),
  assignee: z.union([z.literal("me"), z.literal("none"), z.uuid()]).optional().catch(undefined),
  overdue: z.literal("1").optional().catch(undefined),
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

export interface RequestList {
  rows: RequestRow[];
  counts: Partial<Record<RequestState, number>>;
  total: number;
  engineers: { id: string; name: string }[];
}

export async function listRequests(me: { id: string }, filter: ListFilter, projectId?: string): Promise<RequestList> {
  const memberships = await ProjectMember.findAll({
    where: projectId ? { userId: me.id, projectId } : { userId: me.id },
    attributes: ["projectId", "role"],
    include: [{ model: Project, as: "project", attributes: ["id", "name"] }],
  });
  const roles = new Map(memberships.map((m) => [m.projectId, m.role as Role]));
  const names = new Map(memberships.map((m) => [m.projectId, (m as ProjectMember & { project: Project }).project.name]));
  if (!roles.size) return { rows: [], counts: {}, total: 0, engineers: [] };

  const where: WhereOptions[] = [
    { projectId: { [Op.in]: [...roles.keys()] } },
    { [Op.or]: [{ state: { [Op.ne]: "draft" } }, { createdById: me.id }] },
  ];
  if (filter.provision) where.push({ provision: filter.provision });
  if (filter.assignee === "me") where.push({ assigneeId: me.id });
  else if (filter.assignee === "none") where.push({ assigneeId: null });
  else if (filter.assignee) where.push({ assigneeId: filter.assignee });
  if (filter.overdue) where.push({ dueAt: { [Op.lt]: new Date() }, state: { [Op.in]: OPEN_STATES.filter((s) => s !== "draft") } });

  const [found, engineers] = await Promise.all([
    DeviationRequest.findAll({
      where: { [Op.and]: where },
      include: [
        { model: User, as: "assignee", attributes: ["name"] },
        { model: User, as: "createdBy", attributes: ["name"] },
      ],
      order: [["createdAt", "DESC"]],
      limit: 1000,
    }),
    ProjectMember.findAll({
      where: { projectId: { [Op.in]: [...roles.keys()] }, role: "engineer" },
      attributes: ["userId"],
      include: [{ model: User, as: "user", attributes: ["name"] }],
    }),
  ]);

  const counts: Partial<Record<RequestState, number>> = {};
  for (const r of found) counts[r.state] = (counts[r.state] ?? 0) + 1;
  const rows = found
    .filter((r) => !filter.state || r.state === filter.state)
    .map((r): RequestRow => {
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
    })
    .sort((a, b) => Number(b.needsMe) - Number(a.needsMe) || Number(b.overdue) - Number(a.overdue) || (a.dueAt ?? "9").localeCompare(b.dueAt ?? "9") || b.number - a.number);
  const seen = new Map<string, string>();
  for (const e of engineers) seen.set(e.userId, (e as ProjectMember & { user: User }).user.name);
  return { rows, counts, total: found.length, engineers: [...seen].map(([id, name]) => ({ id, name })).sort((a, b) => a.name.localeCompare(b.name)) };
}
