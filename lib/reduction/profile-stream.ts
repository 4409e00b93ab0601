import { METHODS } from "./methods";
import type { Profile, ProfileTag, RunContext, StepMethod } from "./profile";
import { ProfileError } from "./profile-error";
import { resolveSteps } from "./profile-resolve";
import { stepCall } from "./profile-steps";
import { requireNonNegative } from "./params";
import type { Series } from "./series";
import { DEFAULT_GAP_FACTOR, gapThreshold } from "./signal";
import type { StreamChunk, StreamParams, StreamProcessor } from "./stream";

/** Samples dropped by one step of one output (see stream.ts). */
export type StreamCounter = { output: string; step: number; method: StepMethod; late: number; invalid: number };

/** The gateway agent's form of {@link runProfile}. */
export type ProfileStream = {
  /** Feeds the next chunk of the tag's samples; returns what each output emits now, by output name. */
  push(chunk: Series): Record<string, StreamChunk>;
  /** Ends the stream; returns the rest of each output. */
  finish(): Record<string, StreamChunk>;
  counters(): StreamCounter[];
};

type Chain = { name: string; processors: StreamProcessor[]; methods: StepMethod[]; lastAggregation: number; dropped: boolean; shares: ShareQueue };

/**
 * A profile as a stream (DESIGN.md "Signals": the edge sees an endless, sometimes late
 * stream): each output's steps are streaming processors chained in order, so the
 * outputs, concatenated over all pushes and the finish, equal {@link runProfile}'s for
 * any split of the input into chunks (kept indices aside). Late and invalid samples are
 * counted per step and dropped, never thrown; `graceMs` keeps aggregation windows open
 * for late samples. Throws a {@link ProfileError} for a profile that cannot run on the
 * tag, and for batch-only steps (LTTB, LTOB, RDP, M4).
 */
export function createProfileStream(profile: Profile, tag: ProfileTag, ctx: RunContext & StreamParams = {}): ProfileStream {
  const resolved = resolveSteps(profile, tag, ctx);
  const gapMs = gapThreshold(tag.samplePeriodMs, ctx.gapFactor ?? DEFAULT_GAP_FACTOR);
  const graceMs = ctx.graceMs === undefined ? 0 : requireNonNegative("graceMs", ctx.graceMs);
  const env = { gapMs, timeZone: ctx.timeZone, graceMs };
  const chains: Chain[] = resolved.outputs.map((output) => {
    const processors = output.steps.map((step, index) => {
      const create = stepCall(step, env).stream;
      if (create === undefined) {
        throw new ProfileError(`${step.method} is batch-only (it needs the whole series), so a gateway cannot stream it`, {
          output: output.name,
          step: index,
          method: step.method,
        });
      }
      return create();
    });
    const methods = output.steps.map((s) => s.method);
    const lastAggregation = methods.map((m) => METHODS[m].role).lastIndexOf("aggregation");
    // After a drop nothing is emitted, so no share would ever be taken from the queue.
    return { name: output.name, processors, methods, lastAggregation, dropped: methods.includes("drop"), shares: new ShareQueue() };
  });

  const run = (chunk: Series, finishing: boolean): Record<string, StreamChunk> => {
    const out: Record<string, StreamChunk> = {};
    for (const chain of chains) {
      let c: StreamChunk | Series = chunk;
      chain.processors.forEach((p, k) => {
        c = finishing ? concat(p.push(c), p.finish()) : p.push(c);
        if (k === chain.lastAggregation && !chain.dropped) chain.shares.add(c as StreamChunk);
      });
      const last = c as StreamChunk;
      if (chain.lastAggregation < 0) out[chain.name] = withoutShares(last);
      else if (chain.dropped) out[chain.name] = { ...withoutShares(last), goodShare: new Float64Array(last.t.length) };
      else out[chain.name] = chain.shares.attach(last);
    }
    return out;
  };

  return {
    push: (chunk) => run(chunk, false),
    finish: () => run({ t: new Float64Array(0), v: new Float64Array(0) }, true),
    counters: () =>
      chains.flatMap((chain) =>
        chain.processors.map((p, step) => ({ output: chain.name, step, method: chain.methods[step], late: p.late, invalid: p.invalid })),
      ),
  };
}

/** The good shares an aggregation emitted, waiting for the later selection steps to pick their samples. */
class ShareQueue {
  private t: number[] = [];
  private share: number[] = [];
  private next = 0;

  add(c: StreamChunk): void {
    const shares = c.goodShare as Float64Array;
    for (let k = 0; k < c.t.length; k++) {
      this.t.push(c.t[k]);
      this.share.push(shares[k]);
    }
  }

  /** The chunk with the share of each of its samples (a subsequence of the aggregation's, in order). */
  attach(c: StreamChunk): StreamChunk {
    const goodShare = new Float64Array(c.t.length);
    for (let k = 0; k < c.t.length; k++) {
      while (this.next < this.t.length && this.t[this.next] !== c.t[k]) this.next++;
      goodShare[k] = this.next < this.t.length ? this.share[this.next] : Number.NaN;
    }
    this.t.splice(0, this.next);
    this.share.splice(0, this.next);
    this.next = 0;
    return { t: c.t, v: c.v, q: c.q, goodShare };
  }
}

function withoutShares(c: StreamChunk): StreamChunk {
  return { t: c.t, v: c.v, q: c.q };
}

function concat(a: StreamChunk, b: StreamChunk): StreamChunk {
  const join = (x: Float64Array, y: Float64Array) => {
    const z = new Float64Array(x.length + y.length);
    z.set(x);
    z.set(y, x.length);
    return z;
  };
  const q = new Uint8Array(a.q.length + b.q.length);
  q.set(a.q);
  q.set(b.q, a.q.length);
  const out: StreamChunk = { t: join(a.t, b.t), v: join(a.v, b.v), q };
  if (a.goodShare !== undefined && b.goodShare !== undefined) out.goodShare = join(a.goodShare, b.goodShare);
  return out;
}
