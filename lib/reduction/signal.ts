import { optionalGap, requirePositive } from "./params";
import { QUALITY_GOOD, QUALITY_UNCERTAIN } from "./series";

/**
 * How a method reads a real plant signal (DESIGN.md "Signals"): where its gaps are and
 * which samples it may use. Selection methods keep the samples on both sides of a gap and
 * of a quality change; aggregations use good samples (uncertain ones by choice) and never
 * carry a value across a gap.
 */
export type SignalParams = {
  /** A time step longer than this (ms) is a gap; default: no gaps. See {@link gapThreshold}. */
  gapMs?: number;
  /** Aggregations: use uncertain samples as well as good ones (default false). */
  includeUncertain?: boolean;
};

/** The default gap factor of DESIGN.md "Signals": a step longer than 3 sample periods. */
export const DEFAULT_GAP_FACTOR = 3;

/**
 * The gap threshold of a tag: gapFactor × its sample period (ms). Common practice; the
 * default factor 3 is DESIGN.md's.
 */
export function gapThreshold(samplePeriodMs: number, gapFactor = DEFAULT_GAP_FACTOR): number {
  return requirePositive("samplePeriodMs", samplePeriodMs) * requirePositive("gapFactor", gapFactor);
}

/** Checked signal parameters: [gapMs (Infinity for none), the highest usable quality]. */
export function signalParams(p: SignalParams): [number, number] {
  const gapMs = optionalGap(p.gapMs);
  if (p.includeUncertain !== undefined && typeof p.includeUncertain !== "boolean") {
    throw new RangeError(`includeUncertain must be true or false, got ${String(p.includeUncertain)}`);
  }
  return [gapMs, p.includeUncertain ? QUALITY_UNCERTAIN : QUALITY_GOOD];
}

/** True when a selection method must cut the series into stretches (see stretches.ts). */
export function hasStretches(q: Uint8Array | undefined, gapMs: number): boolean {
  return q !== undefined || gapMs !== Infinity;
}

