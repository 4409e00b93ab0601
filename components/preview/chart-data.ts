// Worker chart data → uPlot's aligned data and series options.
import uPlot from "uplot";
import { localTime } from "./format";
import type { ViewData } from "./worker-protocol";

export const RAW_COLOUR = "rgba(107, 120, 133, 0.45)";
export const BAD_COLOUR = "#b3261e";
const OUTPUT_COLOURS = ["#17719a", "#2f8a4f", "#a86a00", "#6b4fbb", "#0a3347", "#c2410c"];
export const outputColour = (k: number) => OUTPUT_COLOURS[k % OUTPUT_COLOURS.length];

/** NaN → undefined (no point here: the line runs on), Infinity → null (a gap: the line breaks). */
export function toAligned(view: ViewData): uPlot.AlignedData {
  const ys = view.ys.map((y) => {
    const out: (number | null | undefined)[] = new Array(y.length);
    for (let i = 0; i < y.length; i++) {
      const v = y[i];
      out[i] = Number.isNaN(v) ? undefined : v === Number.POSITIVE_INFINITY ? null : v;
    }
    return out;
  });
  return [view.x, ...ys] as uPlot.AlignedData;
}

export type ChartOutput = { name: string; reconstruction: "linear" | "step" | null };

const fmt = (v: number | null | undefined) => (v == null ? "—" : Number(v.toPrecision(6)).toLocaleString("en"));

/**
 * Series: the raw signal, each output (step-hold drawn as steps), and the bad-quality
 * markers (points only). Kept samples are marked when few enough are in view to tell apart.
 */
export function seriesOptions(outputs: readonly ChartOutput[], unit: string, timeZone: string, showPoints: (seriesIdx: number) => boolean): uPlot.Series[] {
  const stepped = uPlot.paths.stepped?.({ align: 1 });
  return [
    { label: "Time", value: (_u, v) => (v == null ? "—" : localTime(v, timeZone)) },
    // Wide and pale, under the outputs: where an output follows the raw signal the raw shows as a halo.
    { label: `raw (${unit})`, stroke: RAW_COLOUR, width: 3, value: (_u, v) => fmt(v), points: { show: (u, si) => showPoints(si), size: 3, stroke: RAW_COLOUR } },
    ...outputs.map(
      (o, k): uPlot.Series => ({
        label: o.name,
        stroke: outputColour(k),
        width: 1.25,
        value: (_u, v) => fmt(v),
        ...(o.reconstruction === "step" && stepped ? { paths: stepped } : {}),
        points: { show: (u, si) => showPoints(si), size: 6, fill: outputColour(k), stroke: outputColour(k) },
      }),
    ),
    { label: "bad quality", stroke: BAD_COLOUR, fill: BAD_COLOUR, paths: () => null, value: (_u, v) => fmt(v), points: { show: true, size: 8, width: 0, fill: BAD_COLOUR, stroke: BAD_COLOUR } },
  ];
}
