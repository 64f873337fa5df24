// The role → action matrix, stated in full here so any change to who-may-do-what is a visible, reviewed change.
import { describe, expect, it } from "vitest";
import { ACTIONS, can, PERMISSIONS, ROLES, type Action, type Role } from "./permissions";

const EXPECTED: Record<Action, Role[]> = {
  "project.view": ["site_plumber", "engineer", "architect", "manager"],
  "project.edit": ["manager"],
  "members.view": ["site_plumber", "engineer", "architect", "manager"],
  "members.manage": ["manager"],
  "drawings.view": ["site_plumber", "engineer", "architect", "manager"],
  "drawings.upload": ["site_plumber", "architect", "manager"],
  "drawings.issue": ["architect", "manager"],
  "requests.view": ["site_plumber", "engineer", "architect", "manager"],
  "requests.raise": ["site_plumber"],
  "requests.review": ["engineer"],
  "calculations.run": ["site_plumber", "engineer", "architect", "manager"],
  "calculations.save": ["engineer"],
  "approvals.view": ["site_plumber", "engineer", "architect", "manager"],
  "approvals.sign": ["engineer"],
  "installations.record": ["site_plumber"],
};

describe("permissions matrix", () => {
  for (const action of ACTIONS) {
    for (const role of ROLES) {
      const allowed = EXPECTED[action].includes(role);
      it(`${role} ${allowed ? "may" : "may not"} ${action}`, () => expect(can(role, action)).toBe(allowed));
    }
  }

  it("covers every action and lists no unknown one", () => {
    expect(Object.keys(EXPECTED).sort()).toEqual([...ACTIONS].sort());
    for (const role of ROLES) for (const a of PERMISSIONS[role]) expect(ACTIONS).toContain(a);
  });

  it("refuses everything without a role", () => {
    for (const action of ACTIONS) expect(can(null, action)).toBe(false);
  });
});
