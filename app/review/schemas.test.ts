import { describe, expect, it } from "vitest";
import { decisionProblems, PRINCIPLES } from "./principles";
import { decisionFormSchema, toDraft } from "./schemas";

const all = (outcome: string, reasoning = "") => PRINCIPLES.map((p) => ({ principleId: p.id, outcome, reasoning }));

describe("decision form", () => {
  it("reads single values as lists and drops blank conditions", () => {
    const form = decisionFormSchema.parse({ outcome: "approved_with_conditions", principles: all("not_affected"), conditions: ["", "Fit a tundish", " "], restsOn: "6f1c1c1e-7b8a-4c52-9a51-3f9b0f6f0d11", lockVersion: "3" });
    expect(form.restsOn).toHaveLength(1);
    const draft = toDraft(form);
    expect(draft.conditions).toEqual(["Fit a tundish"]);
    expect(decisionProblems(draft)).toEqual([]);
  });

  it("keeps the rules: an approval with a compromised principle, or maintained without reasoning, has problems", () => {
    const principles = all("not_affected");
    principles[2] = { principleId: "safe_discharge", outcome: "compromised", reasoning: "Too long" };
    principles[3] = { principleId: "vacuum_protection", outcome: "maintained", reasoning: "" };
    const draft = toDraft(decisionFormSchema.parse({ outcome: "approved", principles, lockVersion: 0 }));
    expect(decisionProblems(draft).map((p) => p.path)).toEqual(["principles.safe_discharge", "principles.vacuum_protection.reasoning"]);
  });

  it("treats a principle without an outcome as unrecorded", () => {
    const draft = toDraft(decisionFormSchema.parse({ outcome: "refused", reasons: "Unsafe", principles: [{ principleId: "relief", outcome: "" }], lockVersion: 0 }));
    expect(decisionProblems(draft).length).toBe(PRINCIPLES.length);
  });
});
