import { z } from "zod";
import { noControlInName } from "./text";

const magnitude = z.union([
  z.object({ value: z.number({ error: "value must be a number" }), unit: z.string().trim().min(1, "Give the unit.").max(32).refine(noControlInName, "A unit cannot contain control characters.") }).strict(),
  z.object({ percent: z.number({ error: "percent must be a number" }).gt(0, "A percent is above 0.").max(100, "A percent is at most 100.") }).strict(),
]);

/** One parameter override: output name, step index (0-based), parameter name, new value. */
export const overrideSchema = z
  .object({
    output: z.string({ error: "Name the output." }).min(1, "Name the output.").max(32),
    step: z.number({ error: "Give the step number." }).int("The step is a whole number.").min(0, "Steps count from 0."),
    parameter: z.string({ error: "Name the parameter." }).min(1, "Name the parameter.").max(40),
    value: z.union([magnitude, z.number(), z.string().max(40), z.boolean()], { error: "Give a value: a number, a value with its unit, or a percent." }),
  })
  .strict();

export const tagOverrideSchema = z
  .object({
    tag: z.string({ error: "Name the tag." }).min(1, "Name the tag.").max(191),
    overrides: z.array(overrideSchema).min(1, "A tag override needs at least one parameter.").max(32, "At most 32 overrides per tag."),
  })
  .strict();

/** PUT body of a group's assignment: the pinned revision, overrides, and the caution acknowledgement when needed. */
export const assignmentSchema = z
  .object({
    profileId: z.number({ error: "Choose a profile." }).int().positive("Choose a profile."),
    revision: z.number({ error: "Choose a revision." }).int().positive("Choose a revision."),
    overrides: z.array(overrideSchema).max(64, "At most 64 group overrides.").default([]),
    tagOverrides: z
      .array(tagOverrideSchema)
      .max(5000, "At most 5,000 tag overrides.")
      .default([])
      .refine((list) => new Set(list.map((t) => t.tag)).size === list.length, "A tag is listed twice; give each tag's overrides once."),
    acknowledge: z.string().max(64).optional(),
  })
  .strict();

export type OverrideInput = z.infer<typeof overrideSchema>;
export type AssignmentInput = z.infer<typeof assignmentSchema>;
