import "server-only";
import { Op } from "sequelize";
import type { Actor } from "@/lib/auth/guard";
import { groupEstimateInput, DEFAULT_BITS_PER_SAMPLE, DEFAULT_PEAK_FACTOR, type MeasuredOutput } from "@/lib/config/estimate-inputs";
import { diffConfigs, type SiteConfig } from "@/lib/config/site-config";
import { estimateSite, DEFAULT_RATIOS, type GroupEstimate, type GroupEstimateInput, type SiteEstimateInput } from "@/lib/estimates";
import { unpackSeries } from "@/lib/samples/storage";
import { assignGroups } from "@/lib/tags/selector";
import { ProfileRevision, SampleSet, Site, TagGroup } from "@/models";
import { assertCan } from "./access";
import { currentReleaseNumber, loadBaseConfig } from "./drafts";
import { loadWorkingConfig } from "./groups";
import { measureSample } from "./measure-sample";
import { siteBySlug } from "./sites";
import { allTagValues, type TagView } from "./tags";

/** Outages for which the catch-up time is shown. */
export const OUTAGES_S = [3600, 8 * 3600, 24 * 3600];

export type GroupEstimateView = GroupEstimate & {
  tagCount: number;
  profile: string | null;
  outputs: { output: string; ratio: number | null; peakRatio: number | null; bitsPerSample: number; source: "measured" | "default" | "window" }[];
  sampleSet: string | null;
};
export type ConfigEstimate = {
  groups: GroupEstimateView[];
  totals: Omit<GroupEstimate, "group">;
  storageGbAtRetention: number;
  storageCostPerMonthAtRetention: number;
  usableKbps: number;
  overBudgetMean: boolean;
  overBudgetPeak: boolean;
  catchUp: { outageS: number; seconds: number | null }[];
};
export type SiteEstimateView = {
  site: { slug: string; name: string; uplinkBudgetKbps: number; uplinkHeadroomPct: number; storagePricePerGbMonth: number; retentionMonths: number };
  byteModel: { bytesPerSample: number; transportOverheadPct: number };
  /** The draft configuration (or the current one when there is no draft). */
  working: ConfigEstimate;
  /** The current release's configuration; null before the first release. */
  released: ConfigEstimate | null;
  hasDraft: boolean;
  assumptions: string[];
};

const finite = (x: number) => (Number.isFinite(x) ? x : null);
const UNGROUPED = "(tags in no group)";

async function latestSampleSets(siteId: number): Promise<Map<number, SampleSet>> {
  const rows = await SampleSet.findAll({ where: { siteId }, order: [["createdAt", "DESC"], ["id", "DESC"]] });
  const byGroup = new Map<number, SampleSet>();
  for (const r of rows) if (!byGroup.has(r.groupId)) byGroup.set(r.groupId, r);
  return byGroup;
}

async function estimateConfig(site: Site, config: SiteConfig, tags: TagView[], groupIds: Map<string, number>, sets: Map<number, SampleSet>, siteInput: SiteEstimateInput): Promise<ConfigEstimate> {
  const { winner } = assignGroups(tags, config.groups);
  const members = new Map<string, TagView[]>(config.groups.map((g) => [g.name, []]));
  const ungrouped: TagView[] = [];
  winner.forEach((g, i) => (g === null ? ungrouped : members.get(g)!).push(tags[i]));
  const revisionIds = config.groups.flatMap((g) => (g.assignment ? [g.assignment.revisionId] : []));
  const docs = new Map((await ProfileRevision.findAll({ where: { id: { [Op.in]: revisionIds.length ? revisionIds : [0] } } })).map((r) => [r.id, r.document]));
  const handling = site.defaultHandling === "drop" ? "drop" : "pass-through";
  const inputs: GroupEstimateInput[] = [];
  const extra: { profile: string | null; sampleSet: string | null }[] = [];
  for (const g of config.groups) {
    const doc = g.assignment ? (docs.get(g.assignment.revisionId) ?? null) : null;
    const set = groupIds.has(g.name) ? sets.get(groupIds.get(g.name)!) : undefined;
    let measured: MeasuredOutput[] | null = null;
    if (doc && set) {
      const key = `${set.id}:${g.assignment!.revisionId}:${JSON.stringify(g.assignment!.overrides)}`;
      const tag = { name: set.tagName, kind: set.kind, unit: set.unit, euLow: set.euLow, euHigh: set.euHigh, samplePeriodMs: set.samplePeriodMs };
      try {
        measured = measureSample(key, unpackSeries(set.encoding, set.data), doc, tag, g.assignment!.overrides, site.timeZone);
      } catch {
        measured = null; // the set's tag does not suit this profile (kind or unit): fall back to defaults
      }
    }
    inputs.push(groupEstimateInput(g.name, doc, members.get(g.name)!, measured, handling));
    extra.push({ profile: g.assignment ? `${g.assignment.profile} r${g.assignment.revision}` : null, sampleSet: measured && set ? set.name : null });
  }
  if (ungrouped.length) {
    inputs.push(groupEstimateInput(UNGROUPED, null, ungrouped, null, handling));
    extra.push({ profile: null, sampleSet: null });
  }
  const e = estimateSite(inputs, siteInput);
  return {
    groups: e.groups.map((g, i) => ({
      ...g,
      tagCount: inputs[i].tags.length,
      profile: extra[i].profile,
      sampleSet: extra[i].sampleSet,
      outputs: inputs[i].outputs.map((o) => ({ output: o.output, ratio: finite(o.ratio), peakRatio: finite(o.peakRatio), bitsPerSample: o.bitsPerSample, source: o.source })),
    })),
    totals: e.totals,
    storageGbAtRetention: e.storageGbAtRetention,
    storageCostPerMonthAtRetention: e.storageCostPerMonthAtRetention,
    usableKbps: e.usableKbps,
    overBudgetMean: e.overBudgetMean,
    overBudgetPeak: e.overBudgetPeak,
    catchUp: OUTAGES_S.map((outageS) => ({ outageS, seconds: finite(e.catchUpSeconds(outageS)) })),
  };
}

/** The site's savings estimate: the draft configuration beside the current release, with the assumptions behind it. */
export async function siteEstimate(actor: Actor | null, siteSlug: string): Promise<SiteEstimateView> {
  assertCan(actor, "read");
  const site = await siteBySlug(siteSlug);
  const [working, base, tags, sets, groups] = await Promise.all([
    loadWorkingConfig(site.id),
    loadBaseConfig(site.id),
    allTagValues(site.id),
    latestSampleSets(site.id),
    TagGroup.findAll({ where: { siteId: site.id }, attributes: ["id", "name"] }),
  ]);
  const groupIds = new Map(groups.map((g) => [g.name, g.id]));
  const siteInput: SiteEstimateInput = {
    uplinkBudgetKbps: Number(site.uplinkBudgetKbps),
    headroom: Number(site.uplinkHeadroomPct) / 100,
    storagePricePerGbMonth: Number(site.storagePricePerGbMonth),
    retentionMonths: site.retentionMonths,
    byteModel: { bytesPerSample: site.bytesPerSample, transportOverhead: Number(site.transportOverheadPct) / 100 },
  };
  const releaseNumber = await currentReleaseNumber(site.id);
  const released = releaseNumber !== null ? await estimateConfig(site, base, tags, groupIds, sets, siteInput) : null;
  const workingEstimate = await estimateConfig(site, working, tags, groupIds, sets, siteInput);
  const hasDraft = diffConfigs(base, working).length > 0;
  return {
    site: {
      slug: site.slug,
      name: site.name,
      uplinkBudgetKbps: siteInput.uplinkBudgetKbps,
      uplinkHeadroomPct: Number(site.uplinkHeadroomPct),
      storagePricePerGbMonth: siteInput.storagePricePerGbMonth,
      retentionMonths: site.retentionMonths,
    },
    byteModel: { bytesPerSample: site.bytesPerSample, transportOverheadPct: Number(site.transportOverheadPct) },
    working: workingEstimate,
    released,
    hasDraft,
    assumptions: assumptions(site),
  };
}

function assumptions(site: Site): string[] {
  const defaults = Object.entries(DEFAULT_RATIOS)
    .map(([m, r]) => `${m} ${r === Infinity ? "∞" : r}:1`)
    .join(", ");
  return [
    "Estimates, not measurements: gateways' own counters replace them once gateways check in.",
    "Samples per day per tag = 86,400,000 ms ÷ the tag's sample period; each profile output is a series of its own.",
    `Plain bytes = samples × ${site.bytesPerSample} bytes (timestamp, value, framing) × (1 + ${Number(site.transportOverheadPct)} % transport overhead).`,
    "Compressed bytes = samples × bits per sample ÷ 8 under delta-of-delta timestamps and XOR values (Pelkonen et al., PVLDB 8(12), 2015), measured on the sample set.",
    `Without a measured sample set: ${DEFAULT_BITS_PER_SAMPLE} bits per compressed sample, and the stated default ratios per method (${defaults}); a selection method's peak is assumed ${DEFAULT_PEAK_FACTOR}× denser than its mean.`,
    "An output ending in a window sends at most one sample per window (exact from the window and the tags' sample periods).",
    "A ratio measured on a group's sample set is applied to every tag of the group; the peak is the ratio of the busiest hour of the set.",
    "GB = 10⁹ bytes; a month = 30.4375 days. Storage at retention = a month's plain bytes × retention months.",
    `Usable uplink = budget × (1 − ${Number(site.uplinkHeadroomPct)} % headroom). Catch-up after an outage = backlog at the mean rate ÷ (usable − mean rate).`,
  ];
}

export type FleetRow = { slug: string; name: string; budgetKbps: number; usableKbps: number; released: { meanKbps: number; peakKbps: number } | null; working: { meanKbps: number; peakKbps: number }; hasDraft: boolean; overBudgetMean: boolean; overBudgetPeak: boolean };

/** Every site's uplink estimate before and after its draft change, flagged when over budget. */
export async function fleetEstimate(actor: Actor | null): Promise<FleetRow[]> {
  assertCan(actor, "read");
  const sites = await Site.findAll({ order: [["name", "ASC"]], attributes: ["slug"] });
  const rows: FleetRow[] = [];
  for (const s of sites) {
    const e = await siteEstimate(actor, s.slug);
    rows.push({
      slug: e.site.slug,
      name: e.site.name,
      budgetKbps: e.site.uplinkBudgetKbps,
      usableKbps: e.working.usableKbps,
      released: e.released ? { meanKbps: e.released.totals.meanKbps, peakKbps: e.released.totals.peakKbps } : null,
      working: { meanKbps: e.working.totals.meanKbps, peakKbps: e.working.totals.peakKbps },
      hasDraft: e.hasDraft,
      overBudgetMean: e.working.overBudgetMean,
      overBudgetPeak: e.working.overBudgetPeak,
    });
  }
  return rows;
}
