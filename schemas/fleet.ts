import { z } from "zod";
import { SLUG_PATTERN } from "./site";

/**
 * Where a gateway stands, judged from what it last reported (DESIGN.md "Target release /
 * running release", "Check-in"): running its target, running an older release, its last
 * report failed, silent for three poll intervals, has a target but never checked in, or
 * nothing to pull yet.
 */
export const GATEWAY_STATES = ["current", "behind", "failing", "stale", "awaiting", "no-release"] as const;
export type GatewayState = (typeof GATEWAY_STATES)[number];

/** How people read each state (the console and the mail say these words). */
export const STATE_LABELS: Record<GatewayState, string> = {
  current: "Current",
  behind: "Behind",
  failing: "Failing",
  stale: "Stale",
  awaiting: "Awaiting first check-in",
  "no-release": "No release",
};

// An empty value (a form's "any" option) means no filter.
const blankIsUnset = <T extends z.ZodType>(inner: T) => z.preprocess((v) => (v === "" || v === null ? undefined : v), inner);

/** Filters of the fleet status, from a query string (page and GET /api/fleet). */
export const fleetQuerySchema = z.object({
  site: blankIsUnset(z.string().trim().regex(SLUG_PATTERN, "Give a site's slug.").optional()),
  state: blankIsUnset(z.enum(GATEWAY_STATES, { error: `Give one of: ${GATEWAY_STATES.join(", ")}.` }).optional()),
});
export type FleetQuery = z.infer<typeof fleetQuerySchema>;
