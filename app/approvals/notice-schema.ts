// The non-compliance notice form, shared by browser and server.
import { z } from "zod";

export const NOTICE_ROWS = 6;

export const OWNER_DECISIONS: Record<"correct_now" | "correct_later" | "declined" | "undecided", string> = {
  correct_now: "Owner will have it corrected now",
  correct_later: "Owner will have it corrected later",
  declined: "Owner declines correction",
  undecided: "Owner has not yet decided",
};


const item = z.object({
  finding: z.string().trim().max(500).optional(),
  rule: z.string().trim().max(500).optional(),
  ownerDecision: z.enum(["correct_now", "correct_later", "declined", "undecided"]).default("undecided"),
});

export const noticeSchema = z
  .object({
    ownerName: z.string({ error: "Enter the owner's name." }).trim().min(2).max(160),
    ownerEmail: z.string({ error: "Enter the owner's e-mail address." }).trim().toLowerCase().pipe(z.email({ error: "Enter a valid e-mail address." })),
    property: z.string({ error: "Enter the property or unit." }).trim().min(3).max(300),
    inspectedOn: z.iso.date({ error: "Enter the date of the visit." }),
    items: z.array(item).max(NOTICE_ROWS),
  })
  .superRefine((v, ctx) => {
    const filled = v.items.filter((i) => i.finding);
    if (!filled.length) ctx.addIssue({ code: "custom", path: ["items"], message: "List at least one non-compliance." });
    v.items.forEach((i, n) => {
      if (i.finding && !i.rule) ctx.addIssue({ code: "custom", path: ["items", n, "rule"], message: "Say which rule it breaks." });
    });
  })
  .transform((v) => ({ ...v, items: v.items.filter((i) => i.finding).map((i) => ({ finding: i.finding!, rule: i.rule!, ownerDecision: i.ownerDecision })) }));
