// Forms of the drawing register, shared by browser and server.
import { z } from "zod";
import { isValidLabel, normaliseLabel } from "./labels";
import { ISSUE_STATUSES } from "./status";

const text = (max: number) => z.string().trim().max(max);

export const uploadSchema = z.object({
  sheetNumber: z
    .string({ error: "Enter the sheet number." })
    .trim()
    .toUpperCase()
    .min(1, "Enter the sheet number.")
    .max(40, "Keep the sheet number under 40 characters.")
    .regex(/^[A-Z0-9][A-Z0-9 ._/-]*$/, "Use letters, digits, spaces and . _ / - only."),
  title: text(200).optional(),
  discipline: text(60).optional(),
  scaleText: text(120).optional(),
  label: z
    .string()
    .trim()
    .optional()
    .refine((v) => !v || isValidLabel(v), "Use P1, P2 … for preliminary or A, B … for construction.")
    .transform((v) => (v ? normaliseLabel(v) : undefined)),
  description: text(2000).optional(),
  mode: z.enum(["single", "split"]).default("single"),
});
export type UploadFields = z.infer<typeof uploadSchema>;

export const issueSchema = z.object({
  intent: z.literal("issue"),
  revisionIds: z.array(z.uuid()).min(1, "Choose at least one revision to issue."),
  status: z.enum(ISSUE_STATUSES, { error: "Choose what the revisions are issued for." }),
  recipientIds: z.array(z.uuid()).min(1, "Choose at least one person to send the transmittal to."),
  reason: z.string({ error: "Say why these revisions are issued." }).trim().min(3, "Say why these revisions are issued.").max(2000),
});

export const withdrawSchema = z.object({
  intent: z.literal("withdraw"),
  revisionId: z.uuid(),
  reason: z.string({ error: "Say why it is withdrawn." }).trim().min(3, "Say why it is withdrawn.").max(2000),
});

export const retrySchema = z.object({ intent: z.literal("retry"), revisionId: z.uuid() });

export const compareQuerySchema = z.object({
  from: z.uuid(),
  to: z.uuid(),
  page: z.coerce.number().int().min(1).max(10_000).default(1),
});
