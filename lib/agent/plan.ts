import { METHODS, createProfileStream, type Magnitude, type Profile, type ProfileTag, type ResolvedStep, type Step } from "@/lib/reduction/profile";
import type { Series } from "@/lib/reduction/series";
import type { StreamChunk } from "@/lib/reduction/stream";
import { createPassThroughStream } from "@/lib/reduction/stream-selection";
import type { WindowParams } from "@/lib/reduction/windows";
import { type AgentBundle, type BundleGroup, type BundleStep, listedTags } from "./bundle";

/** One tag's reduction: what each output emits, by output name ("" for a pass-through tag's own series). */
export type TagRunner = { push(chunk: Series): Record<string, StreamChunk>; finish(): Record<string, StreamChunk> };

/** A bundle made runnable: every listed tag's runner built up front, so a bundle that cannot run fails before it takes over. */
export type Plan = {
  bundle: AgentBundle;
  digest: string;
  listed: ReadonlySet<string>;
  /** The tag's runner (the prebuilt one the first time); null when the tag's samples are dropped. */
  take(tag: string): TagRunner | null;
  /** The longest window among the bundle's steps (with its alignment), or null when no step has one. */
  longest: WindowParams | null;
};

/** The unit magnitudes are given in: the bundle has resolved them to each tag's own unit already. */
const AS_BUNDLED = "as-bundled";
/**
 * A tag's gap threshold in ms from its group's `gap` (seconds; one value or per tag). A
 * tag without one (a bundle from before `gap`, or a map that leaves it out) has no gaps:
 * a threshold the size of the whole ECMAScript time range is longer than any time step.
 */
export function gapMsForTag(group: BundleGroup, tag: string): number {
  const gap = group.gap;
  const seconds = typeof gap === "object" && gap !== null ? (Object.hasOwn(gap, tag) ? gap[tag] : undefined) : gap;
  return typeof seconds === "number" ? seconds * 1000 : NO_GAP_MS;
}
const NO_GAP_MS = 8.64e15;

/** A step's parameters for one tag: a per-tag map read at the tag (absent: the method's default). */
export function stepForTag(step: BundleStep, tag: string): ResolvedStep {
  const out: Record<string, unknown> = { method: step.method };
  for (const [key, value] of Object.entries(step)) {
    if (key === "method") continue;
    const v = typeof value === "object" && value !== null ? (Object.hasOwn(value, tag) ? value[tag] : undefined) : value;
    if (v !== undefined) out[key] = v;
  }
  return out as ResolvedStep;
}

/**
 * A group's outputs for one tag as a profile document, so lib/reduction validates and
 * streams it as it would the profile itself: each magnitude an absolute value in the unit
 * the tag is run in (the bundle already resolved percent and converted units).
 */
export function profileForTag(group: BundleGroup, tag: string): Profile {
  const outputs = (group.outputs ?? []).map((o) => ({
    name: o.name,
    steps: o.steps.map((bundled) => {
      const step = stepForTag(bundled, tag) as Record<string, unknown>;
      const info = METHODS[bundled.method];
      for (const p of info?.params ?? []) {
        const value = step[p.name];
        if (p.type === "magnitude" && typeof value === "number") step[p.name] = { value, unit: AS_BUNDLED } satisfies Magnitude;
      }
      return step as Step;
    }),
  }));
  return { name: group.profile?.name ?? group.name, kinds: ["analog"], outputs };
}

/**
 * The tag the agent runs a profile on: analog takes every method, magnitudes are already in
 * its unit. Its "sample period" is the bundled gap threshold, run with a gap factor of 1.
 */
const runTag = (name: string, gapMs: number): ProfileTag => ({ name, kind: "analog", unit: AS_BUNDLED, euLow: null, euHigh: null, samplePeriodMs: gapMs });

function passThroughRunner(): TagRunner {
  const s = createPassThroughStream();
  return { push: (c) => ({ "": s.push(c) }), finish: () => ({ "": s.finish() }) };
}

/**
 * Builds every listed tag's streaming runner (lib/reduction `createProfileStream`, or a
 * pass-through stream for default handling) and finds the longest window. Throws, naming
 * group and tag, for a bundle that cannot run at the edge: a batch-only step (LTTB, LTOB,
 * RDP, M4), a parameter the methods refuse, a calendar window in an unknown time zone.
 */
export function buildPlan(bundle: AgentBundle, digest: string): Plan {
  const zone = bundle["time-zone"];
  const build = (group: BundleGroup | undefined, tag: string): TagRunner | null => {
    const handling = group === undefined ? bundle.unassigned.handling : group.handling;
    if (group === undefined || handling !== undefined) return handling === "drop" ? null : passThroughRunner();
    try {
      return createProfileStream(profileForTag(group, tag), runTag(tag, gapMsForTag(group, tag)), { timeZone: zone, gapFactor: 1 });
    } catch (e) {
      throw new Error(`group "${group.name}", tag ${tag}: ${(e as Error).message}`);
    }
  };
  const groupOf = new Map<string, BundleGroup>();
  for (const g of bundle.groups) for (const t of g.tags) groupOf.set(t, g);
  const prebuilt = new Map<string, TagRunner | null>();
  for (const tag of bundle.unassigned.tags) prebuilt.set(tag, build(undefined, tag));
  for (const [tag, group] of groupOf) prebuilt.set(tag, build(group, tag));
  return {
    bundle,
    digest,
    listed: listedTags(bundle),
    take(tag) {
      if (prebuilt.has(tag)) {
        const r = prebuilt.get(tag)!;
        prebuilt.delete(tag);
        return r;
      }
      return build(groupOf.get(tag), tag);
    },
    longest: longestWindow(bundle),
  };
}

/** The step window of the greatest length over all groups, outputs and tags (seconds → ms), with its offset and calendar. */
export function longestWindow(bundle: AgentBundle): WindowParams | null {
  let best: WindowParams | null = null;
  for (const g of bundle.groups) {
    for (const o of g.outputs ?? []) {
      for (const s of o.steps) {
        if (s.window === undefined) continue;
        for (const tag of g.tags) {
          const step = stepForTag(s, tag) as { window?: number; offset?: number; calendar?: boolean };
          if (typeof step.window !== "number" || (best !== null && step.window * 1000 <= best.windowMs)) continue;
          best = { windowMs: step.window * 1000, offsetMs: (step.offset ?? 0) * 1000, timeZone: step.calendar ? bundle["time-zone"] : undefined };
        }
      }
    }
  }
  return best;
}
