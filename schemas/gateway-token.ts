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
  tokenId: z.coerce.number({ message: "The token id must be a number." }).int("The token id is a whole number.").positive("The token id is a positive number."),
});
