import { randomUUID } from "node:crypto";
import { UnreachableError } from "./backoff";
import { type Registry, RefusedError, sendReport } from "./registry";
import type { Report, StateDir, StoredBundle } from "./state";
import type { SyncOutcome } from "./sync";

/** At most this many unknown tags go into one report, each a plausible tag name (the registry refuses longer ones). */
const MAX_UNKNOWN_TAGS = 1000;
const MAX_TAG_LENGTH = 255;
/** The registry keeps messages up to this length. */
const MAX_MESSAGE = 2000;

export type Counters = { pointsIn: number; pointsOut: number; unknownTags: string[] };

/**
 * The check-in for one cycle (DESIGN.md "Gateway API"): `failed` with the refused or
 * unrunnable bundle's release and digest when the pull brought one that could not be
 * applied, else `running` with the bundle in force; counters cover `from`–`to`. Null
 * when there is nothing to name (no bundle in force and none refused).
 */
export function makeReport(outcome: SyncOutcome | null, inForce: StoredBundle | null, counters: Counters, from: string, to: string): Report | null {
  const unknownTags = counters.unknownTags.filter((t) => t.length <= MAX_TAG_LENGTH).slice(0, MAX_UNKNOWN_TAGS);
  const base = {
    report: randomUUID(),
    pointsIn: counters.pointsIn,
    pointsOut: counters.pointsOut,
    // A clock set back must not give a span the registry refuses.
    from: Date.parse(from) <= Date.parse(to) ? from : to,
    to,
    ...(unknownTags.length > 0 ? { unknownTags } : {}),
  };
  const said = (m: string | undefined) => (m ? { message: m.slice(0, MAX_MESSAGE) } : {});
  const refusedRelease = outcome?.kind === "refused" && outcome.release !== null && outcome.release >= 1 && outcome.digest !== null;
  if (outcome?.kind === "failed" || refusedRelease) {
    return { ...base, release: outcome.release!, digest: outcome.digest!, status: "failed", appliedAt: to, ...said(outcome.message) };
  }
  if (inForce === null) return null;
  const message = outcome?.kind === "refused" ? outcome.message : outcome?.kind === "unchanged" ? outcome.problem : undefined;
  return { ...base, release: inForce.release, digest: inForce.digest, status: "running", appliedAt: inForce.appliedAt, ...said(message) };
}

/**
 * Sends the outbox oldest first, each report under its own id (the registry ignores a
 * repeat, so a report that arrived but whose answer was lost is safely sent again).
 * Stops at the first that cannot be delivered now (unreachable, 401/403, 429/5xx),
 * keeping it and the rest; a report the registry refuses for itself (another 4xx) is
 * dropped, since sending it again cannot help.
 */
export async function deliverReports(reg: Registry, state: StateDir, log: (line: string) => void): Promise<{ sent: number; kept: number }> {
  const pending = state.pendingReports();
  let sent = 0;
  for (const [i, { file, report }] of pending.entries()) {
    try {
      await sendReport(reg, report);
      sent++;
      state.removeReport(file);
    } catch (e) {
      if (e instanceof RefusedError && e.status !== 401 && e.status !== 403) {
        log(`check-in ${report.report} dropped: ${e.message}`);
        state.removeReport(file);
        continue;
      }
      if (!(e instanceof UnreachableError) && !(e instanceof RefusedError)) throw e;
      log(`check-in: ${pending.length - i} report(s) kept for later: ${e.message}`);
      return { sent, kept: pending.length - i };
    }
  }
  return { sent, kept: 0 };
}
