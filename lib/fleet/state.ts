import type { GatewayState } from "@/schemas/fleet";

/** A gateway is stale after this many poll intervals without a check-in (DESIGN.md bundle `poll`). */
export const STALE_AFTER_POLLS = 3;

export type StateInput = {
  pollSeconds: number;
  /** The release of the gateway's current bundle (what a pull serves); null when there is none. */
  targetRelease: number | null;
  runningRelease: number | null;
  lastCheckInAt: Date | null;
  lastStatus: "running" | "failed" | null;
};

/** The moment before which a last check-in makes the gateway stale. */
export function staleBefore(pollSeconds: number, now: Date): Date {
  return new Date(now.getTime() - STALE_AFTER_POLLS * pollSeconds * 1000);
}

/**
 * Where a gateway stands at `now`, first match wins:
 * never checked in → "awaiting" with a target, else "no-release";
 * no check-in for more than 3 poll intervals → "stale" (what it said last may no longer hold);
 * last report failed → "failing"; no target → "no-release";
 * running the target → "current"; otherwise → "behind".
 * "stale" and "failing" are the alert states (the nav badge and the e-mails).
 */
export function gatewayState(g: StateInput, now: Date): GatewayState {
  if (g.lastCheckInAt === null) return g.targetRelease === null ? "no-release" : "awaiting";
  if (g.lastCheckInAt.getTime() < staleBefore(g.pollSeconds, now).getTime()) return "stale";
  if (g.lastStatus === "failed") return "failing";
  if (g.targetRelease === null) return "no-release";
  if (g.runningRelease !== null && g.runningRelease >= g.targetRelease) return "current";
  return "behind";
}

/** A ratio of points in to points out; null when nothing went out (all dropped) or nothing came in. */
export function reductionRatio(pointsIn: number, pointsOut: number): number | null {
  if (!(pointsIn > 0) || !(pointsOut > 0)) return null;
  return pointsIn / pointsOut;
}
