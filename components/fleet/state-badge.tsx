import { STATE_LABELS, type GatewayState } from "@/schemas/fleet";

// The label always says the state; the colour only repeats it.
const TONE: Record<GatewayState, string> = {
  current: "bg-ok-soft text-ok",
  behind: "bg-caution-soft text-caution",
  failing: "bg-fault-soft text-fault",
  stale: "bg-fault-soft text-fault",
  awaiting: "bg-panel-sunk text-ink-soft",
  "no-release": "bg-panel-sunk text-ink-soft",
};

/** A gateway's state in words. */
export function StateBadge({ state }: Readonly<{ state: GatewayState }>) {
  return (
    <span className={`inline-block whitespace-nowrap rounded px-1.5 py-0.5 text-label font-medium ${TONE[state]}`} data-state={state}>
      {STATE_LABELS[state]}
    </span>
  );
}
