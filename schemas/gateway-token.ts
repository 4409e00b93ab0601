import { z } from "zod";

export const TOKEN_LABEL_MAX = 120;

/** Issuing a gateway token: an optional label to tell it apart (where it is deployed, why it was issued). */
export const issueTokenSchema = z
  .object({
    label: z
      .string({ message: "The label must be text." })
      .trim()
      .max(TOKEN_LABEL_MAX, `At most ${TOKEN_LABEL_MAX} characters.`)
      .regex(/^[^\p{Cc}]*$/u, "No control characters (such as line breaks).")
      .default(""),
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
