import type { Series } from "@/lib/reduction/series";
import type { StreamChunk } from "@/lib/reduction/stream";
import { windowGrid } from "@/lib/reduction/windows";
import type { Plan, TagRunner } from "./plan";

/** One sample of one output of one tag, as the output CSV writes it. */
export type OutputRow = { tag: string; output: string; t: number; v: number; q: number };

type Switch = { boundary: number; plan: Plan };
type TagState = { gen: number; runner: TagRunner | null };

/**
 * The boundary at which a plan following `plan` takes over, given the newest sample time
 * seen: the end of the window holding `streamTime` in the grid of `plan`'s longest window
 * (the next multiple of it, with its offset and, for calendar windows, the site's local
 * calendar); with no window in `plan`, `streamTime` itself (at once); with no data yet,
 * −∞.
 */
export function switchBoundary(plan: Plan, streamTime: number): number {
  if (streamTime === -Infinity) return -Infinity;
  if (plan.longest === null) return streamTime;
  const grid = windowGrid(plan.longest);
  grid.locate(streamTime);
  return grid.end;
}

/**
 * Runs every tag through the plan in force and switches plans at a window boundary
 * (lib/agent/README.md): a sample older than the boundary goes to the tag's old runner,
 * the first one at or past it finishes (flushes) the old runner and starts the tag's
 * runner of the new plan. Counts samples in and rows out, and tags no plan lists.
 */
export class Reducer {
  private switches: Switch[];
  private readonly tags = new Map<string, TagState>();
  private readonly unknown = new Set<string>();
  /** The newest sample time pushed (epoch ms). */
  streamTime = -Infinity;
  pointsIn = 0;
  pointsOut = 0;

  constructor(plan: Plan) {
    this.switches = [{ boundary: -Infinity, plan }];
  }

  /** The newest plan (the bundle in force for reports, though tags may still finish windows of the one before). */
  get plan(): Plan {
    return this.switches[this.switches.length - 1].plan;
  }

  /** Schedules `plan` to take over at {@link switchBoundary} of the newest plan; returns the boundary. */
  adopt(plan: Plan): number {
    const last = this.switches[this.switches.length - 1];
    const boundary = Math.max(last.boundary, switchBoundary(last.plan, this.streamTime));
    // A switch not reached yet has no tag on its plan: the newer plan simply replaces it.
    if (boundary === last.boundary && this.streamTime < last.boundary) last.plan = plan;
    else this.switches.push({ boundary, plan });
    return boundary;
  }

  /** Feeds one tag's samples (in arrival order); returns the rows its outputs emit now. */
  push(tag: string, chunk: Series): OutputRow[] {
    const rows: OutputRow[] = [];
    const n = chunk.t.length;
    this.pointsIn += n;
    let state = this.tags.get(tag);
    let from = 0;
    for (let i = 0; i < n; i++) {
      const t = chunk.t[i];
      if (t > this.streamTime) this.streamTime = t;
      const gen = this.generationAt(t, state?.gen ?? -1);
      if (state !== undefined && gen === state.gen) continue;
      if (state !== undefined) {
        this.feed(tag, state, slice(chunk, from, i), rows);
        this.emit(tag, state.runner?.finish(), rows);
      }
      state = { gen, runner: this.switches[gen].plan.take(tag) };
      this.tags.set(tag, state);
      from = i;
    }
    if (state !== undefined) {
      this.feed(tag, state, slice(chunk, from, n), rows);
      if (!this.switches[state.gen].plan.listed.has(tag)) this.unknown.add(tag);
    }
    this.prune();
    return rows;
  }

  /** Ends every tag's stream; returns the rest of the outputs. */
  finish(): OutputRow[] {
    const rows: OutputRow[] = [];
    for (const [tag, state] of this.tags) this.emit(tag, state.runner?.finish(), rows);
    this.tags.clear();
    return rows;
  }

  /** Tags seen since the counters were last taken that the plan they ran under does not list, in order of appearance. */
  unknownTags(): string[] {
    return [...this.unknown];
  }

  /** Takes the counters for a report and starts them again. */
  takeCounters(): { pointsIn: number; pointsOut: number; unknownTags: string[] } {
    const out = { pointsIn: this.pointsIn, pointsOut: this.pointsOut, unknownTags: this.unknownTags() };
    this.pointsIn = this.pointsOut = 0;
    this.unknown.clear();
    return out;
  }

  /** The newest switch reached at time t, but never an older one than `current`. */
  private generationAt(t: number, current: number): number {
    let gen = Math.max(current, 0);
    for (let k = this.switches.length - 1; k > gen; k--) {
      if (this.switches[k].boundary <= t) return k;
    }
    return gen;
  }

  private feed(tag: string, state: TagState, chunk: Series, rows: OutputRow[]) {
    if (chunk.t.length === 0 || state.runner === null) return;
    this.emit(tag, state.runner.push(chunk), rows);
  }

  private emit(tag: string, out: Record<string, StreamChunk> | undefined, rows: OutputRow[]) {
    if (out === undefined) return;
    for (const [output, c] of Object.entries(out)) {
      for (let k = 0; k < c.t.length; k++) rows.push({ tag, output, t: c.t[k], v: c.v[k], q: c.q[k] });
      this.pointsOut += c.t.length;
    }
  }

  /** Drops switches no tag runs under and no new tag can start under any more. */
  private prune() {
    let keep = this.switches.length - 1;
    while (keep > 0 && this.switches[keep].boundary > this.streamTime) keep--;
    for (const s of this.tags.values()) keep = Math.min(keep, s.gen);
    if (keep <= 0) return;
    this.switches = this.switches.slice(keep);
    for (const s of this.tags.values()) s.gen -= keep;
  }
}

function slice(c: Series, from: number, to: number): Series {
  if (from === 0 && to === c.t.length) return c;
  return { t: c.t.subarray(from, to), v: c.v.subarray(from, to), q: c.q?.subarray(from, to) };
}
