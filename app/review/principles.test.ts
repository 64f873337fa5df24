import { describe, expect, it } from "vitest";
import { decisionProblems, PRINCIPLES, type Assessment } from "./principles";

const all = (outcome: Assessment["outcome"], reasoning = ""): Assessment[] =>
  PRINCIPLES.map((p) => ({ principleId: p.id, outcome, reasoning, evidence: [] }));

describe("decision rules", () => {
  it("accepts an approval where every principle is not affected", () => {
    expect(decisionProblems({ outcome: "approved", assessments: all("not_affected"), conditions: [], reasons: "" })).toEqual([]);
  });

  it("requires an outcome for every principle", () => {
    const problems = decisionProblems({ outcome: "approved", assessments: all("not_affected").slice(1), conditions: [], reasons: "" });
    expect(problems).toEqual([{ path: "principles.pressure_containment", message: expect.stringContaining("Pressure containment") }]);
  });

  it("blocks approval while a principle is compromised, but not refusal", () => {
    const assessments = all("not_affected");
    assessments[2] = { ...assessments[2]!, outcome: "compromised" };
    expect(decisionProblems({ outcome: "approved", assessments, conditions: [], reasons: "" })[0]!.message).toContain("cannot be approved");
    expect(decisionProblems({ outcome: "refused", assessments, conditions: [], reasons: "Discharge would scald." })).toEqual([]);
  });

  it("requires reasoning where a principle is maintained", () => {
    const problems = decisionProblems({ outcome: "approved", assessments: all("maintained"), conditions: [], reasons: "" });
    expect(problems).toHaveLength(PRINCIPLES.length);
    expect(decisionProblems({ outcome: "approved", assessments: all("maintained", "See calc C-1."), conditions: [], reasons: "" })).toEqual([]);
  });

  it("requires a condition for a conditional approval and reasons for a refusal", () => {
    expect(decisionProblems({ outcome: "approved_with_conditions", assessments: all("not_affected"), conditions: [" "], reasons: "" })).toEqual([
      { path: "conditions", message: expect.any(String) },
    ]);
    expect(decisionProblems({ outcome: "refused", assessments: all("not_affected"), conditions: [], reasons: "" })).toEqual([
      { path: "reasons", message: expect.any(String) },
    ]);
  });
});
