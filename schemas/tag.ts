import { z } from "zod";
import { patternProblem } from "@/lib/tags/selector";
import { SLUG_PATTERN } from "@/schemas/site";
import { TEXT_CONTROL_MESSAGE, noControlInText } from "@/schemas/text";

/** Tag kinds (DESIGN.md "Tag", "Signals"): analog values, discrete states, counters (totalisers). */
export const TAG_KINDS = ["analog", "discrete", "counter"] as const;
export type TagKind = (typeof TAG_KINDS)[number];

/** Longest tag name: fits a utf8mb4 VARCHAR(191) index in MariaDB. */
export const TAG_NAME_MAX = 191;
/** Sample periods run from 100 ms to 60 s in practice; up to a day is accepted. */
export const SAMPLE_PERIOD_MAX_MS = 86_400_000;

// C0 controls, DEL and C1 controls.
const CONTROL_CHARS = /[\u0000-\u001F\u007F-\u009F]/;

const tagName = z
  .string({ error: "Enter the tag name." })
  .trim()
  .min(1, "Enter the tag name.")
  .max(TAG_NAME_MAX, `A tag name has at most ${TAG_NAME_MAX} characters.`)
  .refine((s) => !CONTROL_CHARS.test(s), "A tag name cannot contain control characters (tabs, line breaks).");

const UNIT_MESSAGE = "Give the engineering unit (e.g. degC, kPa, m3/h; 'state' for discrete)";
const unit = z
  .string({ error: UNIT_MESSAGE })
  .trim()
  .min(1, UNIT_MESSAGE)
  .max(32, "A unit has at most 32 characters.")
  .refine((s) => !CONTROL_CHARS.test(s), "A unit cannot contain control characters.");

const samplePeriodMs = z
  .number({ error: "Give the sample period in milliseconds." })
  .int("The sample period is a whole number of milliseconds.")
  .min(1, "The sample period is at least 1 ms.")
  .max(SAMPLE_PERIOD_MAX_MS, "The sample period is at most 86,400,000 ms (a day).");

const kind = z.enum(TAG_KINDS, { error: "Choose analog, discrete or counter." });

const rangeEnd = z
  .number({ error: "The engineering range is a number." })
  .nullish()
  .transform((v) => v ?? null);

/** Area or equipment (ISA-95 style hierarchy): optional; an empty string means none. */
const hierarchyLevel = (label: string) =>
  z
    .string({ error: `${label} is text.` })
    .trim()
    .max(64, `${label} has at most 64 characters.`)
    .refine(noControlInText, `${label} cannot contain control characters other than tabs and line breaks.`)
    .nullish()
    .transform((v) => (v ? v : null));

const gatewaySlug = z
  .string({ error: "Choose the gateway that collects this tag." })
  .trim()
  .min(1, "Choose the gateway that collects this tag.")
  .max(64, "A gateway slug has at most 64 characters.")
  .regex(SLUG_PATTERN, "A gateway slug has lower-case letters, digits and single hyphens, no hyphen at either end.");

/**
 * One tag of a site's inventory (DESIGN.md "Tag"), shared by the tag form, server actions,
 * route handlers and the CSV import. The engineering range is optional, but when given
 * both ends are needed and low < high (the issue is reported on `euHigh`).
 */
export const tagSchema = z
  .object({
    name: tagName,
    unit,
    samplePeriodMs,
    kind,
    euLow: rangeEnd,
    euHigh: rangeEnd,
    area: hierarchyLevel("An area"),
    equipment: hierarchyLevel("An equipment name"),
    gateway: gatewaySlug,
  })
  .superRefine((tag, ctx) => {
    const { euLow, euHigh } = tag;
    if ((euLow === null) !== (euHigh === null)) {
      ctx.addIssue({
        code: "custom",
        path: [euLow === null ? "euLow" : "euHigh"],
        message: "Give both ends of the engineering range, or neither.",
      });
    } else if (euLow !== null && euHigh !== null && !(euLow < euHigh)) {
      ctx.addIssue({ code: "custom", path: ["euHigh"], message: "low must be below high" });
    }
  });
export type TagInput = z.input<typeof tagSchema>;
export type TagValues = z.output<typeof tagSchema>;

const unique = <T>(list: T[]): T[] => [...new Set(list)];
const list = <S extends z.ZodType>(item: S) => z.array(item).default([]).transform(unique);

const period = z
  .number({ error: "A sample period limit is a number of milliseconds." })
  .int("A sample period limit is a whole number of milliseconds.")
  .min(1, "A sample period limit is at least 1 ms.")
  .max(SAMPLE_PERIOD_MAX_MS, "A sample period limit is at most 86,400,000 ms (a day).")
  .nullish()
  .transform((v) => v ?? null);

const pattern = z
  .string({ error: "A pattern is text." })
  .trim()
  .superRefine((p, ctx) => {
    const problem = patternProblem(p);
    if (problem) ctx.addIssue({ code: "custom", message: problem });
  });

/** A filter value; `multiLine` where the tag field it matches may hold line breaks (area, equipment). */
const text = (label: string, max: number, multiLine = false) =>
  z
    .string({ error: `${label} is text.` })
    .trim()
    .min(1, `Remove the empty ${label.toLowerCase()} entry.`)
    .max(max, `${label} has at most ${max} characters.`)
    .refine(multiLine ? noControlInText : (s) => !CONTROL_CHARS.test(s), `${label} cannot contain control characters${multiLine ? " other than tabs and line breaks" : ""}.`);

/**
 * A tag group's selector (DESIGN.md "Tag group"). Lists are trimmed and de-duplicated
 * (first occurrence kept); empty entries are refused, because dropping one would widen a
 * filter. What a selector matches is defined by `compileSelector` in lib/tags/selector.ts.
 */
export const selectorSchema = z
  .object({
    patterns: list(pattern),
    units: list(text("Unit", 32)),
    kinds: list(kind),
    areas: list(text("Area", 64, true)),
    equipment: list(text("Equipment", 64, true)),
    gateways: list(gatewaySlug),
    minPeriodMs: period,
    maxPeriodMs: period,
    include: list(tagName),
    exclude: list(tagName),
  })
  .superRefine((sel, ctx) => {
    const included = new Set(sel.include);
    const both = sel.exclude.filter((n) => included.has(n));
    if (both.length > 0) {
      const shown = both.slice(0, 5).map((n) => `"${n}"`).join(", ");
      const more = both.length > 5 ? ` and ${both.length - 5} more` : "";
      ctx.addIssue({
        code: "custom",
        path: ["exclude"],
        message: `${shown}${more} ${both.length === 1 ? "is" : "are"} in both include and exclude; keep each name in one list.`,
      });
    }
    if (sel.minPeriodMs !== null && sel.maxPeriodMs !== null && sel.minPeriodMs > sel.maxPeriodMs) {
      ctx.addIssue({
        code: "custom",
        path: ["maxPeriodMs"],
        message: "The longest sample period cannot be below the shortest.",
      });
    }
  });
export type SelectorInput = z.input<typeof selectorSchema>;
export type Selector = z.output<typeof selectorSchema>;

/** A tag group on one site: free-text name, description, regulated-record flag and selector. */
export const groupSchema = z.object({
  name: z
    .string({ error: "Enter a name." })
    .trim()
    .min(1, "Enter a name.")
    .max(80, "A group name has at most 80 characters.")
    .refine((s) => !CONTROL_CHARS.test(s), "A group name cannot contain control characters."),
  description: z.string().trim().max(500, "At most 500 characters.").refine(noControlInText, TEXT_CONTROL_MESSAGE).default(""),
  /** Flags the group as a regulated record (DESIGN.md "Cautions shown to users"). */
  regulated: z.boolean({ error: "regulated must be true or false." }).default(false),
  selector: selectorSchema.prefault({}),
});
export type GroupInput = z.input<typeof groupSchema>;
export type GroupValues = z.output<typeof groupSchema>;
