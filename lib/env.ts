import { z } from "zod";

// The app's configuration, validated once. Nothing else reads process.env.
const schema = z.object({
  DATABASE_URL: z
    .string()
    .regex(/^mariadb:\/\//, "DATABASE_URL must be a mariadb:// URL")
    .default("mariadb://sluice@127.0.0.1:3307/sluice"),
  NEXTAUTH_SECRET: z.string().min(16).optional(),
  NEXTAUTH_URL: z.string().url().optional(),
  SLUICE_DATA_DIR: z.string().default(".data"),
  SLUICE_SQL_LOG: z.enum(["0", "1"]).default("0"),
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
