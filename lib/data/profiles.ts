import "server-only";
import { diffLines } from "diff";
import { Op, type Transaction } from "sequelize";
import { z } from "zod";
import { recordAudit } from "@/lib/audit";
import type { Actor } from "@/lib/auth/guard";
import { HttpError } from "@/lib/http";
import { describeProfileDiff } from "@/lib/profiles/describe-diff";
import { checkProfileDocument } from "@/lib/profiles/document";
import { profileToYaml } from "@/lib/profiles/yaml";
import { METHODS, type Profile } from "@/lib/reduction/profile";
import { ProfileRevision, ReductionProfile, User, sequelize } from "@/models";
import { profileDocumentSchema } from "@/schemas/profile";
import { TEXT_CONTROL_MESSAGE, noControlInText } from "@/schemas/text";
import { assertCan } from "./access";
import { profileUsage, type ProfileUsage } from "./profile-usage";

export type ProfileSummary = {
  id: number;
  name: string;
  description: string;
  kinds: string[];
  latestRevision: number;
  archived: boolean;
  updatedAt: string;
  outputs: string[];
  methods: string[];
  lossy: boolean;
  usage: number;
};
export type RevisionInfo = { number: number; note: string; createdAt: string; createdBy: string };
export type ProfileDetail = ProfileSummary & { document: Profile; revisions: RevisionInfo[]; sites: ProfileUsage[] };

const noteSchema = z.string().trim().max(500, "A note has at most 500 characters.").refine(noControlInText, TEXT_CONTROL_MESSAGE).default("");
const saveSchema = z.object({
  document: z.unknown(),
  note: noteSchema,
  baseRevision: z.number({ error: "baseRevision must be a revision number" }).int().positive().optional(),
});
export const listQuerySchema = z.object({
  q: z.string().trim().max(80).default(""),
  status: z.enum(["active", "archived", "all"], { error: "status is active, archived or all" }).default("active"),
  kind: z.enum(["analog", "discrete", "counter"], { error: "kind is analog, discrete or counter" }).optional(),
});

/** A document checked twice: the zod form schema (field messages) and the JSON Schema contract (ajv). */
export function parseDocument(input: unknown, prefix = "document"): Profile {
  const parsed = profileDocumentSchema.safeParse(input);
  if (!parsed.success) {
    const issues = parsed.error.issues.map((i) => ({ field: [prefix, ...i.path].join("."), message: i.message }));
    throw new HttpError(422, `${issues[0].field}: ${issues[0].message}`, issues[0].field, undefined, issues);
  }
  const checked = checkProfileDocument(parsed.data);
  if (!checked.ok) {
    const issues = checked.problems.map((p) => ({ field: p.path ? `${prefix}.${p.path}` : prefix, message: p.message }));
    throw new HttpError(422, `${issues[0].field}: ${issues[0].message}`, issues[0].field, undefined, issues);
  }
  return checked.profile;
}

const methodsOf = (doc: Profile) => [...new Set(doc.outputs.flatMap((o) => o.steps.map((s) => s.method)))];

function summary(p: ReductionProfile, doc: Profile, usage: number): ProfileSummary {
  const methods = methodsOf(doc);
  return {
    id: p.id,
    name: p.name,
    description: p.description,
    kinds: p.kinds.split(","),
    latestRevision: p.latestRevision,
    archived: p.archivedAt !== null,
    updatedAt: p.updatedAt.toISOString(),
    outputs: doc.outputs.map((o) => o.name),
    methods,
    lossy: methods.some((m) => METHODS[m].lossy),
    usage,
  };
}

async function latestDocuments(ids: number[]): Promise<Map<number, ProfileRevision>> {
  if (ids.length === 0) return new Map();
  const profiles = await ReductionProfile.findAll({ where: { id: ids }, attributes: ["id", "latestRevision"] });
  const revs = await ProfileRevision.findAll({
    where: { [Op.or]: profiles.map((p) => ({ profileId: p.id, number: p.latestRevision })) },
  });
  return new Map(revs.map((r) => [r.profileId, r]));
}

/** The profile library: search by name or description, filter by status and kind. */
export async function listProfiles(actor: Actor | null, query: unknown = {}): Promise<ProfileSummary[]> {
  assertCan(actor, "read");
  const { q, status, kind } = listQuerySchema.parse(query);
  const where: Record<string | symbol, unknown> = {};
  if (status === "active") where.archivedAt = null;
  if (status === "archived") where.archivedAt = { [Op.ne]: null };
  const like = `%${q.replace(/[\\%_]/g, (c) => `\\${c}`)}%`;
  if (q) where[Op.or] = [{ name: { [Op.like]: like } }, { description: { [Op.like]: like } }];
  if (kind) where.kinds = { [Op.like]: `%${kind}%` };
  const profiles = await ReductionProfile.findAll({ where, order: [["name", "ASC"]] });
  const docs = await latestDocuments(profiles.map((p) => p.id));
  const usage = await profileUsage(profiles.map((p) => p.id));
  return profiles.map((p) => summary(p, docs.get(p.id)!.document, usage.get(p.id)?.length ?? 0));
}

async function findProfile(id: number, transaction?: Transaction, lock = false): Promise<ReductionProfile> {
  const p = await ReductionProfile.findByPk(id, { transaction, ...(lock && transaction ? { lock: transaction.LOCK.UPDATE } : {}) });
  if (!p) throw new HttpError(404, `no profile with id ${id}`, "profile");
  return p;
}

async function findRevision(profileId: number, number: number, transaction?: Transaction): Promise<ProfileRevision> {
  const r = await ProfileRevision.findOne({ where: { profileId, number }, transaction });
  if (!r) throw new HttpError(404, `the profile has no revision ${number}`, "revision");
  return r;
}

/** One profile: its latest document, every revision (who, when, note) and where it is assigned. */
export async function getProfile(actor: Actor | null, id: number): Promise<ProfileDetail> {
  assertCan(actor, "read");
  const p = await findProfile(id);
  const revisions = await ProfileRevision.findAll({
    where: { profileId: id },
    order: [["number", "DESC"]],
    include: [{ model: User, as: "author", attributes: ["name", "email"] }],
  });
  const latest = revisions.find((r) => r.number === p.latestRevision)!;
  const sites = (await profileUsage([id])).get(id) ?? [];
  return {
    ...summary(p, latest.document, sites.length),
    document: latest.document,
    sites,
    revisions: revisions.map((r) => ({
      number: r.number,
      note: r.note,
      createdAt: r.createdAt.toISOString(),
      createdBy: (r as ProfileRevision & { author?: User }).author?.name ?? "(removed user)",
    })),
  };
}

/** One revision's document. */
export async function getRevision(actor: Actor | null, id: number, number: number): Promise<{ number: number; document: Profile; note: string }> {
  assertCan(actor, "read");
  await findProfile(id);
  const r = await findRevision(id, number);
  return { number: r.number, document: r.document, note: r.note };
}

async function writeRevision(actor: Actor, p: ReductionProfile, doc: Profile, note: string, transaction: Transaction): Promise<ProfileRevision> {
  const number = p.latestRevision;
  const rev = await ProfileRevision.create({ profileId: p.id, number, document: doc, note, createdBy: actor.id }, { transaction });
  return rev;
}

/** A new profile with its first revision. */
export async function createProfile(actor: Actor | null, input: unknown): Promise<{ id: number; revision: number }> {
  assertCan(actor, "config.edit");
  const { document, note } = saveSchema.parse(input);
  const doc = parseDocument(document);
  return sequelize.transaction(async (transaction) => {
    const p = await ReductionProfile.create(
      { name: doc.name, description: doc.description ?? "", kinds: doc.kinds.join(","), latestRevision: 1, createdBy: actor.id },
      { transaction },
    );
    await writeRevision(actor, p, doc, note || "Created", transaction);
    await recordAudit(actor, { action: "profile.create", entityType: "profile", entityId: p.id, entityLabel: p.name, before: null, after: { revision: 1, document: doc } }, transaction);
    return { id: p.id, revision: 1 };
  });
}

/**
 * Saves a new revision. With `baseRevision`, refuses (409) when someone else saved in
 * between; refuses (422) a document identical to the latest revision.
 */
export async function saveRevision(actor: Actor | null, id: number, input: unknown): Promise<{ id: number; revision: number }> {
  assertCan(actor, "config.edit");
  const { document, note, baseRevision } = saveSchema.parse(input);
  const doc = parseDocument(document);
  return sequelize.transaction(async (transaction) => {
    const p = await findProfile(id, transaction, true);
    if (baseRevision !== undefined && baseRevision !== p.latestRevision) {
      throw new HttpError(409, `revision ${p.latestRevision} was saved after revision ${baseRevision} you edited; reload and apply your edits again`, "baseRevision");
    }
    const latest = await findRevision(id, p.latestRevision, transaction);
    if (profileToYaml(latest.document) === profileToYaml(doc)) throw new HttpError(422, "nothing changed since the latest revision", "document");
    await p.update({ name: doc.name, description: doc.description ?? "", kinds: doc.kinds.join(","), latestRevision: p.latestRevision + 1 }, { transaction });
    const rev = await writeRevision(actor, p, doc, note, transaction);
    await recordAudit(
      actor,
      { action: "profile.revise", entityType: "profile", entityId: p.id, entityLabel: p.name, before: { revision: latest.number, document: latest.document }, after: { revision: rev.number, document: doc } },
      transaction,
    );
    return { id: p.id, revision: rev.number };
  });
}

export const duplicateSchema = z.object({ name: z.string({ error: "Give the new profile a name." }).trim().min(1, "Give the new profile a name.").max(80, "A profile name has at most 80 characters.") });

/** A new profile whose first revision copies another profile's latest one under a new name. */
export async function duplicateProfile(actor: Actor | null, id: number, input: unknown): Promise<{ id: number; revision: number }> {
  assertCan(actor, "config.edit");
  const { name } = duplicateSchema.parse(input);
  const source = await findProfile(id);
  const latest = await findRevision(id, source.latestRevision);
  return createProfile(actor, { document: { ...latest.document, name }, note: `Copied from "${source.name}" revision ${latest.number}` });
}

export const archiveSchema = z.object({ archived: z.boolean({ error: "archived must be true or false" }) });

/** Archives (hides from new assignments) or restores a profile; assignments already pinned keep working. */
export async function setProfileArchived(actor: Actor | null, id: number, input: unknown): Promise<{ id: number; archived: boolean }> {
  assertCan(actor, "config.edit");
  const { archived } = archiveSchema.parse(input);
  return sequelize.transaction(async (transaction) => {
    const p = await findProfile(id, transaction, true);
    const before = { archived: p.archivedAt !== null };
    await p.update({ archivedAt: archived ? (p.archivedAt ?? new Date()) : null }, { transaction });
    await recordAudit(actor, { action: archived ? "profile.archive" : "profile.restore", entityType: "profile", entityId: p.id, entityLabel: p.name, before, after: { archived } }, transaction);
    return { id: p.id, archived };
  });
}

export type RevisionDiff = {
  from: number;
  to: number;
  summary: string[];
  lines: { added?: boolean; removed?: boolean; value: string }[];
};

/** Two revisions compared: in words, and line by line on their YAML. */
export async function diffRevisions(actor: Actor | null, id: number, from: number, to: number): Promise<RevisionDiff> {
  assertCan(actor, "read");
  await findProfile(id);
  const [a, b] = await Promise.all([findRevision(id, from), findRevision(id, to)]);
  return diffDocuments(a.document, b.document, from, to);
}

export function diffDocuments(a: Profile, b: Profile, from: number, to: number): RevisionDiff {
  const lines = diffLines(profileToYaml(a), profileToYaml(b)).map((c) => ({ value: c.value, ...(c.added ? { added: true } : {}), ...(c.removed ? { removed: true } : {}) }));
  return { from, to, summary: describeProfileDiff(a, b), lines };
}

/** A revision (default: the latest) as a YAML file. */
export async function exportProfile(actor: Actor | null, id: number, revision?: number): Promise<{ filename: string; text: string }> {
  assertCan(actor, "read");
  const p = await findProfile(id);
  const r = await findRevision(id, revision ?? p.latestRevision);
  const slug = p.name.toLowerCase().replace(/[^a-z0-9]+/g, "-").replace(/^-|-$/g, "") || "profile";
  return { filename: `${slug}.r${r.number}.profile.yaml`, text: profileToYaml(r.document, { revision: r.number, exported: new Date().toISOString() }) };
}
