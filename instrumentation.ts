// Next.js calls register() once when a server instance starts (node_modules/next/dist/docs/01-app/02-guides/instrumentation.md).

export async function register() {
  // The Node.js server only: not the edge runtime, and not the build's prerendering workers.
  if (process.env.NEXT_RUNTIME !== "nodejs" || process.env.NEXT_PHASE === "phase-production-build") return;
  const { startAlertSweeps } = await import("./lib/fleet/alert-timer");
  startAlertSweeps();
}
