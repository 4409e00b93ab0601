import { z } from "zod";

// An empty variable (SMTP_URL= in a unit file) counts as unset.
const blankIsUnset = <T extends z.ZodType>(inner: T) => z.preprocess((v) => (v === "" ? undefined : v), inner);

// The app's configuration, validated once. Nothing else reads process.env.
const schema = z.object({
  DATABASE_URL: z
    .string()
    .regex(/^mariadb:\/\//, "DATABASE_URL must be a mariadb:// URL")
    .default("mariadb://sluice@127.0.0.1:3307/sluice"),
  NEXTAUTH_SECRET: z.string().min(16).optional(),
  NEXTAUTH_URL: z.string().url().optional(),
  SLUICE_DATA_DIR: z.string().default(".data"),
  /** The registry's signing keys as JSON (several app instances must share them); see lib/bundles/README.md. */
  SLUICE_SIGNING_KEYS: z.string().optional(),
  /** Or a mounted file holding that JSON. Without either, one machine generates keys under SLUICE_DATA_DIR. */
  SLUICE_SIGNING_KEYS_FILE: z.string().optional(),
  SLUICE_SQL_LOG: z.enum(["0", "1"]).default("0"),
  /** Outgoing mail server, smtp://[user:pass@]host:port or smtps://…; unset = no mail is sent. */
  SMTP_URL: blankIsUnset(
    z
      .string()
      .url()
      .refine((v) => /^smtps?:\/\//.test(v), "SMTP_URL must be an smtp:// or smtps:// URL")
      .optional(),
  ),
  MAIL_FROM: blankIsUnset(z.string().min(3).default("Sluice <sluice@localhost>")),
  /** Where the local SMTP catcher keeps messages; the Mail admin page lists them. */
  SLUICE_MAIL_DIR: blankIsUnset(z.string().optional()),
  /** The console's address in links sent by mail; falls back to NEXTAUTH_URL. */
  PUBLIC_URL: blankIsUnset(z.string().url().optional()),
  NODE_ENV: z.enum(["development", "production", "test"]).default("development"),
});

export type Env = z.infer<typeof schema>;

let cached: Env | null = null;

/** The validated environment; throws naming the bad variable. */
export function env(): Env {
  if (cached) return cached;
  const parsed = schema.safeParse(process.env);
  if (!parsed.success) {
    const issue = parsed.error.issues[0];
    throw new Error(`configuration: ${issue.path.join(".")}: ${issue.message}`);
  }
  cached = parsed.data;
  return cached;
}
