/** Tag kinds (DESIGN.md "Tag", "Signals"), as in schemas/tag.ts. */
export const TAG_KINDS = ["analog", "discrete", "counter"] as const;
export type TagKind = (typeof TAG_KINDS)[number];

/** Output names: appended to the tag name by the cloud, so short, lower-case and unique within a profile. */
export const OUTPUT_NAME_PATTERN = /^[a-z0-9][a-z0-9_-]{0,31}$/;
