import type { Series } from "@/lib/reduction";

/** The demo signals a tuning page offers when a tag has no sample data yet. */
export const DEMO_SIGNALS = ["temperature", "flow", "vibration", "valve", "totaliser"] as const;
export type DemoSignal = (typeof DEMO_SIGNALS)[number];

export type DemoSignalOptions = {
  samples: number;
  periodMs: number;
  /** First timestamp (epoch ms); default 2026-01-01T00:00Z. */
  start?: number;
  seed?: number;
  euLow?: number;
  euHigh?: number;
  /** Totaliser: the value at which it wraps to 0 (default 1e6). */
  rollover?: number;
};

/** Engineering ranges when none is given: °C, m³/h, mm/s (so bursts pass ISO 10816-3's 7.1 mm/s), 0/1. */
const RANGES: Record<Exclude<DemoSignal, "totaliser">, [number, number]> = {
  temperature: [0, 100],
  flow: [0, 50],
  vibration: [0, 20],
  valve: [0, 1],
};
/** The gap is this many sample periods long (DESIGN.md: a gap is longer than 3). */
const GAP_PERIODS = 20;

/**
 * Mulberry32 (T. Ettinger, public domain — attribution from memory): a small seeded PRNG
 * returning [0, 1), so a demo signal is the same on the server and in the browser.
 */
export function mulberry32(seed: number): () => number {
  let a = seed >>> 0;
  return () => {
    a = (a + 0x6d2b79f5) >>> 0;
    let x = a;
    x = Math.imul(x ^ (x >>> 15), x | 1);
    x ^= x + Math.imul(x ^ (x >>> 7), x | 61);
    return ((x ^ (x >>> 14)) >>> 0) / 4294967296;
  };
}

/**
 * A generated signal of one kind, for trying a profile without sample data — invented
 * shapes, common practice, deterministic for a seed:
 * - temperature: setpoint steps (about every 300 samples) with a first-order response
 *   (time constant 40 samples) and noise of 0.1 % of the range;
 * - flow: a pump running and stopping (dwell 150–600 samples), ~60 % of the range with
 *   2 % noise while running, near zero (never below the range) while stopped;
 * - vibration: a baseline near 9 % of the range with bursts at 45–60 % (9–12 mm/s with
 *   the default 0–20 mm/s), the first one at 40 % of the samples;
 * - valve: states 0 and 1 (whatever the range) with dwell times of 50–400 samples;
 * - totaliser: a ramp with a varying rate that starts at a quarter of `rollover` and
 *   rises by exactly one `rollover`, so it wraps to 0 exactly once.
 * Regular timestamps at `periodMs`, with one gap of 20 periods after 60 % of the
 * samples and bad quality on samples at 30 % (three in a row) and 80 % (one), holding
 * the previous value. Needs at least 10 samples for the gap and bad samples.
 */
export function demoSignal(kind: DemoSignal, opts: DemoSignalOptions): Series {
  const { samples: n, periodMs } = opts;
  if (!DEMO_SIGNALS.includes(kind)) throw new RangeError(`kind must be one of ${DEMO_SIGNALS.join(", ")}, got ${String(kind)}`);
  if (!(Number.isInteger(n) && n >= 0)) throw new RangeError(`samples must be a whole number ≥ 0, got ${n}`);
  if (!(Number.isFinite(periodMs) && periodMs > 0)) throw new RangeError(`periodMs must be > 0, got ${periodMs}`);
  const rand = mulberry32(opts.seed ?? 1);
  const rollover = opts.rollover ?? 1e6;
  if (!(rollover > 0)) throw new RangeError(`rollover must be > 0, got ${rollover}`);
  const [low, high] = kind === "totaliser" ? [0, rollover] : [opts.euLow ?? RANGES[kind][0], opts.euHigh ?? RANGES[kind][1]];
  if (!(low < high)) throw new RangeError(`euLow must be below euHigh, got ${low} and ${high}`);
  const v = GENERATORS[kind](n, rand, low, high - low, rollover);
  const t = new Float64Array(n);
  const q = new Uint8Array(n);
  const start = opts.start ?? Date.UTC(2026, 0, 1);
  const gapAfter = n >= 10 ? Math.floor(0.6 * n) : n;
  for (let i = 0; i < n; i++) t[i] = start + (i + (i > gapAfter ? GAP_PERIODS - 1 : 0)) * periodMs;
  if (n >= 10) {
    const a = Math.floor(0.3 * n);
    for (const i of [a, a + 1, a + 2, Math.floor(0.8 * n)]) {
      q[i] = 2;
      v[i] = v[i - 1];
    }
  }
  return { t, v, q };
}

type Generator = (n: number, rand: () => number, low: number, span: number, rollover: number) => Float64Array;

const gauss = (rand: () => number) => Math.sqrt(-2 * Math.log(1 - rand())) * Math.cos(2 * Math.PI * rand());
const clamp = (x: number, low: number, span: number) => Math.min(low + span, Math.max(low, x));

const GENERATORS: Record<DemoSignal, Generator> = {
  temperature(n, rand, low, span) {
    const v = new Float64Array(n);
    const levels = [0.2, 0.45, 0.72, 0.6];
    let setpoint = low + levels[0] * span;
    let x = setpoint;
    for (let i = 0; i < n; i++) {
      if (i > 0 && i % 300 === 0) setpoint = low + levels[Math.floor(rand() * levels.length)] * span;
      x += (setpoint - x) / 40;
      v[i] = clamp(x + 0.001 * span * gauss(rand), low, span);
    }
    return v;
  },
  flow(n, rand, low, span) {
    const v = new Float64Array(n);
    let running = true;
    let dwell = 150 + Math.floor(rand() * 450);
    let x = low + 0.6 * span;
    for (let i = 0; i < n; i++) {
      if (--dwell <= 0) {
        running = !running;
        dwell = 150 + Math.floor(rand() * 450);
      }
      x += ((running ? low + 0.6 * span : low) - x) / 8;
      v[i] = clamp(x + (running ? 0.02 : 0.002) * span * gauss(rand), low, span);
    }
    return v;
  },
  vibration(n, rand, low, span) {
    const v = new Float64Array(n);
    let burst = 0;
    let level = 0;
    const firstBurst = Math.floor(0.4 * n);
    for (let i = 0; i < n; i++) {
      if (burst === 0 && (i === firstBurst || rand() < 0.002)) {
        burst = 10 + Math.floor(rand() * 40);
        level = 0.45 + 0.15 * rand();
      }
      const base = burst > 0 ? level : 0.09;
      if (burst > 0) burst--;
      v[i] = clamp(low + base * span + 0.01 * span * gauss(rand), low, span);
    }
    return v;
  },
  valve(n, rand) {
    const v = new Float64Array(n);
    let state = 0;
    let dwell = 50 + Math.floor(rand() * 350);
    for (let i = 0; i < n; i++) {
      if (--dwell <= 0) {
        state = 1 - state;
        dwell = 50 + Math.floor(rand() * 350);
      }
      v[i] = state;
    }
    return v;
  },
  totaliser(n, rand, _low, _span, rollover) {
    const v = new Float64Array(n);
    const rates = new Float64Array(n);
    let sum = 0;
    for (let i = 1; i < n; i++) {
      rates[i] = 0.5 + rand();
      sum += rates[i];
    }
    let total = 0.25 * rollover;
    for (let i = 0; i < n; i++) {
      if (i > 0) total += (rates[i] / sum) * rollover;
      // The last sample lands on 1.25 × rollover up to rounding: it has wrapped once.
      v[i] = total >= rollover ? total - rollover : total;
    }
    return v;
  },
};
