import { z } from "zod";
import { type DocumentProblem, formatPath, magnitudeMessage, semanticProblems } from "@/lib/profiles/problems";
import { AGGREGATE_FNS } from "@/lib/reduction/aggregate";
import { METHODS } from "@/lib/reduction/methods";
import type { Profile, StepMethod } from "@/lib/reduction/profile";
import { OUTPUT_NAME_PATTERN, TAG_KINDS } from "@/lib/reduction/profile-names";
import { TEXT_CONTROL_MESSAGE, noControlInName, noControlInText } from "./text";

// One schema for the profile editor (zodResolver), server actions (safeParse) and route
// handlers (.parse → 422). schemas/profile.schema.json is the same document as a JSON
// Schema contract; tests/unit/profiles keeps the two agreeing.

const PERCENT_MESSAGE = "A percent of the engineering range is more than 0 and at most 100.";
const UNIT_MESSAGE = "Give the unit (at most 32 characters).";
const OUTPUT_NAME_MESSAGE = "An output name is 1–32 lower-case letters, digits, - or _, starting with a letter or digit.";
const LABELS: Record<string, string> = { "max-interval": "max interval", "reset-share": "reset share", points: "number of points" };

const notInMagnitude = (iss: z.core.$ZodRawIssue) =>
  iss.code === "unrecognized_keys" ? `${iss.keys.map((k) => `"${k}"`).join(", ")} does not belong in a magnitude ({ value, unit } or { percent }).` : undefined;
const unit = z.string({ error: UNIT_MESSAGE }).min(1, UNIT_MESSAGE).max(32, UNIT_MESSAGE).regex(/\S/, UNIT_MESSAGE).refine(noControlInName, "A unit cannot contain control characters.");
const percent = z.strictObject({ percent: z.number({ error: PERCENT_MESSAGE }).gt(0, PERCENT_MESSAGE).max(100, PERCENT_MESSAGE) }, { error: notInMagnitude });

/** An absolute { value, unit } or a { percent } of the engineering range; a width's value is ≥ 0. */
export function magnitudeSchemaFor(name: string, kind: "width" | "level") {
  const value = z.number({ error: magnitudeMessage(name) });
  const absolute = z.strictObject({ value: kind === "width" ? value.min(0, `The ${name} is 0 or more.`) : value, unit }, { error: notInMagnitude });
  return z.union([absolute, percent], { error: magnitudeMessage(name) });
}

/** Any magnitude (a level: its value may be negative); fields use {@link magnitudeSchemaFor} for their own message. */
export const magnitudeSchema = magnitudeSchemaFor("magnitude", "level");

/** A number parameter with the bounds METHODS gives it. */
function numberParam(method: StepMethod, name: string) {
  const p = METHODS[method].params.find((x) => x.name === name);
  if (p === undefined) throw new Error(`${method} has no parameter ${name}`);
  const label = LABELS[name] ?? name;
  const s = p.type === "seconds" ? " s" : "";
  let schema = z.number({ error: `Give the ${label} as a number${s ? " of seconds" : ""}.` });
  if (p.type === "integer") schema = schema.int(`The ${label} is a whole number.`);
  if (p.min !== undefined) {
    schema = p.minExclusive ? schema.gt(p.min, `The ${label} is more than ${p.min}${s}.`) : schema.min(p.min, `The ${label} is at least ${p.min}${s}.`);
  }
  if (p.max !== undefined) schema = schema.max(p.max, `The ${label} is at most ${p.max}${s}.`);
  return schema;
}

function choice<const T extends readonly [string, ...string[]]>(values: T) {
  return z.enum(values, { error: `Choose ${values.join(", ")}.` });
}

/** A step of one method: exactly its parameters (METHODS), nothing else. */
function step<const M extends StepMethod, S extends z.ZodRawShape>(method: M, shape: S) {
  const names = METHODS[method].params.map((p) => p.name);
  const takes = names.length ? `it takes ${names.join(", ")}` : "it takes no parameters";
  return z.strictObject({ method: z.literal(method), ...shape }, {
    error: (iss) => (iss.code === "unrecognized_keys" ? `${method} has no parameter ${iss.keys.map((k) => `"${k}"`).join(", ")} (${takes}).` : undefined),
  });
}

const flag = z.boolean({ error: "Choose true or false." });
const direction = choice(["above", "below"]);
const offset = (m: StepMethod) => numberParam(m, "offset").optional();
const windowOf = (m: StepMethod) => numberParam(m, "window");
const counterParams = (m: StepMethod) => ({
  window: windowOf(m),
  rollover: numberParam(m, "rollover"),
  "reset-share": numberParam(m, "reset-share").optional(),
  offset: offset(m),
});

export const stepSchema = z.discriminatedUnion(
  "method",
  [
    step("quality-filter", { keep: choice(["good", "good-and-uncertain"]) }),
    step("pass-through", {}),
    step("drop", {}),
    step("deadband", { deadband: magnitudeSchemaFor("deadband", "width"), "max-interval": numberParam("deadband", "max-interval").optional() }),
    step("swinging-door", { deviation: magnitudeSchemaFor("deviation", "width"), "max-interval": numberParam("swinging-door", "max-interval").optional() }),
    step("lttb", { points: numberParam("lttb", "points") }),
    step("ltob", { points: numberParam("ltob", "points") }),
    step("rdp", { epsilon: magnitudeSchemaFor("epsilon", "width"), distance: choice(["vertical", "perpendicular"]).optional() }),
    step("m4", { window: windowOf("m4"), offset: offset("m4") }),
    step("change-of-state", {}),
    step("aggregate", {
      fn: choice(AGGREGATE_FNS),
      window: windowOf("aggregate"),
      offset: offset("aggregate"),
      calendar: flag.optional(),
      percentile: numberParam("aggregate", "percentile").optional(),
      interpolation: choice(["step", "linear"]).optional(),
      "include-uncertain": flag.optional(),
    }),
    step("exceedance-count", {
      window: windowOf("exceedance-count"),
      threshold: magnitudeSchemaFor("threshold", "level"),
      direction: direction.optional(),
      hysteresis: magnitudeSchemaFor("hysteresis", "width").optional(),
      offset: offset("exceedance-count"),
    }),
    step("exceedance-events", {
      window: windowOf("exceedance-events"),
      threshold: magnitudeSchemaFor("threshold", "level"),
      limit: numberParam("exceedance-events", "limit"),
      direction: direction.optional(),
      hysteresis: magnitudeSchemaFor("hysteresis", "width").optional(),
      offset: offset("exceedance-events"),
    }),
    step("time-above", { window: windowOf("time-above"), threshold: magnitudeSchemaFor("threshold", "level"), offset: offset("time-above") }),
    step("transition-count", { window: windowOf("transition-count"), offset: offset("transition-count") }),
    step("time-in-state", { window: windowOf("time-in-state"), state: numberParam("time-in-state", "state"), offset: offset("time-in-state") }),
    step("counter-delta", counterParams("counter-delta")),
    step("counter-rate", counterParams("counter-rate")),
  ],
  {
    error: (iss) =>
      iss.code === "invalid_union" ? `Choose a method: ${Object.keys(METHODS).join(", ")}.` : iss.code === "invalid_type" ? "A step is an object with a method and its parameters." : undefined,
  },
);

export const outputSchema = z.strictObject(
  {
    name: z.string({ error: OUTPUT_NAME_MESSAGE }).regex(OUTPUT_NAME_PATTERN, OUTPUT_NAME_MESSAGE),
    steps: z.array(stepSchema, { error: "List the output's steps." }).min(1, "An output needs at least one step.").max(16, "An output has at most 16 steps."),
  },
  {
    error: (iss) =>
      iss.code === "unrecognized_keys" ? `An output has a name and steps, not ${iss.keys.join(", ")}.` : iss.code === "invalid_type" ? "An output is an object with a name and steps." : undefined,
  },
);

const NAME_MESSAGE = "Give the profile a name (at most 80 characters).";

const documentShape = z.strictObject(
  {
    name: z
      .string({ error: NAME_MESSAGE })
      .min(1, NAME_MESSAGE)
      .max(80, NAME_MESSAGE)
      .regex(/\S/, NAME_MESSAGE)
      .refine(noControlInName, "A profile name cannot contain control characters (tabs, line breaks)."),
    description: z.string({ error: "The description is text." }).max(2000, "A description has at most 2000 characters.").refine(noControlInText, TEXT_CONTROL_MESSAGE).optional(),
    kinds: z
      .array(choice(TAG_KINDS), { error: "Choose the tag kinds the profile is meant for." })
      .min(1, "Choose the tag kinds the profile is meant for.")
      .refine((kinds) => new Set(kinds).size === kinds.length, "A kind is listed twice."),
    outputs: z.array(outputSchema, { error: "List the profile's outputs." }).min(1, "A profile needs at least one output.").max(16, "A profile has at most 16 outputs."),
  },
  {
    error: (iss) =>
      iss.code === "unrecognized_keys"
        ? `A profile has name, description, kinds and outputs, not ${iss.keys.join(", ")}.`
        : iss.code === "invalid_type"
          ? "A profile is an object with name, kinds and outputs."
          : undefined,
  },
);

/**
 * A profile document: the structure above, then (when that holds) the rules only
 * validateProfile knows — output names unique, percentile and interpolation only with
 * their fn, calendar windows of an hour or more, every step suiting every kind — each
 * as an issue at its field, e.g. ["outputs", 0, "steps", 1, "percentile"].
 */
export const profileDocumentSchema = documentShape.superRefine((doc, ctx) => {
  if (ctx.issues.length > 0) return;
  for (const p of semanticProblems(doc)) ctx.addIssue({ code: "custom", path: p.path, message: sentence(p.message) });
});

const note = z.string({ error: "A note is text." }).trim().max(500, "A note has at most 500 characters.").refine(noControlInText, TEXT_CONTROL_MESSAGE).default("");

/** A new revision of a profile; `baseRevision` is the revision the editor started from. */
export const profileSaveSchema = z.object({
  document: profileDocumentSchema,
  note,
  baseRevision: z.number({ error: "baseRevision is a revision number." }).int().positive().optional(),
});

/** A new profile (its first revision). */
export const profileCreateSchema = z.object({ document: profileDocumentSchema, note });

export type MagnitudeValues = z.infer<typeof magnitudeSchema>;
export type StepValues = z.infer<typeof stepSchema>;
export type OutputValues = z.infer<typeof outputSchema>;
export type ProfileDocument = z.infer<typeof profileDocumentSchema>;
export type ProfileSaveInput = z.input<typeof profileSaveSchema>;
export type ProfileSaveValues = z.output<typeof profileSaveSchema>;
export type ProfileCreateValues = z.output<typeof profileCreateSchema>;

/**
 * zod issues as field errors with paths like `outputs[0].steps[1].deviation` (the
 * format of checkProfileDocument); an unknown key becomes an error at that key.
 */
export function zodIssuesToFieldErrors(issues: readonly z.core.$ZodIssue[]): { path: string; message: string }[] {
  return issues.flatMap((i): DocumentProblem[] => {
    const path = i.path.filter((s) => typeof s !== "symbol");
    return i.code === "unrecognized_keys" ? i.keys.map((k) => ({ path: [...path, k], message: i.message })) : [{ path, message: i.message }];
  }).map((p) => ({ path: formatPath(p.path), message: p.message }));
}

function sentence(message: string): string {
  const s = message.charAt(0).toUpperCase() + message.slice(1);
  return /[.!?)]$/.test(s) ? s : `${s}.`;
}

// The schema's output is exactly the document type the runner reads.
type Same<A, B> = [A] extends [B] ? ([B] extends [A] ? true : false) : false;
const sameAsProfile: Same<ProfileDocument, Profile> = true;
void sameAsProfile;
