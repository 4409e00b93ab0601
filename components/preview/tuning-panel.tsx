"use client";

import { useEffect, useId, useState } from "react";
import { Button } from "@/components/ui/button";
import { Field, inputClass } from "@/components/ui/field";
import { gridValues, type SettingGoal, type SweepPoint, type SweepTarget } from "@/lib/preview/sweep";
import { num, ratio } from "./format";
import type { NumericParam } from "./numeric-params";
import { SweepChart } from "./sweep-chart";
import { SweepTable } from "./sweep-table";

type Props = {
  params: readonly NumericParam[];
  unit: string;
  ready: boolean;
  sweep: (target: SweepTarget, values: number[]) => Promise<{ points: SweepPoint[]; ms: number }>;
  find: (target: SweepTarget, grid: number[], goal: SettingGoal) => Promise<{ best: SweepPoint | null; evaluated: SweepPoint[]; ms: number }>;
  /** Writes the value into the in-place form and runs the preview again. */
  onUse: (key: string, value: number) => void;
};

type Found = { key: string; best: SweepPoint | null; goal: string };

const rounded = (p: NumericParam, v: number) => (p.info.type === "integer" ? Math.round(v) : Number(v.toPrecision(6)));

/** Sweep one numeric parameter over a range and find a setting that meets a goal. */
export function TuningPanel({ params, unit, ready, sweep, find, onUse }: Readonly<Props>) {
  const id = useId();
  const [key, setKey] = useState(params[0]?.key ?? "");
  const param = params.find((p) => p.key === key) ?? params[0];
  const [from, setFrom] = useState("");
  const [to, setTo] = useState("");
  const [points, setPoints] = useState("20");
  const [scale, setScale] = useState<"linear" | "log">("linear");
  const [goalKind, setGoalKind] = useState<"maxError" | "minRatio">("maxError");
  const [goalValue, setGoalValue] = useState("");
  const [result, setResult] = useState<{ key: string; points: SweepPoint[]; log: boolean } | null>(null);
  const [found, setFound] = useState<Found | null>(null);
  const [busy, setBusy] = useState<"sweep" | "find" | null>(null);
  const [status, setStatus] = useState("");
  const [problem, setProblem] = useState("");

  // A new parameter (or profile) starts from a range around its current value.
  useEffect(() => {
    if (!param) return;
    setFrom(String(rounded(param, param.value / 4)));
    setTo(String(rounded(param, param.value * 4)));
    setGoalValue(goalKind === "maxError" ? String(param.method === "swinging-door" || param.method === "deadband" ? param.value : "") : "");
    setResult(null);
    setFound(null);
  }, [param?.key, param?.value]);

  if (!param) return <p className="text-label text-ink-faint">This profile has no numeric parameter to tune.</p>;

  const target: SweepTarget = { output: param.output, step: param.step, parameter: param.parameter };
  const grid = (): number[] | null => {
    const a = Number(from);
    const b = Number(to);
    const n = Number(points);
    if (!Number.isFinite(a) || !Number.isFinite(b) || a === b) return fail("Give a range: two different numbers in Sweep from and Sweep to.");
    if (!Number.isInteger(n) || n < 2 || n > 200) return fail("Points must be a whole number from 2 to 200.");
    if (scale === "log" && (a <= 0 || b <= 0)) return fail("A log scale needs both ends of the range above 0.");
    const values = gridValues(Math.min(a, b), Math.max(a, b), n, scale).map((v) => rounded(param, v));
    return [...new Set(values)];
  };
  function fail(message: string): null {
    setProblem(message);
    return null;
  }
  const runSweep = async () => {
    const values = grid();
    if (!values) return;
    setProblem("");
    setBusy("sweep");
    setStatus(`Sweeping ${param.label} over ${values.length} values…`);
    try {
      const r = await sweep(target, values);
      setResult({ key: param.key, points: r.points, log: scale === "log" });
      setStatus(`Sweep finished: ${r.points.length} values of ${param.label} in ${(r.ms / 1000).toFixed(2)} s.`);
    } catch (e) {
      setStatus("");
      setProblem(e instanceof Error ? e.message : String(e));
    } finally {
      setBusy(null);
    }
  };
  const runFind = async () => {
    const values = grid();
    const bound = Number(goalValue);
    if (!values) return;
    if (!(goalValue.trim() !== "" && Number.isFinite(bound) && bound > 0)) return void fail("Give the goal as a number above 0.");
    setProblem("");
    setBusy("find");
    const goal: SettingGoal = goalKind === "maxError" ? { maxError: bound } : { minRatio: bound };
    const goalText = goalKind === "maxError" ? `max error ≤ ${num(bound)} ${unit}` : `ratio ≥ ${num(bound)}`;
    setStatus(`Looking for a setting with ${goalText}…`);
    try {
      const r = await find(target, values, goal);
      setFound({ key: param.key, best: r.best ? { ...r.best, value: rounded(param, r.best.value) } : null, goal: goalText });
      setResult({ key: param.key, points: r.evaluated, log: scale === "log" });
      setStatus(r.best ? `Found ${param.label} ${num(r.best.value)}: ratio ${ratio(r.best.ratio)}, max error ${num(r.best.maxAbsError)} ${unit}.` : `No value in the range meets ${goalText}.`);
    } catch (e) {
      setStatus("");
      setProblem(e instanceof Error ? e.message : String(e));
    } finally {
      setBusy(null);
    }
  };
  const shown = result && result.key === param.key ? result : null;
  const best = found && found.key === param.key ? found : null;

  return (
    <section aria-labelledby={`${id}-h`} className="flex flex-col gap-3 rounded-panel border border-panel-line bg-panel p-4">
      <h2 id={`${id}-h`}>Tuning</h2>
      <div className="grid gap-3 sm:grid-cols-2 lg:grid-cols-5">
        <div className="lg:col-span-2">
          <Field label="Parameter to sweep" htmlFor={`${id}-p`}>
            <select id={`${id}-p`} className={inputClass} value={param.key} onChange={(e) => setKey(e.target.value)}>
              {params.map((p) => (
                <option key={p.key} value={p.key}>
                  {p.output} · step {p.step + 1} {p.methodTitle} · {p.label}
                </option>
              ))}
            </select>
          </Field>
        </div>
        <Field label="Sweep from" htmlFor={`${id}-from`}>
          <input id={`${id}-from`} type="number" step="any" className={inputClass} value={from} onChange={(e) => setFrom(e.target.value)} />
        </Field>
        <Field label="Sweep to" htmlFor={`${id}-to`}>
          <input id={`${id}-to`} type="number" step="any" className={inputClass} value={to} onChange={(e) => setTo(e.target.value)} />
        </Field>
        <Field label="Points" htmlFor={`${id}-n`}>
          <input id={`${id}-n`} type="number" min={2} max={200} step={1} className={inputClass} value={points} onChange={(e) => setPoints(e.target.value)} />
        </Field>
      </div>
      <div className="flex flex-wrap items-end gap-4">
        <fieldset className="flex gap-3 text-label">
          <legend className="mb-1 font-medium text-ink-soft">Spacing</legend>
          {(["linear", "log"] as const).map((s) => (
            <label key={s} className="flex items-center gap-1.5">
              <input type="radio" name={`${id}-scale`} checked={scale === s} onChange={() => setScale(s)} />
              {s === "linear" ? "Linear" : "Log"}
            </label>
          ))}
        </fieldset>
        <Button onClick={runSweep} disabled={!ready || busy !== null}>
          {busy === "sweep" ? "Sweeping…" : "Run sweep"}
        </Button>
      </div>
      <div className="flex flex-wrap items-end gap-3 border-t border-panel-line pt-3">
        <Field label="Goal" htmlFor={`${id}-goal`}>
          <select id={`${id}-goal`} className={inputClass} value={goalKind} onChange={(e) => setGoalKind(e.target.value as "maxError" | "minRatio")}>
            <option value="maxError">Max error at most</option>
            <option value="minRatio">Ratio at least</option>
          </select>
        </Field>
        <Field label={goalKind === "maxError" ? `Goal value (${unit})` : "Goal value (ratio)"} htmlFor={`${id}-gv`}>
          <input id={`${id}-gv`} type="number" step="any" min={0} className={`${inputClass} w-32`} value={goalValue} onChange={(e) => setGoalValue(e.target.value)} />
        </Field>
        <Button tone="quiet" onClick={runFind} disabled={!ready || busy !== null}>
          {busy === "find" ? "Searching…" : "Find a setting"}
        </Button>
      </div>
      {problem ? (
        <p role="alert" className="text-label text-fault">
          {problem}
        </p>
      ) : null}
      <p role="status" className="text-label text-ink-soft" data-testid="tuning-status">
        {status}
      </p>
      {best ? (
        <div className="flex flex-wrap items-center gap-3 rounded-panel bg-weir-50 px-3 py-2 text-label" data-testid="found-setting">
          {best.best ? (
            <>
              <span>
                For {best.goal}: <strong>{param.label.replace(/ \(.*\)$/, "")} {num(best.best.value)}</strong> gives ratio {ratio(best.best.ratio)} and max
                error {num(best.best.maxAbsError)} {unit}.
              </span>
              <Button onClick={() => onUse(param.key, best.best!.value)}>Use this value</Button>
            </>
          ) : (
            <span>No value from {from} to {to} meets {best.goal}. Widen the range or relax the goal.</span>
          )}
        </div>
      ) : null}
      {shown && shown.points.length > 0 ? (
        <>
          <SweepChart points={shown.points} log={shown.log} parameter={param.label} unit={unit} chosen={best?.best?.value ?? null} />
          <SweepTable points={shown.points} parameter={param.label} unit={unit} />
        </>
      ) : null}
    </section>
  );
}
