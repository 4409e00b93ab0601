import "server-only";
import { sweepGatewayAlerts } from "@/lib/data/fleet-alerts";

/** How often each server process looks for failing and stale gateways. */
export const SWEEP_INTERVAL_MS = 60_000;

const globalForSweep = globalThis as unknown as { sluiceAlertSweep?: ReturnType<typeof setInterval> };

/**
 * Starts the gateway alert sweep in this process, once (a second call, e.g. after a dev
 * reload, does nothing). The timer does not keep the process alive, and a sweep still
 * running when the next is due is not overlapped. Every instance may run it: the sweep
 * claims each alert in the database before mailing.
 */
export function startAlertSweeps(): void {
  if (globalForSweep.sluiceAlertSweep) return;
  let running = false;
  const tick = async () => {
    if (running) return;
    running = true;
    try {
      await sweepGatewayAlerts();
    } catch (err) {
      console.error(`fleet: gateway alert sweep failed: ${err instanceof Error ? err.message : String(err)}`);
    } finally {
      running = false;
    }
  };
  globalForSweep.sluiceAlertSweep = setInterval(tick, SWEEP_INTERVAL_MS);
  globalForSweep.sluiceAlertSweep.unref();
}
