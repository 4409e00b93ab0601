"use client";

import "uplot/dist/uPlot.min.css";
import { useEffect, useRef } from "react";
import uPlot from "uplot";
import type { SweepPoint } from "@/lib/preview/sweep";
import { num } from "./format";

type Props = { points: readonly SweepPoint[]; log: boolean; parameter: string; unit: string; chosen: number | null };

const RATIO = "#17719a";
const ERROR = "#a86a00";

/** Reduction ratio (left axis) and max abs error (right axis) against the swept value. */
export function SweepChart({ points, log, parameter, unit, chosen }: Readonly<Props>) {
  const host = useRef<HTMLDivElement>(null);
  useEffect(() => {
    const el = host.current;
    if (!el || points.length === 0) return;
    const sorted = [...points].sort((a, b) => a.value - b.value);
    const data: uPlot.AlignedData = [sorted.map((p) => p.value), sorted.map((p) => (Number.isFinite(p.ratio) ? p.ratio : null)), sorted.map((p) => p.maxAbsError)];
    const u = new uPlot(
      {
        width: Math.max(300, el.clientWidth),
        height: 220,
        scales: { x: { time: false, distr: log ? 3 : 1 }, ratio: { auto: true }, err: { auto: true } },
        series: [
          { label: parameter, value: (_u, v) => num(v) },
          { label: "ratio", scale: "ratio", stroke: RATIO, width: 1.5, value: (_u, v) => num(v), points: { show: true, size: 5, fill: RATIO } },
          { label: `max error (${unit})`, scale: "err", stroke: ERROR, width: 1.5, value: (_u, v) => num(v), points: { show: true, size: 5, fill: ERROR } },
        ],
        axes: [
          { label: parameter, labelSize: 20 },
          { scale: "ratio", label: "ratio", labelSize: 20, stroke: RATIO },
          { scale: "err", side: 1, label: `max error (${unit})`, labelSize: 20, stroke: ERROR, grid: { show: false } },
        ],
        hooks: {
          draw: [
            (c) => {
              if (chosen == null) return;
              const x = c.valToPos(chosen, "x", true);
              const ctx = c.ctx;
              ctx.save();
              ctx.strokeStyle = "#16202a";
              ctx.setLineDash([4, 4]);
              ctx.beginPath();
              ctx.moveTo(x, c.bbox.top);
              ctx.lineTo(x, c.bbox.top + c.bbox.height);
              ctx.stroke();
              ctx.restore();
            },
          ],
        },
      },
      data,
      el,
    );
    const ro = new ResizeObserver(() => u.setSize({ width: Math.max(300, el.clientWidth), height: 220 }));
    ro.observe(el);
    return () => {
      ro.disconnect();
      u.destroy();
    };
  }, [points, log, parameter, unit, chosen]);
  return <div ref={host} role="img" aria-label={`Chart of reduction ratio and max error against ${parameter}`} className="min-w-0" />;
}
