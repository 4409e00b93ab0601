"use client";

import "uplot/dist/uPlot.min.css";
import { useEffect, useId, useRef, useState } from "react";
import uPlot from "uplot";
import { Button } from "@/components/ui/button";
import { type ChartOutput, seriesOptions, toAligned } from "./chart-data";
import { formatRange, timeLabels } from "./format";
import type { ViewData } from "./worker-protocol";

type Range = { from: number; to: number };
type Props = {
  view: ViewData;
  outputs: readonly ChartOutput[];
  unit: string;
  timeZone: string;
  full: Range;
  /** Asks the worker for this range decimated to `width` pixel columns. */
  onRange: (from: number, to: number, width: number) => void;
  summary: string;
};

const HEIGHT = 320;

/**
 * Raw signal and reduced outputs on one time axis (uPlot, canvas). Drag across to zoom,
 * double-click or "Whole series" to reset, the buttons or Shift + wheel to pan. The worker
 * sends about two points per pixel column of the visible range, so the chart stays quick
 * at a million samples.
 */
export function PreviewChart({ view, outputs, unit, timeZone, full, onRange, summary }: Readonly<Props>) {
  const hostRef = useRef<HTMLDivElement>(null);
  const chartRef = useRef<uPlot | null>(null);
  const keyRef = useRef("");
  const lastSet = useRef<Range>({ from: view.from, to: view.to });
  const inView = useRef(view.inView);
  const props = useRef({ onRange, full });
  props.current = { onRange, full };
  const [shown, setShown] = useState<Range>({ from: view.from, to: view.to });
  const summaryId = useId();
  const seriesKey = JSON.stringify([outputs, unit, timeZone]);

  const setRange = (from: number, to: number) => {
    const u = chartRef.current;
    if (!u) return;
    const { from: lo, to: hi } = props.current.full;
    const span = Math.min(to - from, hi - lo);
    const a = Math.max(lo, Math.min(from, hi - span));
    u.setScale("x", { min: a, max: a + span });
  };
  const current = (): Range => ({ from: chartRef.current?.scales.x.min ?? full.from, to: chartRef.current?.scales.x.max ?? full.to });

  useEffect(() => {
    const host = hostRef.current;
    if (!host || view.ys.length !== outputs.length + 2) return;
    inView.current = view.inView;
    lastSet.current = { from: view.from, to: view.to };
    let u = chartRef.current;
    if (!u || keyRef.current !== seriesKey) {
      u?.destroy();
      const showPoints = (si: number) => {
        const n = inView.current[si - 1] ?? 0;
        const width = chartRef.current?.over.clientWidth ?? 800;
        return n > 0 && n <= width / (si === 1 ? 8 : 5);
      };
      u = new uPlot(
        {
          width: Math.max(320, host.clientWidth),
          height: HEIGHT,
          ms: 1,
          tzDate: (ts) => uPlot.tzDate(new Date(ts), timeZone),
          scales: { x: { time: true, auto: false } },
          series: seriesOptions(outputs, unit, timeZone, showPoints),
          axes: [{ values: (_u, splits) => timeLabels(splits, timeZone) }, { label: unit, labelSize: 20 }],
          cursor: {
            drag: { x: true, y: false, setScale: true },
            bind: { dblclick: () => () => (setRange(props.current.full.from, props.current.full.to), null) },
          },
          hooks: {
            setScale: [
              (chart, key) => {
                if (key !== "x") return;
                const { min, max } = chart.scales.x;
                if (min == null || max == null) return;
                setShown({ from: min, to: max });
                const last = lastSet.current;
                if (Math.abs(min - last.from) < 1e-6 && Math.abs(max - last.to) < 1e-6) return;
                lastSet.current = { from: min, to: max };
                props.current.onRange(min, max, chart.over.clientWidth);
              },
            ],
            draw: [() => performance.mark("sluice:chart-drawn")],
          },
        },
        toAligned(view),
        host,
      );
      chartRef.current = u;
      keyRef.current = seriesKey;
      u.over.addEventListener(
        "wheel",
        (e) => {
          const sideways = Math.abs(e.deltaX) > Math.abs(e.deltaY);
          if (!e.shiftKey && !sideways) return;
          e.preventDefault();
          const r = current();
          const shift = ((sideways ? e.deltaX : e.deltaY) / 500) * (r.to - r.from);
          setRange(r.from + shift, r.to + shift);
        },
        { passive: false },
      );
    } else u.setData(toAligned(view));
    if (u.scales.x.min !== view.from || u.scales.x.max !== view.to) u.setScale("x", { min: view.from, max: view.to });
    setShown({ from: view.from, to: view.to });
  }, [view, seriesKey]);

  useEffect(() => {
    const host = hostRef.current;
    if (!host) return;
    let timer: ReturnType<typeof setTimeout> | undefined;
    const ro = new ResizeObserver(() => {
      const u = chartRef.current;
      if (!u || Math.abs(u.width - host.clientWidth) < 2) return;
      u.setSize({ width: Math.max(320, host.clientWidth), height: HEIGHT });
      clearTimeout(timer);
      timer = setTimeout(() => {
        const r = lastSet.current;
        props.current.onRange(r.from, r.to, u.over.clientWidth);
      }, 150);
    });
    ro.observe(host);
    return () => {
      ro.disconnect();
      clearTimeout(timer);
    };
  }, []);
  useEffect(
    () => () => {
      chartRef.current?.destroy();
      chartRef.current = null;
    },
    [],
  );

  const pan = (dir: number) => {
    const r = current();
    const step = ((r.to - r.from) / 2) * dir;
    setRange(r.from + step, r.to + step);
  };
  const zoomOut = () => {
    const r = current();
    const half = r.to - r.from;
    setRange(r.from - half / 2, r.to + half / 2);
  };
  const whole = shown.from <= full.from && shown.to >= full.to;

  return (
    <figure className="flex flex-col gap-2" data-testid="preview-chart">
      <div className="flex flex-wrap items-center justify-between gap-2">
        <p className="text-label text-ink-soft">
          Showing {formatRange(shown.from, shown.to, timeZone)} ({timeZone})
        </p>
        <div className="flex flex-wrap gap-1.5" role="group" aria-label="Chart time range">
          <Button tone="quiet" onClick={() => pan(-1)} disabled={shown.from <= full.from}>
            ← Earlier
          </Button>
          <Button tone="quiet" onClick={() => pan(1)} disabled={shown.to >= full.to}>
            Later →
          </Button>
          <Button tone="quiet" onClick={zoomOut} disabled={whole}>
            Zoom out
          </Button>
          <Button tone="quiet" onClick={() => setRange(full.from, full.to)} disabled={whole}>
            Whole series
          </Button>
        </div>
      </div>
      <div ref={hostRef} role="img" aria-label="Chart of the raw signal and the reduced outputs over time" aria-describedby={summaryId} className="min-w-0" />
      <figcaption id={summaryId} className="text-label text-ink-soft" data-testid="chart-summary">
        {summary} Drag across the chart to zoom in; double-click to see the whole series; Shift + wheel pans.
      </figcaption>
    </figure>
  );
}
