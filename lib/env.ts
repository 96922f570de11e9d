import { z } from "zod";

/**
 * Every environment variable the app reads, parsed once. Anything invalid
 * stops the process at start with the variable's name, instead of failing
 * later in a request.
 */
const envSchema = z.object({
  NODE_ENV: z.enum(["development", "production", "test"]).default("development"),
  /** Any libSQL URL: `file:` for the embedded database, `libsql://` or `http(s)://` for a server. */
  DATABASE_URL: z
    .string()
    .regex(/^(file:|libsql:|https?:|wss?:|:memory:)/, "must be a libSQL URL (file:, libsql:, http(s):, ws(s):)")
    .default("file:data/joulepath.db"),
  DATABASE_AUTH_TOKEN: z.string().min(1).optional(),
  /** Public origin of the console, used in e-mailed links and Origin checks. */
  APP_URL: z.url().default("http://localhost:3000"),
  /** Where outgoing mail goes; the default is the local mail sink (`workers/mail-sink.ts`). */
  SMTP_URL: z
    .string()
    .regex(/^smtps?:\/\//, "must be an smtp:// or smtps:// URL")
    .default("smtp://127.0.0.1:2525"),
  /** Sender of every e-mail the console sends. */
  MAIL_FROM: z.string().min(1).default("Joulepath <no-reply@joulepath.invalid>"),
  /** JSON API of the local mail sink, read by the dev inbox page and the e2e tests. */
  MAIL_SINK_API_URL: z.url().default("http://127.0.0.1:2526"),
  /** Where uploaded floor plans are stored (created if missing); files get random names. */
  UPLOAD_DIR: z.string().min(1).default("data/uploads"),
  /** "1" turns on developer-only pages such as /dev/mail; anything else leaves them 404. */
  JOULEPATH_DEV_TOOLS: z.enum(["0", "1"]).default("0"),
  /** Notices: the local push service (`workers/push-service.ts`); set, browsers may take demo subscriptions from it. */
  PUSH_SERVICE_URL: z.url().optional(),
  /** Notices: the VAPID key pair (RFC 8292, base64url); unset, one is generated once and kept in app_settings. */
  VAPID_PUBLIC_KEY: z.string().regex(/^B[A-Za-z0-9_-]{86}$/, "must be a 65-octet P-256 public key in base64url").optional(),
  VAPID_PRIVATE_KEY: z.string().regex(/^[A-Za-z0-9_-]{43}$/, "must be a 32-octet P-256 private key in base64url").optional(),
  VAPID_SUBJECT: z.string().regex(/^(mailto:|https:)/, "must be a mailto: or https: URI (RFC 8292 §2.1)").default("mailto:notices@joulepath.invalid"),
});

export type Env = z.infer<typeof envSchema>;

export function parseEnv(source: Record<string, string | undefined>): Env {
  const result = envSchema.safeParse(source);
  if (!result.success) {
    const lines = result.error.issues.map((i) => `  ${i.path.join(".")}: ${i.message}`);
    throw new Error(`Invalid environment:\n${lines.join("\n")}`);
  }
  return result.data;
}

let cached: Env | undefined;

/** The validated environment (read on first use, then kept). */
export function env(): Env {
  cached ??= parseEnv(process.env);
  return cached;
}
