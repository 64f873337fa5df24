import { describe, expect, it } from "vitest";
import { diffApprovals } from "./diff";

describe("approval version diff", () => {
  it("lists changed conditions, principles and drawings", () => {
    const v1 = { decision: { conditions: ["Insulate the run."] }, principles: [{ id: "a", label: "Safe discharge", outcome: "maintained", reasoning: "r" }], drawings: [{ sheetNumber: "P-1", revisionLabel: "A", sha256: "1" }] };
    const v2 = { decision: { conditions: ["Insulate the run.", "Label the outlet."] }, principles: [{ id: "a", label: "Safe discharge", outcome: "not_affected", reasoning: "" }], drawings: [{ sheetNumber: "P-1", revisionLabel: "B", sha256: "2" }] };
    expect(diffApprovals(v1, v2)).toEqual({
      conditionsAdded: ["Label the outlet."],
      conditionsRemoved: [],
      principlesChanged: [{ label: "Safe discharge", from: "maintained", to: "not_affected" }],
      drawingsAdded: ["P-1 rev B"],
      drawingsRemoved: ["P-1 rev A"],
    });
  });
});
