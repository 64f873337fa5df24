// Whose move it is on a request: what puts it at the top of someone's list. The rules are data, read by the
// pure check below (lists, tests) and by the list query, which orders and pages by them in the database.
import type { Role } from "../projects/permissions";
import type { RequestState } from "./workflow";

export interface NeedsActionRule {
  /** Who the rule is for: the request's author, or anyone with that role on the project. */
  who: "requester" | Role;
  states: readonly RequestState[];
  /** For role rules: the request must be unassigned ("none") or assigned to the viewer or unassigned ("me-or-none"). */
  assignee?: "none" | "me-or-none";
}

export const NEEDS_ACTION_RULES: readonly NeedsActionRule[] = [
  { who: "requester", states: ["draft", "info_requested"] },
  { who: "engineer", states: ["submitted", "resubmitted", "in_review"], assignee: "me-or-none" },
  { who: "manager", states: ["submitted", "resubmitted"], assignee: "none" },
];

export function needsMyAction(r: { state: RequestState; assigneeId: string | null; createdById: string }, me: { id: string; role: Role }): boolean {
  return NEEDS_ACTION_RULES.some((rule) => {
    if (!rule.states.includes(r.state)) return false;
    if (rule.who === "requester") return r.createdById === me.id;
    if (rule.who !== me.role) return false;
    if (rule.assignee === "none") return r.assigneeId === null;
    if (rule.assignee === "me-or-none") return r.assigneeId === null || r.assigneeId === me.id;
    return true;
  });
}
