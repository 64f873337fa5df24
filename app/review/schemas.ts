// The review desk's form, shared by browser and server: an outcome per principle with reasoning and evidence,
// the decision, its numbered conditions or its reasons, and the drawing revisions it rests on.
import { z } from "zod";
import { DECISION_OUTCOMES, OUTCOMES, PRINCIPLES, type DecisionDraft, type PrincipleId } from "./principles";

const PRINCIPLE_IDS = PRINCIPLES.map((p) => p.id) as [PrincipleId, ...PrincipleId[]];
const list = <T extends z.ZodType>(item: T, max: number) =>
  z.preprocess((v) => (v === undefined || v === null || v === "" ? [] : Array.isArray(v) ? v : [v]), z.array(item).max(max));

export const assessmentSchema = z.object({
  principleId: z.enum(PRINCIPLE_IDS),
  outcome: z.enum(OUTCOMES).optional().catch(undefined),
  reasoning: z.string().trim().max(4000, "Keep the reasoning under 4000 characters.").default(""),
  evidence: list(z.uuid(), 20).default([]),
});

export const decisionFormSchema = z.object({
  outcome: z.enum(DECISION_OUTCOMES, { error: "Choose the decision." }).optional(),
  principles: z.array(assessmentSchema).max(PRINCIPLES.length).default([]),
  conditions: list(z.string().trim().max(2000, "Keep each condition under 2000 characters."), 30).default([]),
  reasons: z.string().trim().max(8000).default(""),
  restsOn: list(z.uuid(), 100).default([]),
  lockVersion: z.coerce.number().int().min(0),
});
export type DecisionForm = z.output<typeof decisionFormSchema>;

/** The form as the rules in principles.ts read it (blank conditions dropped). */
export function toDraft(form: DecisionForm): DecisionDraft {
  return {
    outcome: form.outcome ?? "approved",
    assessments: form.principles.map((p) => ({
      principleId: p.principleId,
      outcome: p.outcome ?? null,
      reasoning: p.reasoning,
      evidence: p.evidence.map((id) => ({ kind: "attachment" as const, id })),
    })),
    conditions: form.conditions.filter((c) => c.trim()),
    reasons: form.reasons,
  };
}
