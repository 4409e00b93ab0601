import { z } from "zod";

export const TOKEN_LABEL_MAX = 120;

/** The longest lifetime a token can be given (ten years); without one it lives until revoked. */
export const TOKEN_DAYS_MAX = 3650;
/** Lifetimes the console offers; the API takes any whole number of days up to TOKEN_DAYS_MAX. */
export const TOKEN_DAYS_CHOICES = [30, 90, 180, 365, 730] as const;

/**
 * Issuing a gateway token: an optional label to tell it apart (where it is deployed, why it
 * was issued) and an optional lifetime in days (null or absent: until revoked).
 */
export const issueTokenSchema = z
  .object({
    label: z
      .string({ message: "The label must be text." })
      .trim()
      .max(TOKEN_LABEL_MAX, `At most ${TOKEN_LABEL_MAX} characters.`)
      .regex(/^[^\p{Cc}]*$/u, "No control characters (such as line breaks).")
      .default(""),
    expiresInDays: z
      .number({ message: "The lifetime must be a number of days." })
      .int("The lifetime is a whole number of days.")
      .min(1, "At least 1 day.")
      .max(TOKEN_DAYS_MAX, `At most ${TOKEN_DAYS_MAX} days.`)
      .nullable()
      .default(null),
  })
  .strict();
export type IssueTokenInput = z.input<typeof issueTokenSchema>;
export type IssueTokenValues = z.output<typeof issueTokenSchema>;

/** A token's id as it arrives in a path or on the command line. */
export const tokenRefSchema = z.object({
  // Text (a path, the command line) or a number: only text is converted, so true or [5] are not read as 1 or 5.
  tokenId: z.preprocess(
    (v) => (typeof v === "string" && v.trim() !== "" ? Number(v) : v),
    z.number({ message: "The token id must be a number." }).int("The token id is a whole number.").positive("The token id is a positive number."),
  ),
});
