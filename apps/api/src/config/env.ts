import path from "node:path";
import { fileURLToPath } from "node:url";
import { z } from "zod";

/** The repository root, for files the API serves or reads (migrations, the built web app). */
export const repoRoot = path.resolve(path.dirname(fileURLToPath(import.meta.url)), "../../../..");

const envSchema = z.object({
  NODE_ENV: z.enum(["development", "test", "production"]).default("development"),
  HOST: z.string().default("127.0.0.1"),
  PORT: z.coerce.number().int().min(0).max(65535).default(8080),
  DATABASE_URL: z.string().url(),
  /** Base URL written into e-mailed links; defaults to http://HOST:PORT. */
  PUBLIC_URL: z.string().url().optional(),
  /** Folder of the built web app; the API serves it when set (start mode). */
  WEB_DIST: z.string().optional(),
  LOG_LEVEL: z.enum(["fatal", "error", "warn", "info", "debug", "trace", "silent"]).default("info"),
  SMTP_HOST: z.string().default("127.0.0.1"),
  SMTP_PORT: z.coerce.number().int().min(1).max(65535).default(2525),
  SMTP_SECURE: z.enum(["true", "false"]).default("false"),
  SMTP_USER: z.string().optional(),
  SMTP_PASSWORD: z.string().optional(),
  MAIL_FROM: z.string().default("Tagloom <no-reply@tagloom.test>"),
  /** HTTP address of the local mail catcher (development only: the Outbox page reads it). */
  MAIL_CATCHER_URL: z.string().url().optional(),
  /** Set to "true" to mark session cookies Secure; defaults to true in production. */
  COOKIE_SECURE: z.enum(["true", "false"]).optional(),
  UPLOAD_DIR: z.string().optional(),
  /** Sign-in, sign-up and password-reset attempts allowed per address per 15 minutes. */
  AUTH_RATE_LIMIT: z.coerce.number().int().min(1).default(20),
  /**
   * Which peers may set X-Forwarded-For (Express "trust proxy"): "false" (default: the peer's own
   * address is the client's, whoever sends the header), a number of proxy hops, or a comma list of
   * addresses and subnets ("loopback", "10.0.0.0/8"). Set it only when a proxy sits in front.
   */
  TRUST_PROXY: z
    .string()
    .trim()
    .regex(/^(false|\d{1,2}|[\w.:/]+(\s*,\s*[\w.:/]+)*)$/, 'use "false", a hop count, or addresses/subnets separated by commas')
    .default("false"),
  /** Upload limits (enforced before any file is read): bytes per file, files and bytes per upload, characters per document. */
  UPLOAD_MAX_FILE_BYTES: z.coerce.number().int().min(1).default(20 * 1024 * 1024),
  UPLOAD_MAX_FILES: z.coerce.number().int().min(1).default(1000),
  UPLOAD_MAX_BYTES: z.coerce.number().int().min(1).default(100 * 1024 * 1024),
  UPLOAD_MAX_DOCUMENT_CHARS: z.coerce.number().int().min(1).default(500_000),
  /** A DOCX (a ZIP archive) may declare and unpack at most this many bytes, in at most this many parts. */
  UPLOAD_MAX_DOCX_UNPACKED_BYTES: z.coerce.number().int().min(1).default(64 * 1024 * 1024),
  UPLOAD_MAX_DOCX_ENTRIES: z.coerce.number().int().min(1).default(5000),
  /** A PDF may have at most this many pages, and its reading stops after this many seconds. */
  UPLOAD_MAX_PDF_PAGES: z.coerce.number().int().min(1).default(2000),
  UPLOAD_EXTRACT_SECONDS: z.coerce.number().int().min(1).default(120),
  /** Payments: the SDK's secret key and where its API is (the local fake by default; a real host works unchanged). */
  STRIPE_SECRET_KEY: z.string().min(1).default("sk_test_tagloom_local"),
  STRIPE_API_HOST: z.string().min(1).default("127.0.0.1"),
  STRIPE_API_PORT: z.coerce.number().int().min(1).max(65535).default(2590),
  STRIPE_API_PROTOCOL: z.enum(["http", "https"]).default("http"),
  /** Signing secret of the webhook endpoint /api/billing/webhook. */
  STRIPE_WEBHOOK_SECRET: z.string().min(1).default("whsec_tagloom_local"),
  /** The monthly per-seat price the paid plan subscribes to. */
  STRIPE_SEAT_PRICE: z.string().min(1).default("price_tagloom_seat"),
  /** Seats (members plus pending invitations) the free plan includes. */
  BILLING_FREE_SEATS: z.coerce.number().int().min(1).default(5),
  /** Tagging API (/api/v1): requests allowed per token per window, and the window in seconds (per API process). */
  TAGGING_RATE_LIMIT: z.coerce.number().int().min(1).default(600),
  TAGGING_RATE_WINDOW_SECONDS: z.coerce.number().int().min(1).default(60),
  /** Seconds after which a training job whose worker died (or hung) is retried by another worker. */
  TRAINING_JOB_EXPIRE_SECONDS: z.coerce.number().int().min(1).default(15 * 60),
  /**
   * Seconds after which an extraction job whose worker died (or hung) is retried by another
   * worker: longer than a group of files takes to read (each file stops after UPLOAD_EXTRACT_SECONDS).
   */
  EXTRACT_JOB_EXPIRE_SECONDS: z.coerce.number().int().min(1).default(15 * 60),
  /** Training tokens per shard: a run's documents are counted in slices of about this size. */
  TRAINING_SHARD_TOKENS: z.coerce.number().int().min(1).default(50_000),
  /**
   * Most tokens of documents without gold one run reads (word clusters, EM, sampling): the job
   * holds them in memory, and clustering time grows with the words they bring.
   */
  TRAINING_UNLABELLED_TOKENS: z.coerce.number().int().min(1).default(200_000),
  /** How often a worker's pg-boss looks for expired jobs and does its housekeeping (seconds). */
  JOB_MAINTENANCE_SECONDS: z.coerce.number().int().min(1).default(120),
});

export type Env = z.infer<typeof envSchema> & { publicUrl: string; cookieSecure: boolean; uploadDir: string; trustProxy: false | number | string };

export class EnvError extends Error {}

/** Parses the environment once; lists every missing or invalid variable in one error. */
export function loadEnv(source: NodeJS.ProcessEnv): Env {
  const parsed = envSchema.safeParse(source);
  if (!parsed.success) {
    const lines = parsed.error.issues.map((i) => `  ${i.path.join(".")}: ${i.message}`);
    throw new EnvError(`invalid environment:\n${lines.join("\n")}`);
  }
  const e = parsed.data;
  return {
    ...e,
    publicUrl: (e.PUBLIC_URL ?? `http://${e.HOST}:${e.PORT}`).replace(/\/$/, ""),
    cookieSecure: e.COOKIE_SECURE ? e.COOKIE_SECURE === "true" : e.NODE_ENV === "production",
    uploadDir: e.UPLOAD_DIR ?? path.join(repoRoot, ".data", "uploads"),
    trustProxy: e.TRUST_PROXY === "false" ? false : /^\d+$/.test(e.TRUST_PROXY) ? Number(e.TRUST_PROXY) : e.TRUST_PROXY,
  };
}

// The only read of process.env in the API.
export const env: Env = loadEnv(process.env);
