import { z } from "zod";
import type { Profile } from "@/lib/reduction/profile";
import { profileDocumentSchema } from "@/schemas/profile";
import { toDocument, type ProfileDraft } from "./profile-draft";

/**
 * The editor's resolver schema: the draft turned into its document, then the one profile
 * schema. Issue paths are document paths, which are also the draft's field names.
 */
export const profileFormSchema = z
  .custom<ProfileDraft>((v) => typeof v === "object" && v !== null)
  .transform((draft) => toDocument(draft) as z.input<typeof profileDocumentSchema>)
  .pipe(profileDocumentSchema);

export type ProfileFormOutput = Profile;
