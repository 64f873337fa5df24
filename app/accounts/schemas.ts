// Form schemas for accounts, shared by the browser (Conform) and the server.
import { z } from "zod";

export const PROFESSIONS = [
  { value: "plumber", label: "Plumber / plumbing contractor" },
  { value: "engineer", label: "Professional engineer" },
  { value: "architect", label: "Architect / designer" },
  { value: "manager", label: "Project or construction manager" },
  { value: "other", label: "Other" },
] as const;

const email = z
  .string({ error: "Enter your e-mail address." })
  .trim()
  .toLowerCase()
  .max(254, "That e-mail address is too long.")
  .pipe(z.email({ error: "Enter a valid e-mail address, like name@example.com." }));

const newPassword = z
  .string({ error: "Choose a password." })
  .min(10, "Use at least 10 characters.")
  .max(200, "Use at most 200 characters.");

const optionalText = (max: number) =>
  z.string().trim().max(max, `Use at most ${max} characters.`).optional();

export const signInSchema = z.object({
  email,
  password: z.string({ error: "Enter your password." }).max(200),
  redirectTo: z.string().optional(),
});

export const profileFields = {
  name: z.string({ error: "Enter your name." }).trim().min(2, "Enter your full name.").max(120),
  phone: z
    .string()
    .trim()
    .max(30)
    .regex(/^[+0-9 ()-]*$/, "Use digits, spaces and + ( ) - only.")
    .optional(),
  profession: z.enum(PROFESSIONS.map((p) => p.value) as [string, ...string[]], {
    error: "Choose your profession.",
  }),
  registrationNumber: optionalText(40),
  registrationBody: optionalText(120),
};

export const signUpSchema = z
  .object({ ...profileFields, email, password: newPassword, redirectTo: z.string().optional() })
  .superRefine(requireRegistrationForEngineers);

export const profileSchema = z.object(profileFields).superRefine(requireRegistrationForEngineers);

function requireRegistrationForEngineers(
  v: { profession: string; registrationNumber?: string },
  ctx: z.RefinementCtx,
) {
  if (v.profession === "engineer" && !v.registrationNumber) {
    ctx.addIssue({
      code: "custom",
      path: ["registrationNumber"],
      message: "Engineers enter their professional registration number; it stays unverified until checked.",
    });
  }
}

export const resetRequestSchema = z.object({ email });
export const resetSchema = z
  .object({ password: newPassword, confirm: z.string({ error: "Type the new password again." }) })
  .refine((v) => v.password === v.confirm, { path: ["confirm"], message: "The two passwords differ." });
