// Forms of the approvals domain, shared by browser and server.
import { z } from "zod";

export const verifySchema = z.object({
  intent: z.literal("verify"),
  registrationNumber: z.string({ error: "Enter the registration number you checked." }).trim().min(3).max(40),
  registrationBody: z.string({ error: "Enter the registering body." }).trim().min(2).max(120),
  checkedOn: z.iso.date({ error: "Enter the date you checked the register." }).refine((d) => new Date(d) <= new Date(), "The check cannot be in the future."),
  note: z.string().trim().max(1000).optional(),
});

export const revokeSchema = z.object({
  intent: z.literal("revoke"),
  note: z.string({ error: "Say why the registration is revoked." }).trim().min(5, "Say why the registration is revoked.").max(1000),
});
