import { z } from "zod";

/** A check-in report (DESIGN.md "Gateway API"): counters cover `from`–`to`, since the previous report. */
export const checkInShape = z
  .object({
    report: z.uuid({ message: "must be a UUID" }),
    release: z.int().min(1).max(4_294_967_295),
    digest: z.string().regex(/^[0-9a-f]{64}$/, "must be the bundle's SHA-256 in lowercase hex"),
    status: z.enum(["running", "failed"]),
    appliedAt: z.iso.datetime({ offset: true, message: "must be an ISO 8601 time" }),
    pointsIn: z.int().min(0).max(Number.MAX_SAFE_INTEGER),
    pointsOut: z.int().min(0).max(Number.MAX_SAFE_INTEGER),
    from: z.iso.datetime({ offset: true, message: "must be an ISO 8601 time" }),
    to: z.iso.datetime({ offset: true, message: "must be an ISO 8601 time" }),
    message: z.string().max(2000).optional(),
    unknownTags: z.array(z.string().min(1).max(255)).max(5000).optional(),
  })
  .strict();

// The times are stored as DATETIME(3), which holds the years 1000 to 9999.
const STORABLE_FROM_MS = Date.UTC(1000, 0, 1);
const STORABLE_TO_MS = Date.UTC(9999, 11, 31, 23, 59, 59, 999);

// pointsOut may exceed pointsIn: a tag with several outputs (shape and statistics) can send more than it read.
export const checkInSchema = checkInShape
  .superRefine((r, ctx) => {
    for (const key of ["appliedAt", "from", "to"] as const) {
      const ms = Date.parse(r[key]);
      if (!(ms >= STORABLE_FROM_MS && ms <= STORABLE_TO_MS)) ctx.addIssue({ code: "custom", path: [key], message: "must lie between 1000-01-01 and 9999-12-31" });
    }
  })
  .refine((r) => Date.parse(r.from) <= Date.parse(r.to), { message: "must not be after to", path: ["from"] });
