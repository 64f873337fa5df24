// Whose move it is on a request: what puts it at the top of someone's list. Pure and shared by lists and tests.
import type { Role } from "../projects/permissions";
import type { RequestState } from "./workflow";

export function needsMyAction(r: { state: RequestState; assigneeId: string | null; createdById: string }, me: { id: string; role: Role }): boolean {
  const requester = r.createdById === me.id;
  if (requester && (r.state === "draft" || r.state === "info_requested")) return true;
  if (me.role === "engineer" && ["submitted", "resubmitted", "in_review"].includes(r.state)) return r.assigneeId === me.id || r.assigneeId === null;
  if (me.role === "manager" && r.assigneeId === null && ["submitted", "resubmitted"].includes(r.state)) return true;
  return false;
}
