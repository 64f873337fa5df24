import { describe, expect, it } from "vitest";
import { addWorkingDays, isOverdue, requestCode, waitedFor } from "./due";

describe("addWorkingDays", () => {
  it("skips weekends", () => {
    // Monday 2026-03-02 + 5 working days = Monday 2026-03-09
    expect(addWorkingDays(new Date("2026-03-02T09:00:00Z"), 5).toISOString()).toBe("2026-03-09T09:00:00.000Z");
    // Friday + 1 = Monday
    expect(addWorkingDays(new Date("2026-03-06T16:00:00Z"), 1).toISOString()).toBe("2026-03-09T16:00:00.000Z");
    // Saturday + 5 = next Friday
    expect(addWorkingDays(new Date("2026-03-07T10:00:00Z"), 5).toISOString()).toBe("2026-03-13T10:00:00.000Z");
  });
});

describe("waiting and overdue", () => {
  const now = new Date("2026-03-10T12:00:00Z");
  it("says how long in plain words", () => {
    expect(waitedFor(new Date("2026-03-10T11:59:00Z"), now)).toBe("1 minute");
    expect(waitedFor(new Date("2026-03-10T07:00:00Z"), now)).toBe("5 hours");
    expect(waitedFor(new Date("2026-03-06T12:00:00Z"), now)).toBe("4 days");
  });
  it("is overdue only while open and past due", () => {
    expect(isOverdue("2026-03-09T00:00:00Z", true, now)).toBe(true);
    expect(isOverdue("2026-03-09T00:00:00Z", false, now)).toBe(false);
    expect(isOverdue(null, true, now)).toBe(false);
    expect(isOverdue("2026-03-11T00:00:00Z", true, now)).toBe(false);
  });
  it("numbers requests DR-001", () => {
    expect(requestCode(1)).toBe("DR-001");
    expect(requestCode(1234)).toBe("DR-1234");
  });
});
