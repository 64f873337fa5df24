import { describe, expect, it } from "vitest";
import { needsMyAction } from "./needs-action";

const me = "me";
describe("needsMyAction", () => {
  it("puts the requester's drafts and questions first for the requester", () => {
    expect(needsMyAction({ state: "draft", assigneeId: null, createdById: me }, { id: me, role: "site_plumber" })).toBe(true);
    expect(needsMyAction({ state: "info_requested", assigneeId: "e", createdById: me }, { id: me, role: "site_plumber" })).toBe(true);
    expect(needsMyAction({ state: "in_review", assigneeId: "e", createdById: me }, { id: me, role: "site_plumber" })).toBe(false);
  });
  it("gives the assigned engineer what waits for review, not another engineer's", () => {
    expect(needsMyAction({ state: "submitted", assigneeId: me, createdById: "p" }, { id: me, role: "engineer" })).toBe(true);
    expect(needsMyAction({ state: "resubmitted", assigneeId: "other", createdById: "p" }, { id: me, role: "engineer" })).toBe(false);
    expect(needsMyAction({ state: "info_requested", assigneeId: me, createdById: "p" }, { id: me, role: "engineer" })).toBe(false);
  });
  it("gives a manager submitted requests that have no engineer", () => {
    expect(needsMyAction({ state: "submitted", assigneeId: null, createdById: "p" }, { id: me, role: "manager" })).toBe(true);
    expect(needsMyAction({ state: "submitted", assigneeId: "e", createdById: "p" }, { id: me, role: "manager" })).toBe(false);
  });
});
