import { z } from "zod";
import { ROLES } from "@/lib/permissions";
import { NAME_CONTROL_MESSAGE, noControlInName } from "./text";

export const roleSchema = z.enum(ROLES, { message: "Choose viewer, engineer, reviewer or admin." });

export const createUserSchema = z.object({
  email: z.string().trim().toLowerCase().min(1, "Enter an e-mail address.").max(191).email("Enter a valid e-mail address."),
  name: z.string().trim().min(1, "Enter a name.").max(120, "At most 120 characters.").refine(noControlInName, NAME_CONTROL_MESSAGE),
  role: roleSchema,
});
export type CreateUserInput = z.input<typeof createUserSchema>;

export const updateUserSchema = z
  .object({
    name: z.string().trim().min(1, "Enter a name.").max(120, "At most 120 characters.").refine(noControlInName, NAME_CONTROL_MESSAGE).optional(),
    role: roleSchema.optional(),
    active: z.boolean({ message: "active must be true or false." }).optional(),
  })
  .strict()
  .refine((v) => v.name !== undefined || v.role !== undefined || v.active !== undefined, {
    message: "Change at least one of name, role or active.",
    path: ["body"],
  });
export type UpdateUserInput = z.input<typeof updateUserSchema>;
