// Who may do what on a project: permissions are data (role → actions), checked by one function, `can`.
// Isomorphic: the server enforces it in every loader and action; the UI uses it only to hide what a role cannot do.

export const ROLES = ["site_plumber", "engineer", "architect", "manager"] as const;
export type Role = (typeof ROLES)[number];

export const ROLE_LABELS: Record<Role, string> = {
  site_plumber: "Site plumber",
  engineer: "Engineer",
  architect: "Architect",
  manager: "Project manager",
};

export const ACTIONS = [
  "project.view",
  "project.edit",
  "members.view",
  "members.manage",
  "drawings.view",
  "drawings.upload",
  "drawings.issue",
  "requests.view",
  "requests.raise",
  "requests.review",
  "calculations.run",
  "calculations.save",
  "approvals.view",
  "approvals.sign",
  "installations.record",
] as const;
export type Action = (typeof ACTIONS)[number];

const EVERY_MEMBER: Action[] = ["project.view", "members.view", "drawings.view", "requests.view", "approvals.view", "calculations.run"];

export const PERMISSIONS: Record<Role, readonly Action[]> = {
  site_plumber: [...EVERY_MEMBER, "drawings.upload", "requests.raise", "installations.record"],
  engineer: [...EVERY_MEMBER, "requests.review", "calculations.save", "approvals.sign"],
  architect: [...EVERY_MEMBER, "drawings.upload", "drawings.issue"],
  manager: [...EVERY_MEMBER, "project.edit", "members.manage", "drawings.upload", "drawings.issue"],
};

export function can(role: Role | null | undefined, action: Action): boolean {
  return !!role && PERMISSIONS[role].includes(action);
}

export function isRole(value: unknown): value is Role {
  return typeof value === "string" && (ROLES as readonly string[]).includes(value);
}
