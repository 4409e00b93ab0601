import "server-only";
import { Op, QueryTypes } from "sequelize";
import { groupEstimateInput, type MeasuredOutput } from "@/lib/config/estimate-inputs";
import type { SiteConfig } from "@/lib/config/site-config";
import { estimateGroup, type SiteEstimateInput } from "@/lib/estimates";
import type { Profile } from "@/lib/reduction/profile";
import { unpackSeries } from "@/lib/samples/storage";
import { assignGroups, type TagLike } from "@/lib/tags/selector";
import { ProfileRevision, Release, SampleSet, type Site, Tag, TagGroup, sequelize } from "@/models";
import { measureSample } from "./measure-sample";

// The estimated reduction of each gateway under one release's configuration, beside what
// the gateway measures. The same model as the site estimate (lib/data/estimates.ts): per
// group and output, the ratio measured on the group's newest sample set, exact from a
// window, or the stated default; tags in no group follow the site's default handling.

export type GatewayEstimate = {
  /** The release whose configuration was estimated. */
  release: number;
  /** Samples in ÷ samples out per day; null when nothing goes out (all dropped) or the gateway collects no tag. */
  ratio: number | null;
  samplesPerDayIn: number;
  samplesPerDayOut: number;
};

export type EstimateRequest = { gatewayId: number; siteId: number; release: number };
type GatewayRef = { id: number; siteId: number; slug: string };
type Volume = { samplesIn: number; samplesOut: number };
type TagRow = Pick<Tag, "siteId" | "gatewayId" | "name" | "unit" | "kind" | "samplePeriodMs" | "area" | "equipment" | "euLow" | "euHigh">;

// Results per (site, release), kept while the inputs they came from are unchanged: a
// speed-up only; a cold instance computes the same figures.
const cache = new Map<string, { key: string; volumes: Map<number, Volume> }>();
const CACHE_LIMIT = 500;

function remember(slot: string, key: string, volumes: Map<number, Volume>) {
  if (!cache.has(slot) && cache.size >= CACHE_LIMIT) cache.delete(cache.keys().next().value!);
  cache.set(slot, { key, volumes });
}

function siteInput(site: Site): SiteEstimateInput {
  return {
    uplinkBudgetKbps: Number(site.uplinkBudgetKbps),
    headroom: Number(site.uplinkHeadroomPct) / 100,
    storagePricePerGbMonth: Number(site.storagePricePerGbMonth),
    retentionMonths: site.retentionMonths,
    byteModel: { bytesPerSample: site.bytesPerSample, transportOverhead: Number(site.transportOverheadPct) / 100 },
  };
}

/**
 * Samples in and out per day of every gateway of a site under one configuration: each
 * tag the gateway collects is placed in its group (first match by priority, against
 * today's inventory), each group's outputs are estimated for that gateway's share of the
 * group's tags (estimateGroup), and the volumes are summed per gateway.
 */
function estimateVolumes(
  site: Site,
  config: SiteConfig,
  tags: (TagLike & { gatewayId: number; euLow: number | null; euHigh: number | null })[],
  groupIds: Map<string, number>,
  sets: Map<number, SampleSet>,
  docs: Map<number, Profile>,
): Map<number, Volume> {
  const { winner } = assignGroups(tags, config.groups);
  const handling = site.defaultHandling === "drop" ? "drop" : "pass-through";
  const input = siteInput(site);
  // group name (or null for tags in no group) → gateway id → its tags in the group
  const members = new Map<string | null, Map<number, typeof tags>>();
  winner.forEach((g, i) => {
    let byGateway = members.get(g);
    if (!byGateway) members.set(g, (byGateway = new Map()));
    const list = byGateway.get(tags[i].gatewayId);
    if (list) list.push(tags[i]);
    else byGateway.set(tags[i].gatewayId, [tags[i]]);
  });
  const volumes = new Map<number, Volume>();
  const add = (gatewayId: number, samplesIn: number, samplesOut: number) => {
    const v = volumes.get(gatewayId) ?? { samplesIn: 0, samplesOut: 0 };
    v.samplesIn += samplesIn;
    v.samplesOut += samplesOut;
    volumes.set(gatewayId, v);
  };
  for (const [groupName, byGateway] of members) {
    const group = groupName === null ? null : (config.groups.find((g) => g.name === groupName) ?? null);
    const assignment = group?.assignment ?? null;
    const doc = assignment ? (docs.get(assignment.revisionId) ?? null) : null;
    const set = groupName !== null && groupIds.has(groupName) ? sets.get(groupIds.get(groupName)!) : undefined;
    let measured: MeasuredOutput[] | null = null;
    if (doc && assignment && set) {
      const key = `${set.id}:${assignment.revisionId}:${JSON.stringify(assignment.overrides)}`;
      const tag = { name: set.tagName, kind: set.kind, unit: set.unit, euLow: set.euLow, euHigh: set.euHigh, samplePeriodMs: set.samplePeriodMs };
      try {
        measured = measureSample(key, unpackSeries(set.encoding, set.data), doc, tag, assignment.overrides, site.timeZone);
      } catch {
        measured = null; // the set's tag does not suit this profile: stated defaults instead, as the site estimate does
      }
    }
    for (const [gatewayId, groupTags] of byGateway) {
      const e = estimateGroup(groupEstimateInput(groupName ?? "(tags in no group)", doc, groupTags, measured, handling), input);
      add(gatewayId, e.samplesPerDayIn, e.samplesPerDayOut);
    }
  }
  return volumes;
}

/**
 * The estimated ratio (samples in ÷ samples out per day) of each requested gateway under
 * the configuration of the given release of its site, in a fixed number of queries
 * whatever the number of gateways. Gateways whose release is not found are left out.
 * `gateways` must hold every gateway of the requested sites (tags name their gateway).
 */
export async function estimateGatewayRatios(sites: Site[], gateways: GatewayRef[], requests: EstimateRequest[]): Promise<Map<number, GatewayEstimate>> {
  const out = new Map<number, GatewayEstimate>();
  if (requests.length === 0) return out;
  const siteById = new Map(sites.map((s) => [s.id, s]));
  const pairs = [...new Map(requests.map((r) => [`${r.siteId}:${r.release}`, { siteId: r.siteId, number: r.release }])).values()];
  const siteIds = [...new Set(pairs.map((p) => p.siteId))];
  const [releases, tagStats, groups, setRows] = await Promise.all([
    Release.findAll({ where: { [Op.or]: pairs }, attributes: ["id", "siteId", "number"] }),
    sequelize.query<{ siteId: number; n: number; changed: Date | null }>(
      "SELECT site_id AS siteId, COUNT(*) AS n, MAX(updated_at) AS changed FROM tags WHERE site_id IN (:siteIds) GROUP BY site_id",
      { replacements: { siteIds }, type: QueryTypes.SELECT },
    ),
    TagGroup.findAll({ where: { siteId: siteIds }, attributes: ["id", "siteId", "name"] }),
    SampleSet.findAll({ where: { siteId: siteIds }, attributes: ["id", "siteId", "groupId"], order: [["createdAt", "DESC"], ["id", "DESC"]] }),
  ]);

  // Per site: group ids by name, the newest sample set per group, and a key of everything the estimate reads.
  const groupIdsBySite = new Map<number, Map<string, number>>();
  for (const g of groups) {
    if (!groupIdsBySite.has(g.siteId)) groupIdsBySite.set(g.siteId, new Map());
    groupIdsBySite.get(g.siteId)!.set(g.name, g.id);
  }
  const newestSet = new Map<number, number>(); // group id → sample set id
  for (const s of setRows) if (!newestSet.has(s.groupId)) newestSet.set(s.groupId, s.id);
  const statsBySite = new Map(tagStats.map((t) => [Number(t.siteId), t]));
  const gatewaysBySite = new Map<number, GatewayRef[]>();
  for (const g of gateways) gatewaysBySite.set(g.siteId, [...(gatewaysBySite.get(g.siteId) ?? []), g]);
  const siteKey = (siteId: number) => {
    const site = siteById.get(siteId)!;
    const stats = statsBySite.get(siteId);
    const groupPart = [...(groupIdsBySite.get(siteId) ?? new Map<string, number>())].map(([name, id]) => `${id}=${name}/${newestSet.get(id) ?? ""}`).sort();
    const gwPart = (gatewaysBySite.get(siteId) ?? []).map((g) => `${g.id}=${g.slug}`).sort();
    return JSON.stringify([site.updatedAt?.getTime() ?? 0, site.defaultHandling, stats ? Number(stats.n) : 0, stats?.changed ? new Date(stats.changed).getTime() : 0, groupPart, gwPart]);
  };

  const volumesOf = new Map<string, Map<number, Volume>>(); // "site:number" → volumes
  const missing: { release: Release; key: string; slot: string }[] = [];
  for (const r of releases) {
    const slot = `${r.siteId}:${r.id}`;
    const key = siteKey(r.siteId);
    const hit = cache.get(slot);
    if (hit && hit.key === key) volumesOf.set(`${r.siteId}:${r.number}`, hit.volumes);
    else missing.push({ release: r, key, slot });
  }

  if (missing.length) {
    const missingSites = [...new Set(missing.map((m) => m.release.siteId))];
    const [configs, tagRows] = await Promise.all([
      Release.findAll({ where: { id: missing.map((m) => m.release.id) }, attributes: ["id", "config"] }),
      Tag.findAll({
        where: { siteId: missingSites },
        attributes: ["siteId", "gatewayId", "name", "unit", "kind", "samplePeriodMs", "area", "equipment", "euLow", "euHigh"],
        order: [["name", "ASC"]],
        raw: true,
      }) as unknown as Promise<TagRow[]>,
    ]);
    const configOf = new Map(configs.map((c) => [c.id, c.config]));
    const revisionIds = new Set<number>();
    const setIds = new Set<number>();
    for (const m of missing) {
      const ids = groupIdsBySite.get(m.release.siteId) ?? new Map<string, number>();
      for (const g of configOf.get(m.release.id)?.groups ?? []) {
        if (!g.assignment) continue;
        revisionIds.add(g.assignment.revisionId);
        const set = ids.has(g.name) ? newestSet.get(ids.get(g.name)!) : undefined;
        if (set !== undefined) setIds.add(set);
      }
    }
    const [revisions, sets] = await Promise.all([
      revisionIds.size ? ProfileRevision.findAll({ where: { id: [...revisionIds] }, attributes: ["id", "document"] }) : Promise.resolve([]),
      setIds.size ? SampleSet.findAll({ where: { id: [...setIds] } }) : Promise.resolve([]),
    ]);
    const docs = new Map(revisions.map((r) => [r.id, r.document as Profile]));
    const setsByGroup = new Map(sets.map((s) => [s.groupId, s]));
    const slugOf = new Map(gateways.map((g) => [g.id, g.slug]));
    const tagsBySite = new Map<number, (TagLike & { gatewayId: number; euLow: number | null; euHigh: number | null })[]>();
    for (const t of tagRows) {
      const list = tagsBySite.get(t.siteId) ?? [];
      list.push({ ...t, gateway: slugOf.get(t.gatewayId) ?? "" });
      tagsBySite.set(t.siteId, list);
    }
    for (const m of missing) {
      const site = siteById.get(m.release.siteId)!;
      let volumes: Map<number, Volume>;
      try {
        volumes = estimateVolumes(site, configOf.get(m.release.id) ?? { groups: [] }, tagsBySite.get(site.id) ?? [], groupIdsBySite.get(site.id) ?? new Map(), setsByGroup, docs);
      } catch (err) {
        // A figure the model refuses (e.g. a site byte model out of range) leaves the estimate blank, not the page.
        console.error(`fleet: no estimate for ${site.slug} release ${m.release.number}: ${(err as Error).message}`);
        volumes = new Map();
      }
      remember(m.slot, m.key, volumes);
      volumesOf.set(`${m.release.siteId}:${m.release.number}`, volumes);
    }
  }

  for (const r of requests) {
    const volumes = volumesOf.get(`${r.siteId}:${r.release}`);
    if (!volumes) continue;
    const v = volumes.get(r.gatewayId) ?? { samplesIn: 0, samplesOut: 0 };
    out.set(r.gatewayId, {
      release: r.release,
      ratio: v.samplesIn > 0 && v.samplesOut > 0 ? v.samplesIn / v.samplesOut : null,
      samplesPerDayIn: v.samplesIn,
      samplesPerDayOut: v.samplesOut,
    });
  }
  return out;
}
