// Environment, read and validated once at start-up. Defaults point at the local fakes that `npm start` runs.
import { z } from "zod";

const schema = z.object({
  NODE_ENV: z.enum(["development", "production", "test"]).default("production"),
  DATABASE_URL: z.string().url().default("postgres://countersign@127.0.0.1:54329/countersign"),
  DATABASE_POOL_MAX: z.coerce.number().int().positive().default(10),
  S3_ENDPOINT: z.string().url().optional().default("http://127.0.0.1:4569"),
  S3_REGION: z.string().default("us-east-1"),
  S3_BUCKET: z.string().min(3).default("countersign"),
  S3_ACCESS_KEY_ID: z.string().default("S3RVER"),
  S3_SECRET_ACCESS_KEY: z.string().default("S3RVER"),
  S3_FORCE_PATH_STYLE: z
    .enum(["true", "false"])
    .default("true")
    .transform((v) => v === "true"),
  SMTP_URL: z.string().default("smtp://127.0.0.1:1025"),
  MAIL_FROM: z.string().default("Countersign <no-reply@countersign.test>"),
  SESSION_SECRET: z
    .string()
    .default("dev-only-secret-change-me")
    .transform((v) => v.split(",").map((s) => s.trim()).filter(Boolean))
    .pipe(z.array(z.string().min(8)).min(1)),
  APP_URL: z.string().url().default("http://127.0.0.1:3000"),
  MAX_FORM_BYTES: z.coerce.number().int().positive().default(1_048_576),
  /** Encrypts engineers' signing keys at rest. Changing it makes existing keys unusable (engineers are re-verified). */
  SIGNING_KEY_SECRET: z.string().min(16).default("dev-only-signing-key-secret"),
  // Drawing uploads: the largest PDF and the most pages accepted, and where uploads wait while being checked.
  UPLOAD_MAX_BYTES: z.coerce.number().int().positive().default(200 * 1024 * 1024),
  UPLOAD_MAX_PAGES: z.coerce.number().int().positive().default(100),
  UPLOAD_TMP_DIR: z.string().optional(),
  // Lifetime of presigned download links, in seconds.
  DOWNLOAD_URL_TTL_SECONDS: z.coerce.number().int().min(30).max(3600).default(300),
  // The PostgreSQL schema of the job queue. Servers that share a database share the queue only if this matches.
  JOBS_SCHEMA: z.string().regex(/^[a-z_][a-z0-9_]{0,62}$/, "a lower-case PostgreSQL identifier").default("pgboss"),
  // Run the background job worker in this process (set false for a web-only process).
  JOBS_WORKER: z
    .enum(["true", "false"])
    .default("true")
    .transform((v) => v === "true"),
});

export type Env = z.infer<typeof schema>;

function readEnv(): Env {
  const parsed = schema.safeParse(process.env);
  if (!parsed.success) {
    const lines = parsed.error.issues.map((i) => `  ${i.path.join(".")}: ${i.message}`).join("\n");
    throw new Error(`Countersign cannot start: the environment is invalid.\n${lines}`);
  }
  if (parsed.data.NODE_ENV === "production" && parsed.data.APP_URL.startsWith("https:")) {
    if (parsed.data.SESSION_SECRET.some((s) => s.startsWith("dev-only") || s === "change-me-in-production")) {
      throw new Error("Countersign cannot start: set SESSION_SECRET to a real secret for an https deployment.");
    }
    if (parsed.data.SIGNING_KEY_SECRET.startsWith("dev-only")) {
      throw new Error("Countersign cannot start: set SIGNING_KEY_SECRET for an https deployment.");
    }
  }
  return parsed.data;
}

export const env = readEnv();

/** The part of the configuration the browser may see. Nothing secret goes here. */
export function publicEnv() {
  return { appUrl: env.APP_URL };
}
