/**
 * `npx tsx bench/preview.ts`: speed of the preview path (issue #8) in Node — reading a
 * 1,000,000-row sample CSV (ISO 8601 with offset, and epoch ms) and a 20-point swinging
 * door deviation sweep over 1,000,000 samples — each beside a plain loop over the same
 * data measured in the same run. Targets (issue): file → chart ≤ 3 s in the browser,
 * sweep ≤ 2 s. Times are the best (and median) of round-robin runs, min(wall, CPU).
 */
import { gridValues, parseSampleCsv, sweepParameter } from "@/lib/preview";
import { type Profile, type ProfileTag, swingingDoor, measure } from "@/lib/reduction";
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
  { name: "  swingingDoor + measure × 20, direct", samples: 20 * N, run: direct },
  { name: "  plain scan of t and v × 20", samples: 20 * N, run: scan20 },
];

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
