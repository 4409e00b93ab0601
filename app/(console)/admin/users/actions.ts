"use server";

import { revalidatePath } from "next/cache";
import { z } from "zod";
import { runAction } from "@/lib/actions";
import { createUser, resetPassword, updateUser } from "@/lib/data/users";
import { assertWellFormedText } from "@/lib/http";
import { idSchema } from "@/schemas/site";
import { updateUserSchema, type CreateUserInput, type UpdateUserInput } from "@/schemas/user";

// Create an account; the generated password comes back once
export async function createUserAction(input: CreateUserInput) {
  const result = await runAction("fleet.admin", (actor) => {
    // Text that is not Unicode (a lone surrogate) is refused before it reaches the database.
    assertWellFormedText(input);
    return createUser(actor, input);
  });
  if (result.ok) revalidatePath("/admin/users");
  return result;
}

const updateInput = z.object({ id: idSchema, patch: updateUserSchema });

// Change a user's name, role or active flag (the last active admin stays)
export async function updateUserAction(input: { id: number; patch: UpdateUserInput }) {
  const result = await runAction("fleet.admin", (actor) => {
    assertWellFormedText(input);
    const { id, patch } = updateInput.parse(input);
    return updateUser(actor, id, patch);
  });
  if (result.ok) revalidatePath("/admin/users");
  return result;
}

// Replace a user's password with a generated one, shown once
export async function resetPasswordAction(input: { id: number }) {
  return runAction("fleet.admin", (actor) => resetPassword(actor, z.object({ id: idSchema }).parse(input).id));
}
