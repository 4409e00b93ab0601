// Bandwidth, storage and cost estimates (issue #8, DESIGN.md "Metrics" and "Site"):
// hand-worked arithmetic, written out beside each check.
import { describe, expect, it } from "vitest";
import { DEFAULT_RATIOS, defaultRatio, estimateGroup, estimateSite, measuredPeakRatio, type GroupEstimateInput, type SiteEstimateInput } from "@/lib/estimates";

// Byte model: 16 bytes per sample + 10 % transport overhead = 17.6 bytes per sample sent.
const SITE: SiteEstimateInput = {
  uplinkBudgetKbps: 64,
  headroom: 0.25,
  storagePricePerGbMonth: 0.02,
  retentionMonths: 24,
  byteModel: { bytesPerSample: 16, transportOverhead: 0.1 },
};
const tags = (n: number, samplePeriodMs: number) => Array.from({ length: n }, () => ({ samplePeriodMs }));

// 1,000 tags every 1 s: 1,000 × 86,400,000 / 1,000 = 86,400,000 samples a day.
// One output at 10:1 (peak 4:1, 80 bits per sample): 8,640,000 samples out a day.
const PLANT: GroupEstimateInput = { group: "plant", tags: tags(1000, 1000), outputs: [{ output: "shape", ratio: 10, peakRatio: 4, bitsPerSample: 80, source: "measured" }] };

describe("estimateGroup — 1,000 tags at 1 s, 10:1", () => {
  const g = estimateGroup(PLANT, SITE);

  it("samples a day in and out", () => {
    expect(g.samplesPerDayIn).toBe(86_400_000);
    expect(g.samplesPerDayOut).toBe(8_640_000);
  });

  it("bytes a day: plain 8,640,000 × 16 × 1.1 = 152,064,000; compressed 8,640,000 × 80 / 8 = 86,400,000", () => {
    expect(g.bytesPerDayPlain).toBeCloseTo(152_064_000, 3);
    expect(g.bytesPerDayCompressed).toBe(86_400_000);
  });

  it("GB a month: 152,064,000 × 30.4375 days / 1e9 = 4.628448", () => {
    expect(g.gbPerMonthPlain).toBeCloseTo(4.628448, 9);
  });

  it("mean kbit/s: 152,064,000 × 8 / 86,400 / 1000 = 14.08; peak at 4:1: 21,600,000 × 17.6 × 8 / 86,400 / 1000 = 35.2", () => {
    expect(g.meanKbps).toBeCloseTo(14.08, 9);
    expect(g.peakKbps).toBeCloseTo(35.2, 9);
  });

  it("outputs add up (each is a series); a dropped output (ratio Infinity) sends nothing", () => {
    const two = estimateGroup(
      {
        ...PLANT,
        outputs: [
          ...PLANT.outputs,
          { output: "avg", ratio: 60, peakRatio: 60, bitsPerSample: 64, source: "default" },
          { output: "none", ratio: Infinity, peakRatio: Infinity, bitsPerSample: 0, source: "default" },
        ],
      },
      SITE,
    );
    // 8,640,000 + 86,400,000 / 60 = 8,640,000 + 1,440,000 = 10,080,000.
    expect(two.samplesPerDayOut).toBe(10_080_000);
    // Compressed: 86,400,000 + 1,440,000 × 64 / 8 = 86,400,000 + 11,520,000.
    expect(two.bytesPerDayCompressed).toBe(97_920_000);
  });

  it("mixed sample periods: 10 tags at 100 ms + 5 at 60 s = 10 × 864,000 + 5 × 1,440 = 8,647,200 a day", () => {
    const g2 = estimateGroup({ group: "mixed", tags: [...tags(10, 100), ...tags(5, 60_000)], outputs: [{ output: "raw", ratio: 1, peakRatio: 1, bitsPerSample: 64, source: "default" }] }, SITE);
    expect(g2.samplesPerDayIn).toBe(8_647_200);
  });

  it("refuses a zero sample period or ratio", () => {
    expect(() => estimateGroup({ ...PLANT, tags: tags(1, 0) }, SITE)).toThrow(RangeError);
    expect(() => estimateGroup({ ...PLANT, outputs: [{ ...PLANT.outputs[0], ratio: 0 }] }, SITE)).toThrow(RangeError);
  });
});

describe("estimateSite", () => {
  it("storage at retention, its cost, usable uplink, catch-up after an outage", () => {
    const s = estimateSite([PLANT], SITE);
    // 4.628448 GB/month × 24 months = 111.082752 GB; × 0.02 per GB-month = 2.22165504 a month.
    expect(s.storageGbAtRetention).toBeCloseTo(111.082752, 9);
    expect(s.storageCostPerMonthAtRetention).toBeCloseTo(2.22165504, 9);
    // Usable = 64 × (1 − 0.25) = 48 kbit/s; mean 14.08 and peak 35.2 both fit.
    expect(s.budgetKbps).toBe(64);
    expect(s.usableKbps).toBe(48);
    expect(s.overBudgetMean).toBe(false);
    expect(s.overBudgetPeak).toBe(false);
    // After 1 h: backlog 14.08 × 3600 = 50,688 kbit, drained at 48 − 14.08 = 33.92 kbit/s → 1,494.34 s.
    expect(s.catchUpSeconds(3600)).toBeCloseTo(50_688 / 33.92, 9);
    expect(s.catchUpSeconds(3600)).toBeCloseTo(1494.3396, 3);
    expect(s.catchUpSeconds(0)).toBe(0);
  });

  it("totals are the sums of the groups", () => {
    const s = estimateSite([PLANT, { ...PLANT, group: "second", tags: tags(500, 1000) }], SITE);
    // 8,640,000 + 4,320,000 samples out; 14.08 + 7.04 kbit/s.
    expect(s.totals.samplesPerDayOut).toBe(12_960_000);
    expect(s.totals.meanKbps).toBeCloseTo(21.12, 9);
    expect(s.groups.map((g) => g.group)).toEqual(["plant", "second"]);
  });

  it("over budget at peak only: usable 40 × 0.75 = 30 kbit/s, mean 14.08 fits, peak 35.2 does not", () => {
    const s = estimateSite([PLANT], { ...SITE, uplinkBudgetKbps: 40 });
    expect(s.overBudgetMean).toBe(false);
    expect(s.overBudgetPeak).toBe(true);
    // 50,688 / (30 − 14.08) = 3,183.9 s.
    expect(s.catchUpSeconds(3600)).toBeCloseTo(50_688 / 15.92, 9);
  });

  it("over budget on the mean: usable 16 × 0.75 = 12 < 14.08 → never catches up (Infinity)", () => {
    const s = estimateSite([PLANT], { ...SITE, uplinkBudgetKbps: 16 });
    expect(s.overBudgetMean).toBe(true);
    expect(s.overBudgetPeak).toBe(true);
    expect(s.catchUpSeconds(3600)).toBe(Infinity);
    // Exactly at the limit also never catches up: usable = mean.
    const mean = estimateSite([PLANT], SITE).totals.meanKbps;
    const edge = estimateSite([PLANT], { ...SITE, uplinkBudgetKbps: mean, headroom: 0 });
    expect(edge.catchUpSeconds(60)).toBe(Infinity);
  });

  it("refuses a headroom of 1 or more", () => {
    expect(() => estimateSite([PLANT], { ...SITE, headroom: 1 })).toThrow(RangeError);
  });
});

describe("defaults and measured peak", () => {
  it("stated default ratios; windows give window ÷ period; M4 four samples per window", () => {
    expect(DEFAULT_RATIOS["swinging-door"]).toBe(10);
    expect(DEFAULT_RATIOS.drop).toBe(Infinity);
    // Quality filter (1) then swinging door (10): 10.
    expect(defaultRatio([{ method: "quality-filter" }, { method: "swinging-door" }], 1000)).toBe(10);
    // A 60-s mean of a 1-s tag: 60; of a 2-min tag: at least 1.
    expect(defaultRatio([{ method: "aggregate", window: 60 }], 1000)).toBe(60);
    expect(defaultRatio([{ method: "aggregate", window: 60 }], 120_000)).toBe(1);
    // M4 with 60-s windows on a 1-s tag: 60 / 4 = 15.
    expect(defaultRatio([{ method: "m4", window: 60 }], 1000)).toBe(15);
  });

  it("measured peak ratio: the densest 60-s window of the output", () => {
    // 180 input samples at 1 s; output: 2 in the first minute, 6 in the second, 1 in the third.
    const input = Float64Array.from({ length: 180 }, (_, i) => i * 1000);
    const output = Float64Array.from([0, 30_000, 60_000, 70_000, 80_000, 90_000, 100_000, 110_000, 179_000]);
    // Ratios 60/2 = 30, 60/6 = 10, 60/1 = 60 → 10.
    expect(measuredPeakRatio(input, output, 60_000)).toBe(10);
    expect(measuredPeakRatio(input, new Float64Array(0), 60_000)).toBe(Infinity);
  });
});
