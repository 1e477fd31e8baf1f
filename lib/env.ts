import { z } from "zod";

/** Fixed signing secret for local development only; production must set NEXTAUTH_SECRET. */
const DEV_SECRET = "stokeline-local-development-secret-not-for-production";

const optionalText = z
  .string()
  .trim()
  .transform((v) => (v === "" ? undefined : v))
  .optional();

const envSchema = z.object({
  NODE_ENV: z.enum(["development", "production", "test"]).default("development"),
  DATABASE_URL: z
    .string()
    .trim()
    .default("file:data/stokeline.db")
    .transform((v) => (v === "" ? "file:data/stokeline.db" : v))
    .refine((v) => /^(file:|libsql:|https?:|wss?:)/.test(v), {
      message: "must start with file:, libsql:, http(s): or ws(s): (for example file:data/stokeline.db)",
    }),
  DATABASE_AUTH_TOKEN: optionalText,
  NEXTAUTH_SECRET: optionalText,
  NEXTAUTH_URL: optionalText.pipe(z.url({ message: "must be a full URL such as http://localhost:3000" }).optional()),
  SMTP_URL: optionalText.pipe(
    z
      .string()
      .regex(/^smtps?:\/\//, { message: "must start with smtp:// or smtps://" })
      .optional(),
  ),
  MAIL_FROM: optionalText.transform((v) => v ?? "Stokeline <no-reply@stokeline.local>"),
  STORAGE_DIR: optionalText.transform((v) => v ?? "data/files"),
  MAX_UPLOAD_BYTES: optionalText.pipe(
    z
      .string()
      .regex(/^[1-9][0-9]*$/, { message: "must be a positive whole number of bytes" })
      .transform(Number)
      .optional(),
  ),
});

export type Env = {
  nodeEnv: "development" | "production" | "test";
  databaseUrl: string;
  databaseAuthToken: string | undefined;
  nextAuthSecret: string;
  appUrl: string;
  smtpUrl: string | undefined;
  mailFrom: string;
  storageDir: string;
  maxUploadBytes: number;
};

/**
 * Parses the process environment once per call (cheap; tests change it between files).
 * Throws an Error whose message names the offending variable and says what to set.
 * NEXTAUTH_SECRET is required when NODE_ENV=production, except while `next build`
 * collects pages (NEXT_PHASE=phase-production-build), when no request is signed.
 */
export function getEnv(source: NodeJS.ProcessEnv = process.env): Env {
  const parsed = envSchema.safeParse(source);
  if (!parsed.success) {
    const issue = parsed.error.issues[0];
    const name = String(issue.path[0] ?? "environment");
    throw new Error(`Environment variable ${name} ${issue.message}. Fix it in .env.local or the process environment.`);
  }
  const e = parsed.data;
  const building = source.NEXT_PHASE === "phase-production-build";
  if (e.NODE_ENV === "production" && !e.NEXTAUTH_SECRET && !building) {
    throw new Error(
      "Environment variable NEXTAUTH_SECRET is required in production: set it to a long random string (for example `openssl rand -base64 32`).",
    );
  }
  return {
    nodeEnv: e.NODE_ENV,
    databaseUrl: e.DATABASE_URL,
    databaseAuthToken: e.DATABASE_AUTH_TOKEN,
    nextAuthSecret: e.NEXTAUTH_SECRET ?? DEV_SECRET,
    appUrl: (e.NEXTAUTH_URL ?? "http://localhost:3000").replace(/\/+$/, ""),
    smtpUrl: e.SMTP_URL,
    mailFrom: e.MAIL_FROM,
    storageDir: e.STORAGE_DIR,
    maxUploadBytes: e.MAX_UPLOAD_BYTES ?? 26214400,
  };
}
