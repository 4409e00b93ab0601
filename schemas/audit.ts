import { z } from "zod";

const optionalText = z
  .string()
  .trim()
  .max(191)
  .optional()
  .transform((v) => (v ? v : undefined));

const optionalTime = z
  .string()
  .trim()
  .optional()
  .transform((v, ctx) => {
    if (!v) return undefined;
    // A time without an offset (as a datetime-local field sends it) is read as UTC.
    const d = new Date(/^\d{4}-\d\d-\d\dT\d\d:\d\d(:\d\d(\.\d+)?)?$/.test(v) ? `${v}Z` : v);
    if (Number.isNaN(d.getTime())) {
      ctx.addIssue({ code: "custom", message: "Give a date and time such as 2026-12-01T08:00Z." });
      return z.NEVER;
    }
    return d;
  });

/** Filters of the audit log, from a query string. */
export const auditQuerySchema = z
  .object({
    site: optionalText,
    user: optionalText,
    action: optionalText,
    from: optionalTime,
    to: optionalTime,
    page: z.coerce.number({ message: "page must be a number." }).int().min(1).max(100000).default(1),
    pageSize: z.coerce.number({ message: "pageSize must be a number." }).int().min(5).max(200).default(25),
  })
  .refine((q) => !q.from || !q.to || q.from <= q.to, { message: "from must not be after to.", path: ["from"] });

export type AuditQuery = z.output<typeof auditQuerySchema>;
