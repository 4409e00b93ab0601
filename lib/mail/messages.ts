import "server-only";
import { env } from "@/lib/env";

// The e-mails of the review workflow (DESIGN.md "Review and release"). Each builder takes
// plain data and returns the subject and plain text; sendMail adds sender and recipients.

export type BuiltMail = { subject: string; text: string };

export type SiteRef = { name: string; slug: string };

type Common = {
  site: SiteRef;
  /** Who did it, as people know them (name, or name and e-mail). */
  by: string;
  /** A link to the page to open; by default the change's or release's page in the console. */
  url?: string;
};

export type ReviewRequestedMail = Common & { changeId: number; note?: string | null };
export type ReviewDecisionMail = Common & { changeId: number; comment?: string | null };
export type ReleasedMail = Common & { release: number; changeId?: number | null; gateways?: number | null; comment?: string | null };
/** An urgent rollback (no second person) must carry its written reason. */
export type RolledBackMail = Common & { release: number; restores: number } & (
    | { urgent: true; reason: string }
    | { urgent?: false; reason?: string | null }
  );

/** The console's address for links in mail: PUBLIC_URL, else NEXTAUTH_URL. */
export function consoleUrl(path: string): string {
  const e = env();
  const base = (e.PUBLIC_URL ?? e.NEXTAUTH_URL ?? "http://localhost:3000").replace(/\/+$/, "");
  return `${base}${path.startsWith("/") ? path : `/${path}`}`;
}

const sitePath = (site: SiteRef) => `/sites/${encodeURIComponent(site.slug)}`;
const changeUrl = (d: Common & { changeId: number }) => d.url ?? consoleUrl(`${sitePath(d.site)}/changes/${d.changeId}`);
const releaseUrl = (d: Common & { release: number }) => d.url ?? consoleUrl(`${sitePath(d.site)}/releases/${d.release}`);

// Header values stay on one line whatever the data holds.
const oneLine = (s: string) => s.replace(/\s+/g, " ").trim();
const subject = (s: string) => oneLine(`[Sluice] ${s}`);
const siteLabel = (site: SiteRef) => `${oneLine(site.name)} (${site.slug})`;
const quoted = (s: string) =>
  s
    .trim()
    .split(/\r?\n/)
    .map((line) => `  ${line}`)
    .join("\n");

function body(...blocks: (string | null | undefined | false)[]): string {
  return [...blocks.filter((b): b is string => Boolean(b)), "— Sluice"].join("\n\n") + "\n";
}

/** A change was submitted: reviewers are asked to look at its diff and impact. */
export function reviewRequestedMail(d: ReviewRequestedMail): BuiltMail {
  return {
    subject: subject(`Review requested: change #${d.changeId} at ${d.site.name}`),
    text: body(
      `${oneLine(d.by)} submitted change #${d.changeId} at ${siteLabel(d.site)} for review.`,
      d.note?.trim() ? `Their note:\n${quoted(d.note)}` : null,
      `Review the diff, its accuracy and bandwidth impact, then approve or reject it:\n${changeUrl(d)}`,
      "You cannot approve a change you contributed to.",
    ),
  };
}

/** A reviewer approved a change; it may now be released. */
export function changeApprovedMail(d: ReviewDecisionMail): BuiltMail {
  return {
    subject: subject(`Approved: change #${d.changeId} at ${d.site.name}`),
    text: body(
      `${oneLine(d.by)} approved change #${d.changeId} at ${siteLabel(d.site)}. It is ready to release.`,
      d.comment?.trim() ? `Comment:\n${quoted(d.comment)}` : null,
      changeUrl(d),
    ),
  };
}

/** A reviewer rejected a change; it is back in draft. */
export function changeRejectedMail(d: ReviewDecisionMail): BuiltMail {
  return {
    subject: subject(`Rejected: change #${d.changeId} at ${d.site.name}`),
    text: body(
      `${oneLine(d.by)} rejected change #${d.changeId} at ${siteLabel(d.site)}. The change is back in draft.`,
      d.comment?.trim() ? `Reason:\n${quoted(d.comment)}` : "No reason was given.",
      changeUrl(d),
    ),
  };
}

/** A release was published; the site's gateways pick it up on their next pull. */
export function releasedMail(d: ReleasedMail): BuiltMail {
  const gateways = d.gateways == null ? null : `${d.gateways} gateway${d.gateways === 1 ? "" : "s"}`;
  return {
    subject: subject(`Released: ${d.site.name} release ${d.release}`),
    text: body(
      `${oneLine(d.by)} released release ${d.release} of ${siteLabel(d.site)}${d.changeId != null ? ` from change #${d.changeId}` : ""}.`,
      gateways ? `Bundles were issued for ${gateways}; each picks up its bundle on its next pull.` : null,
      d.comment?.trim() ? `Comment:\n${quoted(d.comment)}` : null,
      releaseUrl(d),
    ),
  };
}

/** A site was rolled back: an earlier configuration released under a new number. */
export function rolledBackMail(d: RolledBackMail): BuiltMail {
  const what = `${d.site.name} back to release ${d.restores} (as release ${d.release})`;
  const reason = d.reason?.trim();
  return {
    subject: subject(d.urgent ? `URGENT rollback: ${what}` : `Rolled back: ${what}`),
    text: body(
      `${oneLine(d.by)} rolled ${siteLabel(d.site)} back to the configuration of release ${d.restores}. It is published as release ${d.release}.`,
      d.urgent
        ? `This was an urgent rollback, released without a second person's approval. It is flagged in the site's history.\nReason given:\n${reason ? quoted(reason) : "  (no reason was recorded)"}`
        : reason
          ? `Reason:\n${quoted(reason)}`
          : null,
      releaseUrl(d),
    ),
  };
}

// Gateway alerts (DESIGN.md "E-mail for … gateways failing or stale"), one message per site and kind.

export type GatewayAlertRef = {
  slug: string;
  name: string;
  /** The release it last said it runs (its last good bundle), if any. */
  runningRelease: number | null;
  /** The release its bundle pull serves now, if any. */
  targetRelease: number | null;
  lastCheckInAt: Date;
  pollSeconds: number;
  /** The failed report's message. */
  message?: string | null;
};
export type GatewayAlertMail = { site: SiteRef; gateways: GatewayAlertRef[]; url?: string };

const utc = (d: Date) => d.toISOString().replace("T", " ").replace(/\.\d{3}Z$/, " UTC");
const fleetUrl = (d: GatewayAlertMail, state: string) => d.url ?? consoleUrl(`/fleet?site=${encodeURIComponent(d.site.slug)}&state=${state}`);
const gatewayLabel = (g: GatewayAlertRef) => `${oneLine(g.name)} (${g.slug})`;
const alertSubject = (d: GatewayAlertMail, what: string) =>
  subject(d.gateways.length === 1 ? `Gateway ${what}: ${d.gateways[0].slug} at ${d.site.name}` : `${d.gateways.length} gateways ${what} at ${d.site.name}`);
const runs = (g: GatewayAlertRef) => (g.runningRelease === null ? "It has not reported running any release." : `It last reported running release ${g.runningRelease}.`);

/** Gateways reported that they could not apply their bundle. */
export function gatewaysFailingMail(d: GatewayAlertMail): BuiltMail {
  return {
    subject: alertSubject(d, "failing"),
    text: body(
      `${d.gateways.length === 1 ? "A gateway" : `${d.gateways.length} gateways`} at ${siteLabel(d.site)} reported a failure:`,
      ...d.gateways.map((g) =>
        [
          `${gatewayLabel(g)}, report of ${utc(g.lastCheckInAt)}${g.targetRelease !== null ? `, target release ${g.targetRelease}` : ""}.`,
          g.message?.trim() ? `Its message:\n${quoted(g.message)}` : "It gave no message.",
          runs(g),
        ].join("\n"),
      ),
      "A failing gateway may still be forwarding with its last good bundle. Reduction is lossy: keep the raw record wherever local regulations and licensed practice require it.",
      `See the fleet status:\n${fleetUrl(d, "failing")}`,
      "You get one message per failure; the next comes after the gateway has checked in well again.",
    ),
  };
}

/** Gateways stopped checking in for three poll intervals. */
export function gatewaysStaleMail(d: GatewayAlertMail): BuiltMail {
  return {
    subject: alertSubject(d, "stale"),
    text: body(
      `${d.gateways.length === 1 ? "A gateway" : `${d.gateways.length} gateways`} at ${siteLabel(d.site)} stopped checking in:`,
      ...d.gateways.map((g) =>
        [`${gatewayLabel(g)}: last check-in ${utc(g.lastCheckInAt)}; it polls every ${g.pollSeconds} s and is stale after three missed polls.`, runs(g)].join("\n"),
      ),
      "A stale gateway may be offline, cut off from Sluice, or stopped. While it cannot reach Sluice it keeps reducing and buffering with the bundle it last applied.",
      `See the fleet status:\n${fleetUrl(d, "stale")}`,
      "You get one message per silence; the next comes after the gateway has checked in again.",
    ),
  };
}
