// Test data made straight in the test database (fast), for what a test is not itself about.
import { hashPassword } from "../../app/accounts/password.server";
import type { Role } from "../../app/projects/permissions";
import { Project, ProjectMember, User } from "../../db/models";
import { Client, uniqueEmail } from "./http";

export const PASSWORD = "correct horse battery";
let cachedHash: Promise<string> | undefined;

export async function makeUser(overrides: Partial<{ email: string; name: string; profession: string }> = {}) {
  cachedHash ??= hashPassword(PASSWORD);
  return User.create({
    email: overrides.email ?? uniqueEmail(),
    name: overrides.name ?? "Test Person",
    phone: null,
    profession: overrides.profession ?? "other",
    passwordHash: await cachedHash,
    registrationNumber: null,
    registrationBody: null,
    registrationState: null,
    verifiedById: null,
    verifiedAt: null,
  });
}

/** A project with one member per role (and the users), plus an outsider who belongs to another project. */
export async function makeProjectTeam() {
  const users = {} as Record<Role, User>;
  for (const role of ["manager", "architect", "engineer", "site_plumber"] as Role[]) users[role] = await makeUser({ name: `Test ${role}` });
  const project = await Project.create({ name: "Test project", siteAddress: "1 Test Street", clientName: null, description: null, createdById: users.manager.id });
  for (const role of Object.keys(users) as Role[]) await ProjectMember.create({ projectId: project.id, userId: users[role].id, role });
  const outsider = await makeUser({ name: "Outsider" });
  const other = await Project.create({ name: "Other project", siteAddress: "2 Elsewhere Road", clientName: null, description: null, createdById: outsider.id });
  await ProjectMember.create({ projectId: other.id, userId: outsider.id, role: "manager" });
  return { project, users, outsider, otherProject: other };
}

/** One signed-in client per role of a team, against `base` (the slot's app by default, or another instance). */
export async function signInTeam(team: Awaited<ReturnType<typeof makeProjectTeam>>, base?: string) {
  const out = {} as Record<Role, Client>;
  for (const role of Object.keys(team.users) as Role[]) {
    out[role] = new Client(base);
    await out[role].signIn(team.users[role].email, PASSWORD);
  }
  return out;
}
