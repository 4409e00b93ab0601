import "server-only";
import { QueryTypes } from "sequelize";
import type { z } from "zod";
import { checkInSchema } from "@/lib/gateway/check-in-shape";
import type { GatewayPull } from "./gateway-auth";
import { HttpError } from "@/lib/http";
import { Gateway, GatewayReport, GatewayToken, sequelize } from "@/models";

/** Check-in bodies are small: counters, a message and at most a few thousand tag names. */
export const CHECK_IN_LIMIT_BYTES = 256 * 1024;

export type CheckIn = z.infer<typeof checkInSchema>;
export type CheckInResult = { stored: boolean; lowerRelease: boolean; status: "running" | "failed" };

/**
 * Records a check-in. The same report id twice changes nothing. The release and digest
 * must name a bundle this gateway was given. A gateway's status moves only forward in
 * time: a report whose period ends before the newest one already received is kept in the
 * history but does not overwrite the status. A running report of a lower release than
 * the last running one is recorded and flagged (a gateway must never step back; a
 * rollback in Sluice always publishes a higher number).
 */
export async function recordCheckIn(pull: GatewayPull, input: unknown, now = new Date()): Promise<CheckInResult> {
  const r = checkInSchema.parse(input);
  const known = await sequelize.query<{ digest: string }>(
    `SELECT b.digest FROM releases rl JOIN bundles b ON b.release_id = rl.id AND b.gateway_id = ? WHERE rl.site_id = ? AND rl.number = ?`,
    { replacements: [pull.gatewayId, pull.siteId, r.release], type: QueryTypes.SELECT },
  );
  if (known.length === 0) throw new HttpError(422, `release ${r.release} holds no bundle for this gateway`, "release");
  if (known[0].digest !== r.digest) throw new HttpError(422, `the digest is not that of release ${r.release}'s bundle for this gateway`, "digest");

  return sequelize.transaction(async (transaction) => {
    const gateway = await Gateway.findByPk(pull.gatewayId, { transaction, lock: transaction.LOCK.UPDATE });
    if (!gateway) throw new HttpError(404, "the gateway is gone", "gateway");
    const seen = await GatewayReport.findOne({ where: { gatewayId: gateway.id, reportId: r.report.toLowerCase() }, attributes: ["lowerRelease", "status"], transaction });
    if (seen) return { stored: false, lowerRelease: seen.lowerRelease, status: seen.status };

    const to = new Date(r.to);
    const newest = await GatewayReport.findOne({ where: { gatewayId: gateway.id }, order: [["receivedAt", "DESC"]], attributes: ["toAt"], transaction });
    const late = newest !== null && to < newest.toAt;
    const lowerRelease = r.status === "running" && gateway.runningRelease !== null && r.release < gateway.runningRelease && !late;
    await GatewayReport.create(
      {
        gatewayId: gateway.id,
        reportId: r.report.toLowerCase(),
        release: r.release,
        digest: r.digest,
        status: r.status,
        appliedAt: new Date(r.appliedAt),
        pointsIn: r.pointsIn,
        pointsOut: r.pointsOut,
        fromAt: new Date(r.from),
        toAt: to,
        message: r.message ?? null,
        unknownTags: r.unknownTags ?? null,
        lowerRelease,
        receivedAt: now,
      },
      { transaction },
    );
    if (!late) {
      const target = await currentTarget(gateway.currentBundleId, transaction);
      const changes: Partial<Gateway> & Record<string, unknown> = { lastCheckInAt: now, lastStatus: r.status, staleMailedAt: null };
      if (r.unknownTags) changes.unknownTags = [...new Set(r.unknownTags)].sort().slice(0, 5000);
      if (r.status === "running") {
        Object.assign(changes, { runningRelease: r.release, runningDigest: r.digest, appliedAt: new Date(r.appliedAt), lastMessage: r.message ?? null, failingSince: null, failureMailedAt: null });
        if (lowerRelease) changes.lowerReleaseReported = r.release;
        else if (target !== null && r.release >= target) changes.lowerReleaseReported = null;
      } else {
        Object.assign(changes, { lastMessage: r.message ?? "the gateway reported a failure without a message", failingSince: gateway.failingSince ?? now });
      }
      await gateway.update(changes, { transaction });
    }
    await GatewayToken.update({ lastUsedAt: now }, { where: { id: pull.tokenId }, transaction });
    return { stored: true, lowerRelease, status: r.status };
  });
}

async function currentTarget(bundleId: number | null, transaction: import("sequelize").Transaction): Promise<number | null> {
  if (bundleId === null) return null;
  const rows = await sequelize.query<{ n: number }>("SELECT r.number AS n FROM bundles b JOIN releases r ON r.id = b.release_id WHERE b.id = ?", {
    replacements: [bundleId],
    type: QueryTypes.SELECT,
    transaction,
  });
  return rows[0]?.n ?? null;
}
