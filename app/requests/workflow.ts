// The deviation request's life, as one table: state × action → next state, and which role may take the action.
// Pure and isomorphic: the server enforces it inside the transition transaction; the UI uses it to offer moves.
import type { Role } from "../projects/permissions";

export const REQUEST_STATES = [
  "draft",
  "submitted",
  "in_review",
  "info_requested",
  "resubmitted",
  "decided",
  "withdrawn",
  "superseded",
  "closed",
] as const;
export type RequestState = (typeof REQUEST_STATES)[number];

export const STATE_LABELS: Record<RequestState, string> = {
  draft: "Draft",
  submitted: "Submitted",
  in_review: "In review",
  info_requested: "More information needed",
  resubmitted: "Resubmitted",
  decided: "Decided",
  withdrawn: "Withdrawn",
  superseded: "Superseded",
  closed: "Installed as approved",
};

export const REQUEST_ACTIONS = ["submit", "start_review", "request_info", "resubmit", "decide", "withdraw", "supersede", "close"] as const;
export type RequestAction = (typeof REQUEST_ACTIONS)[number];

export const ACTION_LABELS: Record<RequestAction, string> = {
  submit: "Submit to the engineer",
  start_review: "Start review",
  request_info: "Ask for more information",
  resubmit: "Resubmit",
  decide: "Record decision",
  withdraw: "Withdraw",
  supersede: "Mark superseded",
  close: "Record installed as approved",
};

interface Move {
  from: readonly RequestState[];
  to: RequestState;
  /** Roles that may make the move; "requester" means the person who raised the request. */
  by: readonly (Role | "requester")[];
}

const OPEN: RequestState[] = ["draft", "submitted", "in_review", "info_requested", "resubmitted"];

export const MOVES: Record<RequestAction, Move> = {
  submit: { from: ["draft"], to: "submitted", by: ["requester"] },
  start_review: { from: ["submitted", "resubmitted"], to: "in_review", by: ["engineer"] },
  request_info: { from: ["in_review"], to: "info_requested", by: ["engineer"] },
  resubmit: { from: ["info_requested"], to: "resubmitted", by: ["requester"] },
  decide: { from: ["in_review"], to: "decided", by: ["engineer"] },
  withdraw: { from: [...OPEN, "decided"], to: "withdrawn", by: ["requester", "manager"] },
  supersede: { from: ["decided"], to: "superseded", by: ["engineer", "manager"] },
  // Recorded from the site page once work is installed as the signed approval says.
  close: { from: ["decided"], to: "closed", by: ["site_plumber"] },
};

export interface Actor {
  role: Role;
  isRequester: boolean;
}

export type MoveCheck = { ok: true; to: RequestState } | { ok: false; reason: string };

export function checkMove(state: RequestState, action: RequestAction, actor: Actor): MoveCheck {
  const move = MOVES[action];
  if (!move.from.includes(state)) {
    return { ok: false, reason: `A request that is ${STATE_LABELS[state].toLowerCase()} cannot be moved with "${ACTION_LABELS[action]}".` };
  }
  const allowed = move.by.some((who) => (who === "requester" ? actor.isRequester : who === actor.role));
  if (!allowed) return { ok: false, reason: `Your role cannot "${ACTION_LABELS[action]}" on this request.` };
  return { ok: true, to: move.to };
}

/** The moves this actor may make now, in table order: what the UI offers. */
export function availableMoves(state: RequestState, actor: Actor): RequestAction[] {
  return REQUEST_ACTIONS.filter((a) => checkMove(state, a, actor).ok);
}

export const OPEN_STATES: readonly RequestState[] = OPEN;
