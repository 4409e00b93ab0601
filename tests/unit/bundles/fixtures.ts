import type { GroupConfig, SiteConfig } from "@/lib/config/site-config";
import type { BundleGateway, BundleTag, SiteBundlesInput } from "@/lib/bundles/render";
import type { Profile } from "@/lib/reduction/profile";

/** A small dairy site: two gateways, temperatures with percent deviation, a pressure in bar on kPa tags, a counter group without a profile. */
export const tags: BundleTag[] = [
  { name: "PAST1/TT-101/PV", kind: "analog", unit: "degC", euLow: 0, euHigh: 150, samplePeriodMs: 1000, gateway: "fw-gw-01" },
  { name: "PAST1/TT-102/PV", kind: "analog", unit: "degC", euLow: 0, euHigh: 200, samplePeriodMs: 1000, gateway: "fw-gw-01" },
  { name: "PAST1/TT-103/PV", kind: "analog", unit: "degC", euLow: 0, euHigh: 150, samplePeriodMs: 1000, gateway: "fw-gw-02" },
  { name: "PAST1/PT-201/PV", kind: "analog", unit: "kPa", euLow: 0, euHigh: 600, samplePeriodMs: 500, gateway: "fw-gw-01" },
  { name: "PAST1/FT-900/PV", kind: "analog", unit: "m3/h", euLow: 0, euHigh: 40, samplePeriodMs: 1000, gateway: "fw-gw-01" },
  { name: "CIP/FQ-1/PV", kind: "counter", unit: "m3", euLow: null, euHigh: null, samplePeriodMs: 1000, gateway: "fw-gw-02" },
];

export const gateways: BundleGateway[] = [
  { slug: "fw-gw-01", pollSeconds: 60 },
  { slug: "fw-gw-02", pollSeconds: 30 },
];

export const shape = (percent: number, output = "shape"): Profile => ({
  name: "Temperature shape",
  kinds: ["analog"],
  outputs: [{ name: output, steps: [{ method: "quality-filter", keep: "good" }, { method: "swinging-door", deviation: { percent }, "max-interval": 600 }] }],
});
export const deadband = (output = "db"): Profile => ({
  name: "Pressure deadband",
  kinds: ["analog"],
  outputs: [{ name: output, steps: [{ method: "deadband", deadband: { value: 0.05, unit: "bar" } }] }],
});

export const profiles = new Map<number, Profile>([
  [13, shape(0.2)],
  [14, shape(0.3)],
  [21, deadband()],
  [22, deadband("deadband")],
]);

const assignment = (revisionId: number, profile: string, revision: number): NonNullable<GroupConfig["assignment"]> => ({
  profileId: revisionId < 20 ? 1 : 2,
  profile,
  revision,
  revisionId,
  overrides: [],
  tags: [],
});

export const config: SiteConfig = {
  groups: [
    { name: "pasteuriser-temperatures", description: "", priority: 1, regulated: true, selector: { patterns: ["PAST1/TT-*/PV"] } as GroupConfig["selector"], assignment: assignment(13, "Temperature shape", 3) },
    { name: "pressures", description: "", priority: 2, regulated: false, selector: { patterns: ["PAST1/PT-*/PV"], units: ["kPa"] } as GroupConfig["selector"], assignment: assignment(21, "Pressure deadband", 1) },
    { name: "counters", description: "", priority: 3, regulated: false, selector: { kinds: ["counter"] } as GroupConfig["selector"], assignment: null },
  ],
};

export const site = { slug: "fenwick-creamery", timeZone: "Europe/London", defaultHandling: "pass-through" as const };

export const input = (over: Partial<SiteBundlesInput> = {}): SiteBundlesInput => ({
  site,
  release: 14,
  issued: "2026-12-01T10:00:00Z",
  keyId: "k2",
  config: structuredClone(config),
  tags: structuredClone(tags),
  profiles,
  ...over,
});
