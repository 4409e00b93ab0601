/**
 * `npx tsx bench/preview.ts`: speed of the preview path (issue #8) in Node — reading a
 * 1,000,000-row sample CSV (ISO 8601 with offset, and epoch ms) and a 20-point swinging
 * door deviation sweep over 1,000,000 samples — each beside a plain loop over the same
 * data measured in the same run. Targets (issue): file → chart ≤ 3 s in the browser,
 * sweep ≤ 2 s. Times are the best (and median) of round-robin runs, min(wall, CPU).
 * Each sweep also runs the straightforward way (runProfile and measureOutput per value,
 * as sweepParameter did before its fast path), and once more as the workbench's demo
 * profile (quality filter → swinging door) on the same data with quality (1 bad sample
 * in 50,000, as bench/workbench.ts writes).
 */
import { gridValues, parseSampleCsv, reconstructionOf, sweepParameter, type SweepTarget } from "@/lib/preview";
import { measureGapMs, measureOutput } from "@/lib/preview/run";
import { type Profile, type ProfileTag, type Series, gapThreshold, measure, resolveSteps, runProfile, swingingDoor } from "@/lib/reduction";
import { cpus, loadavg } from "node:os";
import { benchSeries } from "./series";
import { roundRobin } from "./timing";

const N = 1_000_000;
const ROUNDS = 5;
const WARMUPS = 1;
const s = benchSeries(N);

function csvText(time: (t: number) => string): string {
  const rows = new Array<string>(N + 1);
  rows[0] = "time,value";
  for (let i = 0; i < N; i++) rows[i + 1] = `${time(s.t[i])},${s.v[i].toFixed(4)}`;
  return rows.join("\n");
}
// 2026-01-01T01:00:00.500+01:00: the instant written in UTC+1.
const isoCsv = csvText((t) => new Date(t + 3_600_000).toISOString().replace("Z", "+01:00"));
const msCsv = csvText((t) => String(t));

/** The least a parser can do: read every character once. Returns straight after the loop (see bench/index.ts). */
function readChars(text: string): number {
  let lines = 0;
  for (let i = 0; i < text.length; i++) if (text.charCodeAt(i) === 10) lines++;
  return lines;
}

const TAG: ProfileTag = { name: "BENCH/TT-1/PV", kind: "analog", unit: "degC", euLow: 0, euHigh: 100, samplePeriodMs: 1000 };
const PROFILE: Profile = { name: "bench", kinds: ["analog"], outputs: [{ name: "shape", steps: [{ method: "swinging-door", deviation: { value: 0.5, unit: "degC" } }] }] };
const VALUES = gridValues(0.05, 2, 20, "log");
const sweep = () => sweepParameter(s, PROFILE, TAG, { output: "shape", step: 0, parameter: "deviation" }, VALUES, {});

/** Quality filter → swinging door, as the workbench's "Temperature shape" profile; the bench series with 1 bad sample in 50,000. */
const QF_PROFILE: Profile = {
  name: "bench-qf",
  kinds: ["analog"],
  outputs: [{ name: "shape", steps: [{ method: "quality-filter", keep: "good" }, { method: "swinging-door", deviation: { value: 0.3, unit: "degC" }, "max-interval": 600 }] }],
};
const sq: Series = { t: s.t, v: s.v, q: Uint8Array.from({ length: N }, (_, i) => (i % 50_000 === 25_000 ? 2 : 0)) };
const qfTarget: SweepTarget = { output: "shape", step: 1, parameter: "deviation" };
const sweepQf = () => sweepParameter(sq, QF_PROFILE, TAG, qfTarget, VALUES, {});

/** The straightforward sweep (sweepParameter before its fast path): the whole output and every metric, once per value. */
function perValue(series: Series, profile: Profile, target: SweepTarget) {
  const gapMs = measureGapMs(series, gapThreshold(TAG.samplePeriodMs));
  return VALUES.map((value) => {
    const ctx = { overrides: [{ ...target, value: { value, unit: "degC" } }] };
    const reconstruction = reconstructionOf(resolveSteps(profile, TAG, ctx).outputs[0].steps);
    const run = runProfile(series, profile, TAG, ctx)[target.output];
    return measureOutput(series, run.series, run.kept ?? null, reconstruction, gapMs, null);
  });
}
/** The same 20 reductions and measurements called directly, without the profile runner (no gaps and no quality: measure's plain loops). */
const direct = () => VALUES.map((deviation) => measure(s, swingingDoor(s, { deviation, gapMs: 3000 }), { reconstruction: "linear" }));

function scan(): number {
  const { t, v } = s;
  let sum = 0;
  let prev = -Infinity;
  for (let i = 0; i < N; i++) {
    const ti = t[i];
    if (!(ti > prev)) sum = Number.NaN;
    prev = ti;
    sum += v[i];
  }
  return sum;
}
const scan20 = () => {
  let x = 0;
  for (let k = 0; k < 20; k++) x += scan();
  return x;
};

const check = parseSampleCsv(isoCsv, { timeZone: "Europe/Dublin" });
if (!check.ok || check.rows !== N || check.series.t[N - 1] !== s.t[N - 1]) throw new Error("the ISO CSV did not read back");

const cases: { name: string; samples: number; run: () => unknown; target?: string }[] = [
  { name: "parseSampleCsv ISO +01:00", samples: N, run: () => parseSampleCsv(isoCsv, { timeZone: "Europe/Dublin" }), target: "file → chart ≤ 3 s (browser)" },
  { name: "  plain loop: read every char", samples: N, run: () => readChars(isoCsv) },
  { name: "parseSampleCsv epoch ms", samples: N, run: () => parseSampleCsv(msCsv, { timeZone: "UTC" }) },
  { name: "  plain loop: read every char", samples: N, run: () => readChars(msCsv) },
  { name: "sweep 20 deviations (sweepParameter)", samples: 20 * N, run: sweep, target: "sweep ≤ 2 s" },
  { name: "  per value: runProfile + measureOutput", samples: 20 * N, run: () => perValue(s, PROFILE, { output: "shape", step: 0, parameter: "deviation" }) },
  { name: "  swingingDoor + measure × 20, direct", samples: 20 * N, run: direct },
  { name: "sweep 20, quality filter → door", samples: 20 * N, run: sweepQf, target: "sweep ≤ 2 s" },
  { name: "  per value: runProfile + measureOutput", samples: 20 * N, run: () => perValue(sq, QF_PROFILE, qfTarget) },
  { name: "  plain scan of t and v × 20", samples: 20 * N, run: scan20 },
];

for (const [fast, slow] of [[sweep(), perValue(s, PROFILE, { output: "shape", step: 0, parameter: "deviation" })], [sweepQf(), perValue(sq, QF_PROFILE, qfTarget)]] as const) {
  fast.forEach((p, k) => {
    if (p.ratio !== slow[k].ratio || p.maxAbsError !== slow[k].maxAbsError || p.rmse !== slow[k].rmse) throw new Error(`sweep point ${k} differs from the per-value run`);
  });
}

console.log(`load average ${loadavg().map((x) => x.toFixed(2)).join(", ")} on ${cpus().length} CPUs`);
console.log(`preview bench: ${N.toLocaleString("en")} samples; ISO CSV ${(isoCsv.length / 1e6).toFixed(1)} MB, epoch-ms CSV ${(msCsv.length / 1e6).toFixed(1)} MB; best of ${ROUNDS} (median)`);
const timings = roundRobin(
  cases.map((c) => c.run),
  ROUNDS,
  WARMUPS,
);
cases.forEach((c, k) => {
  const { bestMs, medianMs } = timings[k];
  const msps = c.samples / 1e6 / (bestMs / 1000);
  console.log(`${c.name.padEnd(40)} ${bestMs.toFixed(0).padStart(6)} ms (${medianMs.toFixed(0)})  ${msps.toFixed(1).padStart(7)} Msamples/s${c.target ? `   target: ${c.target}` : ""}`);
});
console.log(`load average ${loadavg().map((x) => x.toFixed(2)).join(", ")}`);
