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
