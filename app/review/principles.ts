// The safety and performance principles a rational design is judged against (Countersign's own list and
// names), and the rules a decision must satisfy. Pure: the review screen previews them, the server enforces them.

export const PRINCIPLES = [
  { id: "pressure_containment", label: "Pressure containment" },
  { id: "relief", label: "Temperature and pressure relief" },
  { id: "safe_discharge", label: "Safe discharge" },
  { id: "vacuum_protection", label: "Vacuum protection" },
  { id: "balanced_delivery", label: "Balanced delivery" },
  { id: "prompt_hygienic", label: "Prompt, hygienic hot water" },
  { id: "right_sized", label: "Right-sized storage and energy" },
  { id: "isolation", label: "Isolation and maintainability" },
  { id: "heater_integrity", label: "Heater integrity" },
  { id: "support_drainage", label: "Support, drainage and access" },
  { id: "electrical", label: "Electrical safety" },
] as const;

export type PrincipleId = (typeof PRINCIPLES)[number]["id"];

export const OUTCOMES = ["not_affected", "maintained", "compromised"] as const;
export type PrincipleOutcome = (typeof OUTCOMES)[number];
export const OUTCOME_LABELS: Record<PrincipleOutcome, string> = {
  not_affected: "Not affected",
  maintained: "Maintained",
  compromised: "Compromised",
};

export const DECISION_OUTCOMES = ["approved", "approved_with_conditions", "refused"] as const;
export type DecisionOutcome = (typeof DECISION_OUTCOMES)[number];
export const DECISION_LABELS: Record<DecisionOutcome, string> = {
  approved: "Approved",
  approved_with_conditions: "Approved with conditions",
  refused: "Refused",
};

export interface Assessment {
  principleId: PrincipleId;
  outcome: PrincipleOutcome | null;
  reasoning: string;
  evidence: { kind: "calculation" | "markup" | "attachment"; id: string }[];
}

export interface DecisionDraft {
  outcome: DecisionOutcome;
  assessments: Assessment[];
  conditions: string[];
  reasons: string;
}

export interface DecisionProblem {
  path: string;
  message: string;
}

/** Everything that stops this decision from being recorded, each with the field it concerns. */
export function decisionProblems(d: DecisionDraft): DecisionProblem[] {
  const problems: DecisionProblem[] = [];
  const byId = new Map(d.assessments.map((a) => [a.principleId, a]));
  const approving = d.outcome !== "refused";
  for (const p of PRINCIPLES) {
    const a = byId.get(p.id);
    if (!a?.outcome) {
      problems.push({ path: `principles.${p.id}`, message: `Record an outcome for “${p.label}”.` });
      continue;
    }
    if (a.outcome === "maintained" && !a.reasoning.trim()) {
      problems.push({ path: `principles.${p.id}.reasoning`, message: `“${p.label}” is maintained: say how, with evidence.` });
    }
    if (approving && a.outcome === "compromised") {
      problems.push({ path: `principles.${p.id}`, message: `“${p.label}” is compromised, so the design cannot be approved.` });
    }
  }
  if (d.outcome === "approved_with_conditions" && !d.conditions.some((c) => c.trim())) {
    problems.push({ path: "conditions", message: "Approval with conditions needs at least one condition." });
  }
  if (d.outcome === "refused" && !d.reasons.trim()) {
    problems.push({ path: "reasons", message: "A refusal needs its reasons." });
  }
  return problems;
}
