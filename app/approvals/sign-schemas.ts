// The signing form: the password, entered now, and the digest of the record the engineer was shown.
import { z } from "zod";

export const signSchema = z.object({
  password: z.string({ error: "Enter your password to sign." }).min(1, "Enter your password to sign.").max(200),
  seenDigest: z.string().regex(/^[0-9a-f]{64}$/, "The page is out of date; reload it."),
  confirm: z.literal("on", { error: "Tick the box to confirm you have reviewed the record." }),
});
