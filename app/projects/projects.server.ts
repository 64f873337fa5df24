// Projects and access to them: my projects, creating one, and the guard that loads a project for a member.
import { data, type RouterContextProvider } from "react-router";
import { Project, ProjectMember, sequelize } from "../../db/models";
import { requireApiUser, requireUser } from "../accounts/auth.server";
import { apiError } from "../platform/http.server";
import { audit } from "../platform/audit.server";
import { projectContext, type ProjectAccess } from "./context";
import { can, type Action, type Role } from "./permissions";

export interface ProjectInput {
  name: string;
  siteAddress: string;
  clientName?: string;
  description?: string;
}

const PROJECT_FIELDS = ["id", "name", "siteAddress", "clientName", "description"] as const;

export async function listMyProjects(userId: string) {
  const rows = await ProjectMember.findAll({
    where: { userId },
    attributes: ["role"],
    include: [{ model: Project, as: "project", attributes: [...PROJECT_FIELDS, "updatedAt"] }],
    order: [[{ model: Project, as: "project" }, "name", "ASC"]],
  });
  return rows.map((m) => {
    const project = (m as unknown as { project: Project }).project;
    return { ...project.get({ plain: true }), role: m.role as Role };
  });
}

export async function createProject(userId: string, input: ProjectInput) {
  return sequelize.transaction(async (transaction) => {
    const project = await Project.create(
      { ...input, clientName: input.clientName || null, description: input.description || null, createdById: userId },
      { transaction },
    );
    await ProjectMember.create({ projectId: project.id, userId, role: "manager" }, { transaction });
    await audit({ action: "project.created", actorId: userId, projectId: project.id, subjectType: "project", subjectId: project.id }, transaction);
    return project;
  });
}

export async function updateProject(actorId: string, projectId: string, input: ProjectInput) {
  await sequelize.transaction(async (transaction) => {
    await Project.update(
      { ...input, clientName: input.clientName || null, description: input.description || null },
      { where: { id: projectId }, transaction },
    );
    await audit({ action: "project.updated", actorId, projectId, subjectType: "project", subjectId: projectId }, transaction);
  });
}

const UUID = /^[0-9a-f]{8}-[0-9a-f]{4}-[0-9a-f]{4}-[0-9a-f]{4}-[0-9a-f]{12}$/i;

/** The project and the user's role on it, or null when the user is not a member (or the id is malformed). */
export async function findProjectAccess(projectId: string, userId: string): Promise<ProjectAccess | null> {
  if (!UUID.test(projectId)) return null;
  // A plain row (asked on every project request): no model instances to build.
  const member = (await ProjectMember.findOne({
    where: { projectId, userId },
    attributes: ["role"],
    include: [{ model: Project, as: "project", attributes: [...PROJECT_FIELDS] }],
    raw: true,
    nest: true,
  })) as unknown as { role: Role; project: ProjectAccess["project"] } | null;
  return member ? { project: member.project, role: member.role } : null;
}

/** Middleware for every /projects/:projectId route: members only; sets the project context once. */
export async function loadProjectAccess(
  context: Readonly<RouterContextProvider>,
  request: Request,
  projectId: string | undefined,
) {
  const user = requireUser(context, request);
  const access = projectId ? await findProjectAccess(projectId, user.id) : null;
  if (!access) throw data({ message: "You are not a member of this project, or it does not exist." }, { status: 403 });
  (context as RouterContextProvider).set(projectContext, access);
  return access;
}

/** For loaders and actions inside a project: the project, the user, and a 403 unless the role allows `action`. */
export function requireProjectAction(context: Readonly<RouterContextProvider>, request: Request, action: Action) {
  const user = requireUser(context, request);
  const access = context.get(projectContext);
  if (!access) throw data({ message: "You are not a member of this project, or it does not exist." }, { status: 403 });
  if (!can(access.role, action)) {
    throw data({ message: "Your role on this project does not allow this." }, { status: 403 });
  }
  return { user, ...access };
}

/** The same guard for /api/ endpoints, answering JSON 401/403 instead of pages. */
export async function requireApiProjectAction(
  context: Readonly<RouterContextProvider>,
  projectId: string | undefined,
  action: Action,
) {
  const user = requireApiUser(context);
  const access = projectId ? await findProjectAccess(projectId, user.id) : null;
  if (!access) throw apiError(403, "You are not a member of this project, or it does not exist.");
  if (!can(access.role, action)) throw apiError(403, "Your role on this project does not allow this.");
  return { user, ...access };
}
