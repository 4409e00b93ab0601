import "server-only";
import { HttpError } from "@/lib/http";
import type { Actor } from "@/lib/auth/guard";
import { profileFromYaml, profileToYaml } from "@/lib/profiles/yaml";
import { ProfileRevision, ReductionProfile } from "@/models";
import { assertCan } from "./access";
import { createProfile, saveRevision } from "./profiles";

export type ImportResult = { id: number; name: string; revision: number; outcome: "created" | "revised" | "unchanged" };

/**
 * Imports one profile from our YAML format: a new profile when the name is new, a new
 * revision when it differs from the latest revision of the profile with that name, and
 * nothing when it is the same. Problems name the path (and line) of the bad field.
 */
export async function importProfile(actor: Actor | null, text: string, note = ""): Promise<ImportResult> {
  assertCan(actor, "config.edit");
  const parsed = profileFromYaml(text);
  if (!parsed.ok) {
    const issues = parsed.problems.map((p) => ({ field: p.path || "file", message: p.line ? `line ${p.line}: ${p.message}` : p.message }));
    throw new HttpError(422, `${issues[0].field}: ${issues[0].message}`, issues[0].field, undefined, issues);
  }
  const doc = parsed.profile;
  const existing = await ReductionProfile.findOne({ where: { name: doc.name } });
  if (!existing) {
    const { id, revision } = await createProfile(actor, { document: doc, note: note || "Imported from YAML" });
    return { id, name: doc.name, revision, outcome: "created" };
  }
  const latest = await ProfileRevision.findOne({ where: { profileId: existing.id, number: existing.latestRevision } });
  if (latest && profileToYaml(latest.document) === profileToYaml(doc)) {
    return { id: existing.id, name: doc.name, revision: existing.latestRevision, outcome: "unchanged" };
  }
  const { revision } = await saveRevision(actor, existing.id, { document: doc, note: note || "Imported from YAML" });
  return { id: existing.id, name: doc.name, revision, outcome: "revised" };
}
