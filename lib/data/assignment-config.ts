import "server-only";
import type { Includeable } from "sequelize";
import type { AssignmentConfig } from "@/lib/config/site-config";
import { Assignment, AssignmentTagOverride, ProfileRevision, ReductionProfile, Tag } from "@/models";

/** What to load with a tag group to know its assignment (revision, profile name, tag overrides by name). */
export const ASSIGNMENT_INCLUDE: Includeable[] = [
  {
    model: Assignment,
    as: "assignment",
    required: false,
    include: [
      {
        model: ProfileRevision,
        as: "revision",
        attributes: ["id", "number", "profileId"],
        include: [{ model: ReductionProfile, as: "profile", attributes: ["id", "name"] }],
      },
      { model: AssignmentTagOverride, as: "tagOverrides", include: [{ model: Tag, as: "tag", attributes: ["id", "name"] }] },
    ],
  },
];

const byCodeUnit = (a: string, b: string) => (a < b ? -1 : a > b ? 1 : 0);

/** A loaded assignment as the configuration snapshot holds it. */
export function assignmentConfig(a: Assignment | null): AssignmentConfig | null {
  if (!a || !a.revision) return null;
  const tags = (a.tagOverrides ?? [])
    .map((o) => ({ tag: (o as AssignmentTagOverride & { tag?: Tag }).tag?.name ?? "", overrides: o.overrides }))
    .filter((o) => o.tag !== "")
    .sort((x, y) => byCodeUnit(x.tag, y.tag));
  return {
    profileId: a.revision.profileId,
    profile: a.revision.profile?.name ?? "",
    revision: a.revision.number,
    revisionId: a.revision.id,
    overrides: a.overrides,
    tags,
  };
}
