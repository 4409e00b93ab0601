import "server-only";
import { Op, QueryTypes } from "sequelize";
import { STALE_AFTER_POLLS } from "@/lib/fleet/state";
import { gatewaysFailingMail, gatewaysStaleMail, type GatewayAlertRef } from "@/lib/mail/messages";
import { sendMail } from "@/lib/mail/send";
import { User, sequelize } from "@/models";

export type AlertKind = "failing" | "stale";
export type SweepResult = { mailed: { kind: AlertKind; site: string; gateways: string[]; sent: boolean }[] };

type Candidate = {
  id: number;
  slug: string;
  name: string;
  pollSeconds: number;
  runningRelease: number | null;
  targetRelease: number | null;
  lastCheckInAt: Date;
  lastMessage: string | null;
  siteSlug: string;
  siteName: string;
  failing: number;
  stale: number;
};

const STALE = `g.last_check_in_at < DATE_SUB(:now, INTERVAL ${STALE_AFTER_POLLS} * g.poll_seconds SECOND)`;
const FAILING = "g.last_status = 'failed'";

// The claim of one episode: only the sweep whose UPDATE changes the row mails it, so two
// app instances sweeping at once send one message. The conditions are checked again, so
// a good check-in that landed in between is not mailed about.
const CLAIM: Record<AlertKind, string> = {
  failing: `UPDATE gateways g SET g.failure_mailed_at = :now WHERE g.id = :id AND g.failure_mailed_at IS NULL AND ${FAILING}`,
  stale: `UPDATE gateways g SET g.stale_mailed_at = :now WHERE g.id = :id AND g.stale_mailed_at IS NULL AND g.last_check_in_at IS NOT NULL AND ${STALE}`,
};

async function claim(kind: AlertKind, id: number, now: Date): Promise<boolean> {
  const changed = await sequelize.query(CLAIM[kind], { replacements: { id, now }, type: QueryTypes.BULKUPDATE });
  return Number(changed) === 1;
}

/** Active reviewers and administrators, as the review workflow's mail picks them (lib/data/notify.ts). */
async function reviewersAndAdmins(): Promise<string[]> {
  return (await User.findAll({ where: { role: { [Op.in]: ["reviewer", "admin"] }, active: true }, attributes: ["email"] })).map((u) => u.email);
}

/**
 * Mails reviewers and administrators once per episode when a gateway's last report
 * failed (failure_mailed_at unset) or it has not checked in for three poll intervals
 * (stale_mailed_at unset); one message per site and kind. Each gateway is claimed with a
 * conditional UPDATE first, so concurrent sweeps on several app instances mail it once.
 * The check-in write path clears the marks on a good check-in, which re-arms the alert.
 * Runs every minute in each server process (instrumentation.ts) and after a failed
 * check-in. A message that cannot be sent is logged by sendMail and not retried.
 */
export async function sweepGatewayAlerts(now = new Date()): Promise<SweepResult> {
  const candidates = await sequelize.query<Candidate>(
    `SELECT g.id, g.slug, g.name, g.poll_seconds AS pollSeconds, g.running_release AS runningRelease, r.number AS targetRelease,
            g.last_check_in_at AS lastCheckInAt, g.last_message AS lastMessage, s.slug AS siteSlug, s.name AS siteName,
            (${FAILING} AND g.failure_mailed_at IS NULL) AS failing, (${STALE} AND g.stale_mailed_at IS NULL) AS stale
       FROM gateways g
       JOIN sites s ON s.id = g.site_id
       LEFT JOIN bundles b ON b.id = g.current_bundle_id
       LEFT JOIN releases r ON r.id = b.release_id
      WHERE g.last_check_in_at IS NOT NULL
        AND ((${FAILING} AND g.failure_mailed_at IS NULL) OR (${STALE} AND g.stale_mailed_at IS NULL))
      ORDER BY s.name, g.name`,
    { replacements: { now }, type: QueryTypes.SELECT },
  );
  const result: SweepResult = { mailed: [] };
  if (candidates.length === 0) return result;

  const claimed = new Map<string, { kind: AlertKind; site: { slug: string; name: string }; gateways: GatewayAlertRef[] }>();
  for (const c of candidates) {
    for (const kind of ["failing", "stale"] as const) {
      if (!Number(c[kind]) || !(await claim(kind, c.id, now))) continue;
      const key = `${kind}\u0000${c.siteSlug}`;
      if (!claimed.has(key)) claimed.set(key, { kind, site: { slug: c.siteSlug, name: c.siteName }, gateways: [] });
      claimed.get(key)!.gateways.push({
        slug: c.slug,
        name: c.name,
        runningRelease: c.runningRelease === null ? null : Number(c.runningRelease),
        targetRelease: c.targetRelease === null ? null : Number(c.targetRelease),
        lastCheckInAt: new Date(c.lastCheckInAt),
        pollSeconds: Number(c.pollSeconds),
        message: c.lastMessage,
      });
    }
  }
  if (claimed.size === 0) return result;

  const to = [...new Set(await reviewersAndAdmins())];
  for (const { kind, site, gateways } of claimed.values()) {
    const mail = kind === "failing" ? gatewaysFailingMail({ site, gateways }) : gatewaysStaleMail({ site, gateways });
    const sent = to.length > 0 && (await sendMail({ to, ...mail })).ok;
    if (to.length === 0) console.error(`mail: not sent "${mail.subject}": no active reviewer or administrator`);
    result.mailed.push({ kind, site: site.slug, gateways: gateways.map((g) => g.slug), sent });
  }
  return result;
}
