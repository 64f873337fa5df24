import { describe, expect, it } from "vitest";
import { ROLES } from "../projects/permissions";
import { availableMoves, checkMove, REQUEST_ACTIONS, REQUEST_STATES } from "./workflow";

describe("request workflow", () => {
  it("walks the whole loop with the right people", () => {
    const plumber = { role: "site_plumber" as const, isRequester: true };
    const engineer = { role: "engineer" as const, isRequester: false };
    let state = "draft" as (typeof REQUEST_STATES)[number];
    for (const [action, actor, to] of [
      ["submit", plumber, "submitted"],
      ["start_review", engineer, "in_review"],
      ["request_info", engineer, "info_requested"],
      ["resubmit", plumber, "resubmitted"],
      ["start_review", engineer, "in_review"],
      ["decide", engineer, "decided"],
    ] as const) {
      const check = checkMove(state, action, actor);
      expect(check).toEqual({ ok: true, to });
      state = to;
    }
  });

  it("refuses a move from a state it does not start from, saying why", () => {
    const r = checkMove("draft", "decide", { role: "engineer", isRequester: false });
    expect(r.ok).toBe(false);
    if (!r.ok) expect(r.reason).toContain("draft");
  });

  it("refuses a role that may not make the move", () => {
    expect(checkMove("in_review", "decide", { role: "site_plumber", isRequester: true }).ok).toBe(false);
    expect(checkMove("draft", "submit", { role: "site_plumber", isRequester: false }).ok).toBe(false);
    expect(checkMove("submitted", "start_review", { role: "architect", isRequester: false }).ok).toBe(false);
  });

  it("never leaves a final state except as the table says", () => {
    for (const role of ROLES) {
      for (const isRequester of [true, false]) {
        expect(availableMoves("withdrawn", { role, isRequester })).toEqual([]);
        expect(availableMoves("superseded", { role, isRequester })).toEqual([]);
        expect(availableMoves("closed", { role, isRequester })).toEqual([]);
      }
    }
  });

  it("has a defined answer for every state × action × role", () => {
    for (const s of REQUEST_STATES) for (const a of REQUEST_ACTIONS) for (const role of ROLES) {
      const r = checkMove(s, a, { role, isRequester: role === "site_plumber" });
      expect(typeof r.ok).toBe("boolean");
    }
  });
});
