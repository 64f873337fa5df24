// Request forms, shared by browser and server: the draft content (saved as typed, checked loosely), the stricter
// check before it goes to the engineer, workflow moves, comments, assignment and due dates.
import { z } from "zod";
import { PROVISION_IDS } from "./provisions";
import { measurementSchema } from "./measurements";
import { REQUEST_ACTIONS } from "./workflow";

const provision = z.enum(PROVISION_IDS, { error: "Choose the provision that cannot be applied." });
const longText = (max: number) => z.string().trim().max(max, `Keep this under ${max} characters.`).default("");

/** What a draft may hold; every field can still be empty except title and provision. */
export const contentSchema = z.object({
  title: z.string({ error: "Give the request a short title." }).trim().min(3, "Use at least 3 characters.").max(160, "Keep the title under 160 characters."),
  provision,
  clauseRef: longText(80),
  siteConstraint: longText(4000),
  proposal: longText(4000),
  measurements: z.array(measurementSchema).max(40, "At most 40 measurements.").default([]),
});
export type RequestContent = z.output<typeof contentSchema>;

export const newRequestSchema = contentSchema.pick({ title: true, provision: true, clauseRef: true });

/** Before the engineer sees it: the constraint and the proposal must be stated. */
export const readySchema = contentSchema.extend({
  siteConstraint: z.string().trim().min(10, "Describe the site constraint (at least 10 characters)."),
  proposal: z.string().trim().min(10, "Describe the proposed alternative (at least 10 characters)."),
});

/** The version a form or API call was based on: a whole number; missing, null or blank is refused, not read as 0. */
const lockVersion = z.preprocess(
  (v) => (v === null || (typeof v === "string" && !v.trim()) ? undefined : v),
  z.coerce.number({ error: "The form is missing its version; reload the page." }).int().min(0),
);

export const moveSchema = z.object({
  action: z.enum(REQUEST_ACTIONS, { error: "Unknown move." }),
  lockVersion,
  note: z.string().trim().max(4000).default(""),
});

export const commentSchema = z.object({
  body: z.string({ error: "Write a comment." }).trim().min(1, "Write a comment.").max(8000, "Keep comments under 8000 characters."),
  attachmentIds: z.array(z.uuid()).max(10).default([]),
});

export const assignSchema = z.object({
  assigneeId: z.uuid({ error: "Choose an engineer." }),
  lockVersion,
});

export const dueSchema = z.object({
  dueOn: z.iso.date({ error: "Enter a date." }),
  lockVersion,
});
