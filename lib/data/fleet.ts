import "server-only";
import { Op, QueryTypes } from "sequelize";
import type { Actor } from "@/lib/auth/guard";
import { STALE_AFTER_POLLS, gatewayState, reductionRatio } from "@/lib/fleet/state";
import { HttpError } from "@/lib/http";
import { Gateway, Site, Tag, sequelize } from "@/models";
import { GATEWAY_STATES, fleetQuerySchema, type GatewayState } from "@/schemas/fleet";
import { assertCan } from "./access";
import { estimateGatewayRatios, type GatewayEstimate } from "./fleet-estimates";

/** Counters are summed over the reports received in this window (for the running release). */
export const MEASURE_WINDOW_MS = 24 * 3_600_000;

export type FleetGateway = {
  site: string;
  siteName: string;
  slug: string;
  name: string;
  pollSeconds: number;
  /** The release of the bundle a pull serves now; null when there is none. */
  targetRelease: number | null;
  targetDigest: string | null;
  runningRelease: number | null;
  runningDigest: string | null;
  appliedAt: Date | null;
  lastCheckInAt: Date | null;
  /** From this moment on, without a check-in, the gateway counts as stale. */
  staleAt: Date | null;
  state: GatewayState;
  flags: {
    /** A lower release than the one it ran was reported (cleared when the target runs again). */
    lowerReleaseReported: number | null;
    /** It runs the target's number with other bytes than the target's bundle. */
    digestMismatch: boolean;
  };
  /** The message of the last report when that report failed. */
  failureMessage: string | null;
  failingSince: Date | null;
  /** Σ points in ÷ Σ points out over the last 24 h of reports for the running release; null when there are none. */
  measured: { ratio: number | null; pointsIn: number; pointsOut: number; reports: number } | null;
  /** The estimate for the running release (the target before the first check-in); null when there is no release. */
  estimated: GatewayEstimate | null;
  /** Tags the gateway last reported that the site's inventory still lacks. */
  unknownTags: string[];
};

export type SiteRollup = { slug: string; name: string; gateways: number; alerts: number; counts: Record<GatewayState, number> };
export type FleetStatus = { now: Date; sites: SiteRollup[]; gateways: FleetGateway[]; checkedIn: number };

const zeroCounts = () => Object.fromEntries(GATEWAY_STATES.map((s) => [s, 0])) as Record<GatewayState, number>;

function parseTags(v: unknown): string[] {
  let list = v;
  if (typeof v === "string") {
    try {
      list = JSON.parse(v);
    } catch {
      return [];
    }
  }
  return Array.isArray(list) ? list.filter((t): t is string => typeof t === "string") : [];
}

/**
 * Every gateway's target and running release, last check-in, state, failure, measured
 * ratio beside the estimate, and the unknown tags it reports, with a roll-up of states per
 * site. Filters: one site (422 when there is no such site) and one state; the roll-up
 * counts every gateway of the sites shown, whatever the state filter. A fixed number of
 * queries, whatever the size of the fleet.
 */
export async function fleetStatus(actor: Actor | null, filters: { site?: string; state?: string } = {}, now = new Date()): Promise<FleetStatus> {
  assertCan(actor, "read");
  const { site: siteSlug, state } = fleetQuerySchema.parse(filters);
  const sites = await Site.findAll({ where: siteSlug ? { slug: siteSlug } : {}, order: [["name", "ASC"]] });
  if (siteSlug && sites.length === 0) throw new HttpError(422, `no site with slug "${siteSlug}"`, "site");
  const siteIds = sites.map((s) => s.id);
  // By site (as the roll-up), then by gateway name.
  const siteOrder = new Map(siteIds.map((id, i) => [id, i]));
  const gateways = siteIds.length ? await Gateway.findAll({ where: { siteId: siteIds }, order: [["name", "ASC"], ["slug", "ASC"]] }) : [];
  gateways.sort((a, b) => siteOrder.get(a.siteId)! - siteOrder.get(b.siteId)!);
  const ids = gateways.map((g) => g.id);
  const bundleIds = [...new Set(gateways.flatMap((g) => (g.currentBundleId ? [g.currentBundleId] : [])))];

  const unknownNames = [...new Set(gateways.flatMap((g) => parseTags(g.unknownTags)))];
  const [targets, counters, known] = await Promise.all([
    bundleIds.length
      ? sequelize.query<{ id: number; digest: string; number: number }>(
          "SELECT b.id, b.digest, r.number FROM bundles b JOIN releases r ON r.id = b.release_id WHERE b.id IN (:bundleIds)",
          { replacements: { bundleIds }, type: QueryTypes.SELECT },
        )
      : Promise.resolve([]),
    ids.length
      ? sequelize.query<{ gatewayId: number; pointsIn: number; pointsOut: number; reports: number }>(
          `SELECT r.gateway_id AS gatewayId, SUM(r.points_in) AS pointsIn, SUM(r.points_out) AS pointsOut, COUNT(*) AS reports
             FROM gateway_reports r JOIN gateways g ON g.id = r.gateway_id AND r.release = g.running_release
            WHERE r.gateway_id IN (:ids) AND r.received_at > :since AND r.received_at <= :now
            GROUP BY r.gateway_id`,
          { replacements: { ids, since: new Date(now.getTime() - MEASURE_WINDOW_MS), now }, type: QueryTypes.SELECT },
        )
      : Promise.resolve([]),
    unknownNames.length
      ? (Tag.findAll({ where: { siteId: siteIds, name: { [Op.in]: unknownNames } }, attributes: ["siteId", "name"], raw: true }) as unknown as Promise<{ siteId: number; name: string }[]>)
      : Promise.resolve([]),
  ]);
  const targetOf = new Map(targets.map((t) => [Number(t.id), { release: Number(t.number), digest: t.digest }]));
  const countersOf = new Map(counters.map((c) => [Number(c.gatewayId), c]));
  const knownNames = new Set(known.map((t) => `${t.siteId}\u0000${t.name}`));

  const estimates = await estimateGatewayRatios(
    sites,
    gateways.map((g) => ({ id: g.id, siteId: g.siteId, slug: g.slug })),
    gateways.flatMap((g) => {
      const release = g.runningRelease ?? (g.currentBundleId ? targetOf.get(g.currentBundleId)?.release : undefined);
      return release ? [{ gatewayId: g.id, siteId: g.siteId, release }] : [];
    }),
  );

  const siteById = new Map(sites.map((s) => [s.id, s]));
  const rollups = new Map(sites.map((s) => [s.id, { slug: s.slug, name: s.name, gateways: 0, alerts: 0, counts: zeroCounts() }]));
  const all: FleetGateway[] = gateways.map((g) => {
    const site = siteById.get(g.siteId)!;
    const target = g.currentBundleId ? (targetOf.get(g.currentBundleId) ?? null) : null;
    const s = gatewayState({ pollSeconds: g.pollSeconds, targetRelease: target?.release ?? null, runningRelease: g.runningRelease, lastCheckInAt: g.lastCheckInAt, lastStatus: g.lastStatus }, now);
    const c = countersOf.get(g.id);
    const rollup = rollups.get(g.siteId)!;
    rollup.gateways++;
    rollup.counts[s]++;
    if (s === "stale" || s === "failing") rollup.alerts++;
    return {
      site: site.slug,
      siteName: site.name,
      slug: g.slug,
      name: g.name,
      pollSeconds: g.pollSeconds,
      targetRelease: target?.release ?? null,
      targetDigest: target?.digest ?? null,
      runningRelease: g.runningRelease,
      runningDigest: g.runningDigest,
      appliedAt: g.appliedAt,
      lastCheckInAt: g.lastCheckInAt,
      staleAt: g.lastCheckInAt ? new Date(g.lastCheckInAt.getTime() + STALE_AFTER_POLLS * g.pollSeconds * 1000) : null,
      state: s,
      flags: {
        lowerReleaseReported: g.lowerReleaseReported,
        digestMismatch: Boolean(target && g.runningRelease === target.release && g.runningDigest && g.runningDigest !== target.digest),
      },
      failureMessage: g.lastStatus === "failed" ? (g.lastMessage ?? "") : null,
      failingSince: g.lastStatus === "failed" ? g.failingSince : null,
      measured: c ? { ratio: reductionRatio(Number(c.pointsIn), Number(c.pointsOut)), pointsIn: Number(c.pointsIn), pointsOut: Number(c.pointsOut), reports: Number(c.reports) } : null,
      estimated: estimates.get(g.id) ?? null,
      unknownTags: parseTags(g.unknownTags).filter((name) => !knownNames.has(`${g.siteId}\u0000${name}`)),
    };
  });
  return {
    now,
    sites: [...rollups.values()],
    gateways: state ? all.filter((g) => g.state === state) : all,
    checkedIn: gateways.filter((g) => g.lastCheckInAt !== null).length,
  };
}

/**
 * How many gateways are stale or failing (the console's badge on Fleet): one aggregate
 * query over the gateways table, with the same rules as `gatewayState`.
 */
export async function fleetAlertCount(actor: Actor | null, now = new Date()): Promise<number> {
  assertCan(actor, "read");
  const [row] = await sequelize.query<{ n: number }>(
    `SELECT COUNT(*) AS n FROM gateways
      WHERE last_check_in_at IS NOT NULL
        AND (last_status = 'failed' OR last_check_in_at < DATE_SUB(:now, INTERVAL ${STALE_AFTER_POLLS} * poll_seconds SECOND))`,
    { replacements: { now }, type: QueryTypes.SELECT },
  );
  return Number(row?.n ?? 0);
}
