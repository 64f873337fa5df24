// Project and membership forms, shared by browser and server.
import { z } from "zod";
import { ROLES } from "./permissions";

export const projectSchema = z.object({
  name: z.string({ error: "Name the project." }).trim().min(3, "Use at least 3 characters.").max(120),
  siteAddress: z.string({ error: "Enter the site address." }).trim().min(5, "Enter the full site address.").max(300),
  clientName: z.string().trim().max(160).optional(),
  description: z.string().trim().max(4000).optional(),
});

const role = z.enum(ROLES, { error: "Choose a role." });

export const inviteSchema = z.object({
  intent: z.literal("invite"),
  email: z
    .string({ error: "Enter the e-mail address to invite." })
    .trim()
    .toLowerCase()
    .pipe(z.email({ error: "Enter a valid e-mail address." })),
  role,
});

export const changeRoleSchema = z.object({
  intent: z.literal("change-role"),
  memberId: z.uuid(),
  role,
  version: z.coerce.number().int().min(0),
});

export const removeMemberSchema = z.object({ intent: z.literal("remove"), memberId: z.uuid() });
export const revokeInvitationSchema = z.object({ intent: z.literal("revoke-invitation"), invitationId: z.uuid() });
