import "server-only";
import { z } from "zod";
import { recordAudit } from "@/lib/audit";
import type { Actor } from "@/lib/auth/guard";
import { HttpError } from "@/lib/http";
import { SeriesError, validateSeries, type Series } from "@/lib/reduction";
import type { ProfileTag } from "@/lib/reduction/profile";
import { packSeries, unpackSeries } from "@/lib/samples/storage";
import { decodeSeriesWire } from "@/lib/samples/wire";
import { SampleSet, Tag, TagGroup, User, sequelize } from "@/models";
import { TAG_KINDS } from "@/schemas/tag";
import { NAME_CONTROL_MESSAGE, noControlInName } from "@/schemas/text";
import { assertCan } from "./access";
import { siteBySlug } from "./sites";

/** At most this many samples per saved set (about 17 MB on the wire, less stored). */
export const SAMPLE_SET_MAX_SAMPLES = 1_000_000;
/** Largest stored encoding accepted (MariaDB's default max_allowed_packet is 16 MiB). */
export const SAMPLE_SET_MAX_BYTES = 15 * 2 ** 20;
/** The times a DATETIME(3) column holds (first and last sample are stored so): 1000-01-01 to 9999-12-31 UTC. */
const STORABLE_FROM_MS = Date.UTC(1000, 0, 1);
const STORABLE_TO_MS = Date.UTC(9999, 11, 31, 23, 59, 59, 999);

export type SampleSetView = {
  id: number;
  groupId: number;
  name: string;
  tag: ProfileTag;
  samples: number;
  firstAt: string;
  lastAt: string;
  byteSize: number;
  createdAt: string;
  createdBy: string;
};

// Query values are text: an empty one ("euLow=") means not given, not 0.
const number = z.preprocess((v) => (typeof v === "string" && v.trim() === "" ? undefined : v), z.coerce.number({ error: "must be a number" }).optional());
export const sampleMetaSchema = z.object({
  name: z.string({ error: "Name the sample set." }).trim().min(1, "Name the sample set.").max(120, "At most 120 characters.").refine(noControlInName, NAME_CONTROL_MESSAGE),
  tag: z.string({ error: "Name the tag the samples stand for." }).trim().min(1, "Name the tag the samples stand for.").max(191),
  kind: z.enum(TAG_KINDS, { error: "kind is analog, discrete or counter" }).optional(),
  unit: z.string().trim().min(1).max(32).refine(noControlInName, NAME_CONTROL_MESSAGE).optional(),
  euLow: number.optional(),
  euHigh: number.optional(),
  samplePeriodMs: number.pipe(z.number().int().min(1).max(86_400_000)).optional(),
});

export function presentSampleSet(s: SampleSet & { author?: User | null }): SampleSetView {
  return {
    id: s.id,
    groupId: s.groupId,
    name: s.name,
    tag: { name: s.tagName, kind: s.kind, unit: s.unit, euLow: s.euLow, euHigh: s.euHigh, samplePeriodMs: s.samplePeriodMs },
    samples: s.samples,
    firstAt: s.firstAt.toISOString(),
    lastAt: s.lastAt.toISOString(),
    byteSize: s.byteSize,
    createdAt: s.createdAt.toISOString(),
    createdBy: s.author?.name ?? "(removed user)",
  };
}

const META_ATTRIBUTES = { exclude: ["data"] };

async function groupOf(siteSlug: string, groupId: number) {
  const site = await siteBySlug(siteSlug);
  const group = await TagGroup.findOne({ where: { id: groupId, siteId: site.id } });
  if (!group) throw new HttpError(404, `no group with id ${groupId} at this site`, "group");
  return { site, group };
}

/** A group's saved sample sets, newest first (without their data). */
export async function listSampleSets(actor: Actor | null, siteSlug: string, groupId: number): Promise<SampleSetView[]> {
  assertCan(actor, "read");
  const { group } = await groupOf(siteSlug, groupId);
  const rows = await SampleSet.findAll({
    where: { groupId: group.id },
    attributes: META_ATTRIBUTES,
    order: [["createdAt", "DESC"], ["id", "DESC"]],
    include: [{ model: User, as: "author", attributes: ["name"] }],
  });
  return rows.map(presentSampleSet);
}

/**
 * Saves sample data (our wire format, see lib/samples/wire.ts) against a group. The tag
 * context comes from the named tag of the site's inventory, or from the given kind,
 * unit, range and sample period when the tag is not in the inventory.
 */
export async function createSampleSet(actor: Actor | null, siteSlug: string, groupId: number, query: unknown, body: ArrayBuffer): Promise<SampleSetView> {
  assertCan(actor, "config.edit");
  const meta = sampleMetaSchema.parse(query);
  const decoded = decodeSeriesWire(body);
  if (!decoded.ok) throw new HttpError(422, decoded.message, "body");
  const series = decoded.series;
  if (series.t.length < 2) throw new HttpError(422, "a sample set needs at least 2 samples", "body");
  if (series.t.length > SAMPLE_SET_MAX_SAMPLES) {
    throw new HttpError(413, `a sample set holds at most ${SAMPLE_SET_MAX_SAMPLES.toLocaleString("en")} samples, got ${series.t.length.toLocaleString("en")}`, "body");
  }
  try {
    validateSeries(series);
  } catch (e) {
    if (e instanceof SeriesError) throw new HttpError(422, e.message, "body");
    throw e;
  }
  if (series.t[0] < STORABLE_FROM_MS || series.t[series.t.length - 1] > STORABLE_TO_MS) {
    throw new HttpError(422, `sample times must lie between 1000-01-01 and 9999-12-31 UTC (epoch ms ${STORABLE_FROM_MS} to ${STORABLE_TO_MS})`, "body");
  }
  const { site, group } = await groupOf(siteSlug, groupId);
  const tag = await tagContext(site.id, meta);
  const { encoding, data } = packSeries(series);
  if (data.length > SAMPLE_SET_MAX_BYTES) throw new HttpError(413, `the encoded samples take ${data.length} bytes; at most ${SAMPLE_SET_MAX_BYTES} are stored`, "body");
  return sequelize.transaction(async (transaction) => {
    const row = await SampleSet.create(
      {
        siteId: site.id,
        groupId: group.id,
        name: meta.name,
        tagName: tag.name,
        kind: tag.kind,
        unit: tag.unit,
        euLow: tag.euLow,
        euHigh: tag.euHigh,
        samplePeriodMs: tag.samplePeriodMs,
        samples: series.t.length,
        firstAt: new Date(series.t[0]),
        lastAt: new Date(series.t[series.t.length - 1]),
        encoding,
        data,
        byteSize: data.length,
        createdBy: actor.id,
      },
      { transaction },
    );
    const after = { name: row.name, group: group.name, tag: tag.name, samples: row.samples, encoding, byteSize: row.byteSize };
    await recordAudit(actor, { action: "sample-set.create", entityType: "sample-set", entityId: row.id, entityLabel: row.name, siteId: site.id, before: null, after }, transaction);
    return presentSampleSet(Object.assign(row, { author: { name: actor.name } as User }));
  });
}

async function tagContext(siteId: number, meta: z.infer<typeof sampleMetaSchema>): Promise<ProfileTag> {
  const tag = await Tag.findOne({ where: { siteId, name: meta.tag } });
  if (tag) return { name: tag.name, kind: tag.kind, unit: tag.unit, euLow: tag.euLow, euHigh: tag.euHigh, samplePeriodMs: tag.samplePeriodMs };
  if (meta.kind === undefined) throw new HttpError(422, `tag ${meta.tag} is not in the inventory: give its kind`, "kind");
  if (meta.unit === undefined) throw new HttpError(422, `tag ${meta.tag} is not in the inventory: give its unit`, "unit");
  if (meta.samplePeriodMs === undefined) throw new HttpError(422, `tag ${meta.tag} is not in the inventory: give its sample period`, "samplePeriodMs");
  const low = meta.euLow ?? null;
  const high = meta.euHigh ?? null;
  if ((low === null) !== (high === null) || (low !== null && high !== null && !(low < high))) {
    throw new HttpError(422, "give both ends of the engineering range, low below high, or neither", "euLow");
  }
  return { name: meta.tag, kind: meta.kind, unit: meta.unit, euLow: low, euHigh: high, samplePeriodMs: meta.samplePeriodMs };
}

async function findSet(id: number, withData: boolean) {
  const row = await SampleSet.findByPk(id, { ...(withData ? {} : { attributes: META_ATTRIBUTES }), include: [{ model: User, as: "author", attributes: ["name"] }] });
  if (!row) throw new HttpError(404, `no sample set with id ${id}`, "sampleSet");
  return row;
}

/** One sample set's description. */
export async function getSampleSet(actor: Actor | null, id: number): Promise<SampleSetView> {
  assertCan(actor, "read");
  return presentSampleSet(await findSet(id, false));
}

/** One sample set with its series decoded. */
export async function loadSampleSeries(actor: Actor | null, id: number): Promise<{ set: SampleSetView; series: Series }> {
  assertCan(actor, "read");
  const row = await findSet(id, true);
  return { set: presentSampleSet(row), series: unpackSeries(row.encoding, row.data) };
}

export async function deleteSampleSet(actor: Actor | null, id: number): Promise<void> {
  assertCan(actor, "config.edit");
  await sequelize.transaction(async (transaction) => {
    const row = await SampleSet.findByPk(id, { attributes: META_ATTRIBUTES, transaction, lock: transaction.LOCK.UPDATE });
    if (!row) throw new HttpError(404, `no sample set with id ${id}`, "sampleSet");
    await row.destroy({ transaction });
    await recordAudit(
      actor,
      { action: "sample-set.delete", entityType: "sample-set", entityId: id, entityLabel: row.name, siteId: row.siteId, before: { name: row.name, samples: row.samples }, after: null },
      transaction,
    );
  });
}
