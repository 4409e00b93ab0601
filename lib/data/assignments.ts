import "server-only";
import type { Transaction } from "sequelize";
import { recordAudit } from "@/lib/audit";
import type { Actor } from "@/lib/auth/guard";
import { REGULATED_RECORD_CAUTION } from "@/lib/cautions";
import { checkAssignment, hasLossyStep } from "@/lib/config/assignment-check";
import type { AssignmentConfig, GroupConfig } from "@/lib/config/site-config";
import { HttpError } from "@/lib/http";
import type { ProfileTag } from "@/lib/reduction/profile";
import { assignGroups } from "@/lib/tags/selector";
import { convertUnit } from "@/lib/units";
import { Assignment, AssignmentTagOverride, CautionAcknowledgement, ProfileRevision, ReductionProfile, Site, TagGroup, sequelize } from "@/models";
import { assignmentSchema } from "@/schemas/assignment";
import { assertCan } from "./access";
import { ASSIGNMENT_INCLUDE, assignmentConfig } from "./assignment-config";
import { touchDraft } from "./drafts";
import { loadWorkingConfig } from "./groups";
import { siteBySlug } from "./sites";
import { allTagValues, type TagView } from "./tags";

export type AssignmentView = AssignmentConfig & { latestRevision: number; archived: boolean; lossy: boolean; outputs: string[] };
export type Acknowledgement = { by: string; at: string; cautionId: string; profile: string | null };
export type GroupAssignmentRow = {
  groupId: number;
  group: string;
  priority: number;
  regulated: boolean;
  tagCount: number;
  kinds: string[];
  units: string[];
  assignment: AssignmentView | null;
  acknowledgement: Acknowledgement | null;
};
export type GroupTag = ProfileTag & { id: number };

async function membership(siteId: number, transaction?: Transaction): Promise<{ groups: GroupConfig[]; tagsOf: Map<string, TagView[]> }> {
  const [config, tags] = await Promise.all([loadWorkingConfig(siteId, transaction), allTagValues(siteId, transaction)]);
  const { winner } = assignGroups(tags, config.groups);
  const tagsOf = new Map<string, TagView[]>(config.groups.map((g) => [g.name, []]));
  winner.forEach((g, i) => g !== null && tagsOf.get(g)!.push(tags[i]));
  return { groups: config.groups, tagsOf };
}

const profileTag = (t: TagView): GroupTag => ({ id: t.id, name: t.name, kind: t.kind, unit: t.unit, euLow: t.euLow, euHigh: t.euHigh, samplePeriodMs: t.samplePeriodMs });

async function view(config: AssignmentConfig | null): Promise<AssignmentView | null> {
  if (!config) return null;
  const [profile, revision] = await Promise.all([
    ReductionProfile.findByPk(config.profileId, { attributes: ["latestRevision", "archivedAt"] }),
    ProfileRevision.findByPk(config.revisionId, { attributes: ["document"] }),
  ]);
  const doc = revision!.document;
  return { ...config, latestRevision: profile?.latestRevision ?? config.revision, archived: !!profile?.archivedAt, lossy: hasLossyStep(doc), outputs: doc.outputs.map((o) => o.name) };
}

async function lastAcknowledgement(groupId: number): Promise<Acknowledgement | null> {
  const ack = await CautionAcknowledgement.findOne({ where: { groupId }, order: [["acknowledgedAt", "DESC"], ["id", "DESC"]] });
  if (!ack) return null;
  const rev = ack.profileRevisionId ? await ProfileRevision.findByPk(ack.profileRevisionId, { include: [{ model: ReductionProfile, as: "profile", attributes: ["name"] }] }) : null;
  return { by: ack.userEmail, at: ack.acknowledgedAt.toISOString(), cautionId: ack.cautionId, profile: rev ? `${rev.profile?.name} revision ${rev.number}` : null };
}

async function assignmentRows(site: Site): Promise<{ rows: GroupAssignmentRow[]; tagsOf: Map<string, TagView[]> }> {
  const { tagsOf } = await membership(site.id);
  const groups = await TagGroup.findAll({ where: { siteId: site.id }, include: ASSIGNMENT_INCLUDE, order: [["priority", "ASC"], ["name", "ASC"]] });
  const rows = await Promise.all(
    groups.map(async (g) => {
      const tags = tagsOf.get(g.name) ?? [];
      return {
        groupId: g.id,
        group: g.name,
        priority: g.priority,
        regulated: g.regulated,
        tagCount: tags.length,
        kinds: [...new Set(tags.map((t) => t.kind))].sort(),
        units: [...new Set(tags.map((t) => t.unit))].sort(),
        assignment: await view(assignmentConfig(g.assignment ?? null)),
        acknowledgement: g.regulated ? await lastAcknowledgement(g.id) : null,
      };
    }),
  );
  return { rows, tagsOf };
}

/** Every group of the site in priority order with its assignment, newer revisions and last caution acknowledgement. */
export async function listAssignments(actor: Actor | null, siteSlug: string): Promise<GroupAssignmentRow[]> {
  assertCan(actor, "read");
  return (await assignmentRows(await siteBySlug(siteSlug))).rows;
}

/** One group's assignment with the tags it applies to (for overrides and the unit check). */
export async function getGroupAssignment(actor: Actor | null, siteSlug: string, groupId: number): Promise<GroupAssignmentRow & { tags: GroupTag[]; timeZone: string }> {
  assertCan(actor, "read");
  const site = await siteBySlug(siteSlug);
  const { rows, tagsOf } = await assignmentRows(site);
  const row = rows.find((r) => r.groupId === groupId);
  if (!row) throw new HttpError(404, `no group with id ${groupId} at this site`, "group");
  return { ...row, tags: (tagsOf.get(row.group) ?? []).map(profileTag), timeZone: site.timeZone };
}

async function lockGroup(site: Site, groupId: number, transaction: Transaction): Promise<TagGroup> {
  const group = await TagGroup.findOne({ where: { id: groupId, siteId: site.id }, include: ASSIGNMENT_INCLUDE, transaction, lock: transaction.LOCK.UPDATE });
  if (!group) throw new HttpError(404, `no group with id ${groupId} at this site`, "group");
  return group;
}

/**
 * Pins a profile revision to a group with its overrides (the edit joins the site's draft).
 * Refused with the field to fix when a parameter does not fit a tag of the group (unit
 * that does not convert, percent without an engineering range, unsuitable kind), when
 * the profile is archived (unless the revision is already pinned), or when the group is
 * a regulated record, the revision has a lossy step and the caution is not acknowledged.
 */
export async function setAssignment(actor: Actor | null, siteSlug: string, groupId: number, input: unknown): Promise<{ groupId: number; revision: number }> {
  assertCan(actor, "config.edit");
  const values = assignmentSchema.parse(input);
  return sequelize.transaction(async (transaction) => {
    const site = await siteBySlug(siteSlug, transaction);
    await touchDraft(actor, site.id, transaction);
    const group = await lockGroup(site, groupId, transaction);
    const before = assignmentConfig(group.assignment ?? null);
    const profile = await ReductionProfile.findByPk(values.profileId, { transaction });
    if (!profile) throw new HttpError(422, `no profile with id ${values.profileId}`, "profileId");
    const revision = await ProfileRevision.findOne({ where: { profileId: profile.id, number: values.revision }, transaction });
    if (!revision) throw new HttpError(422, `profile "${profile.name}" has no revision ${values.revision}`, "revision");
    const samePin = before?.revisionId === revision.id;
    if (profile.archivedAt && !samePin) throw new HttpError(422, `profile "${profile.name}" is archived; restore it or choose another`, "profileId");

    const { tagsOf } = await membership(site.id, transaction);
    const tags = (tagsOf.get(group.name) ?? []).map(profileTag);
    const problems = checkAssignment(revision.document, tags, values.overrides, values.tagOverrides, { timeZone: site.timeZone, convert: convertUnit });
    if (problems.length) throw new HttpError(422, `${problems[0].field}: ${problems[0].message}`, problems[0].field, undefined, problems);

    if (group.regulated && hasLossyStep(revision.document) && !samePin) {
      if (values.acknowledge !== REGULATED_RECORD_CAUTION.id) {
        const message =
          values.acknowledge === undefined
            ? `group "${group.name}" is a regulated record and "${profile.name}" has lossy steps: read and acknowledge the caution "${REGULATED_RECORD_CAUTION.title}" first`
            : `the caution text has changed (now ${REGULATED_RECORD_CAUTION.id}); read it again and acknowledge it`;
        throw new HttpError(422, message, "acknowledge");
      }
      await CautionAcknowledgement.create(
        {
          siteId: site.id,
          groupId: group.id,
          groupName: group.name,
          profileRevisionId: revision.id,
          cautionId: REGULATED_RECORD_CAUTION.id,
          cautionText: REGULATED_RECORD_CAUTION.text,
          userId: actor.id,
          userEmail: actor.email,
          acknowledgedAt: new Date(),
        },
        { transaction },
      );
    }

    const idOf = new Map(tags.map((t) => [t.name, t.id]));
    await writeAssignment(group.id, revision.id, values.overrides, values.tagOverrides.map((t) => ({ tagId: idOf.get(t.tag)!, overrides: t.overrides })), actor.id, transaction);
    const after: AssignmentConfig = {
      profileId: profile.id,
      profile: profile.name,
      revision: revision.number,
      revisionId: revision.id,
      overrides: values.overrides,
      tags: [...values.tagOverrides].sort((a, b) => (a.tag < b.tag ? -1 : a.tag > b.tag ? 1 : 0)),
    };
    await recordAudit(actor, { action: "assignment.set", entityType: "group", entityId: group.id, entityLabel: group.name, siteId: site.id, before, after }, transaction);
    return { groupId: group.id, revision: revision.number };
  });
}

/** Replaces a group's assignment row and its tag overrides (inside the caller's transaction). */
export async function writeAssignment(
  groupId: number,
  revisionId: number,
  overrides: AssignmentConfig["overrides"],
  tagOverrides: { tagId: number; overrides: AssignmentConfig["overrides"] }[],
  userId: number,
  transaction: Transaction,
): Promise<void> {
  let row = await Assignment.findOne({ where: { groupId }, transaction });
  if (row) await row.update({ profileRevisionId: revisionId, overrides, updatedBy: userId }, { transaction });
  else row = await Assignment.create({ groupId, profileRevisionId: revisionId, overrides, updatedBy: userId }, { transaction });
  await AssignmentTagOverride.destroy({ where: { assignmentId: row.id }, transaction });
  if (tagOverrides.length) await AssignmentTagOverride.bulkCreate(tagOverrides.map((t) => ({ assignmentId: row.id, ...t })), { transaction });
}

/** Removes a group's assignment (its tags then follow the site's default handling once released). */
export async function removeAssignment(actor: Actor | null, siteSlug: string, groupId: number): Promise<void> {
  assertCan(actor, "config.edit");
  await sequelize.transaction(async (transaction) => {
    const site = await siteBySlug(siteSlug, transaction);
    await touchDraft(actor, site.id, transaction);
    const group = await lockGroup(site, groupId, transaction);
    const before = assignmentConfig(group.assignment ?? null);
    if (!before) throw new HttpError(404, `group "${group.name}" has no assignment`, "group");
    await Assignment.destroy({ where: { groupId: group.id }, transaction });
    await recordAudit(actor, { action: "assignment.remove", entityType: "group", entityId: group.id, entityLabel: group.name, siteId: site.id, before, after: null }, transaction);
  });
}
