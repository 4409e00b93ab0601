import fs from "node:fs";
import { DEFAULT_RETRY, type Random, type RetryPolicy, type Sleep, pollDelay, sleep as realSleep } from "./backoff";
import { GrowingOutput, LineReducer, Tail, reduceFile, rowsText } from "./io";
import { readKeyList } from "./keys";
import type { Registry } from "./registry";
import { deliverReports, makeReport } from "./report";
import { StateDir } from "./state";
import { Reducer } from "./switch";
import { type InForce, type SyncContext, type SyncOutcome, loadInForce, syncOnce } from "./sync";

export type AgentOptions = {
  url: string;
  tokenFile: string;
  stateDir: string;
  input: string;
  output: string;
  trust?: string;
  watch: boolean;
  /** Alarm after this long without a valid freshness statement (default 3 × the bundle's poll). */
  maxSilenceS?: number;
  /** Clock skew allowed on freshness statements (default 60 s). */
  skewS?: number;
  /** One line for stderr (no newline). */
  log: (line: string) => void;
  now?: () => number;
  random?: Random;
  sleep?: Sleep;
  fetch?: typeof fetch;
  retry?: RetryPolicy;
  /** Watch: how often the input file is read for new lines (default 1 s). */
  tailMs?: number;
  /** Watch: ends the loop (the rest of every stream is written, a last report made). */
  signal?: AbortSignal;
};

/** Exit codes of a one-shot run (lib/agent/README.md). */
export const EXIT = { ok: 0, fatal: 1, silence: 2, refused: 3 } as const;

class Agent {
  readonly state: StateDir;
  readonly ctx: SyncContext;
  reducer: Reducer | null = null;
  private countFrom: string;
  private readonly now: () => number;

  constructor(readonly opts: AgentOptions) {
    this.now = opts.now ?? Date.now;
    this.state = new StateDir(opts.stateDir);
    let keys = this.state.readKeys();
    if (keys === null) {
      if (!opts.trust) throw new Error(`no pinned keys in ${opts.stateDir}: give --trust <keys.json> on the first run`);
      keys = readKeyList(fs.readFileSync(opts.trust, "utf8"), opts.trust);
      this.state.writeKeys(keys);
      opts.log(`pinned ${keys.map((k) => `"${k.id}"`).join(", ")} from ${opts.trust}`);
    }
    const token = () => {
      const t = fs.readFileSync(opts.tokenFile, "utf8").trim();
      if (t === "") throw new Error(`${opts.tokenFile} is empty`);
      return t;
    };
    token();
    const retry = { policy: opts.retry ?? DEFAULT_RETRY, random: opts.random ?? Math.random, sleep: opts.sleep ?? realSleep, now: this.now };
    const reg: Registry = { url: opts.url, token, fetch: opts.fetch, retry: { ...retry, onRetry: (why, ms) => opts.log(`registry: ${why}; trying again in ${(ms / 1000).toFixed(1)} s`) } };
    let current: InForce | null = null;
    try {
      current = loadInForce(this.state, keys);
    } catch (e) {
      opts.log(`ALARM: the last good bundle in ${opts.stateDir} does not check out (${(e as Error).message}); not running it`);
    }
    this.ctx = { reg, state: this.state, keys, current, now: this.now, skewS: opts.skewS ?? 60, log: opts.log };
    this.countFrom = this.state.readState().countedTo ?? new Date(this.now()).toISOString();
  }

  get current(): InForce | null {
    return this.ctx.current;
  }

  /** One pull; a new bundle is in force afterwards (its tags switch at the boundary the reducer sets). */
  async cycle(): Promise<SyncOutcome> {
    const outcome = await syncOnce(this.ctx);
    const log = this.opts.log;
    if (outcome.fresh) this.state.updateState({ freshAt: this.now() });
    if (outcome.kind === "new") {
      this.ctx.current = outcome.next;
      const at = this.reducer?.adopt(outcome.next.plan);
      const when = at === undefined || at === -Infinity ? "at once" : `at ${new Date(at).toISOString()}`;
      log(`release ${outcome.next.stored.release} of ${outcome.next.stored.gateway} applied; its runners take over ${when}`);
    } else if (outcome.kind === "refused") log(`ALARM: ${outcome.message}; the last good bundle stays in force`);
    else if (outcome.kind === "failed") log(`${outcome.message}; the last good bundle stays in force`);
    else if (outcome.kind === "unreachable") log(`registry unreachable: ${outcome.message}; reducing with the last good bundle`);
    else if (outcome.kind === "rejected") log(outcome.message);
    else if (outcome.problem) log(`freshness: ${outcome.problem}`);
    return outcome;
  }

  /** Files this cycle's report in the outbox and, when the registry answered, sends the outbox. */
  async report(outcome: SyncOutcome | null): Promise<void> {
    const to = new Date(this.now()).toISOString();
    const counters = this.reducer?.takeCounters() ?? { pointsIn: 0, pointsOut: 0, unknownTags: [] };
    const report = makeReport(outcome, this.current?.stored ?? null, counters, this.countFrom, to);
    if (report !== null) {
      this.state.putReport(report);
      this.countFrom = to;
      this.state.updateState({ countedTo: to });
    }
    const contact = outcome !== null && outcome.kind !== "unreachable" && !(outcome.kind === "rejected" && outcome.status !== 404);
    if (contact) await deliverReports(this.ctx.reg, this.state, this.opts.log);
  }

  /** The alarm line when no valid freshness statement has been seen for too long, else null. */
  silence(): string | null {
    const poll = this.current?.stored ? this.current.plan.bundle.poll : 60;
    const limitS = this.opts.maxSilenceS ?? 3 * poll;
    const freshAt = this.state.readState().freshAt;
    const silentS = (this.now() - (freshAt ?? 0)) / 1000;
    if (silentS <= limitS) return null;
    const since = freshAt === undefined ? "ever" : `for ${Math.round(silentS)} s`;
    return `ALARM: no valid freshness statement ${since} (limit ${limitS} s): the registry is unreachable or its answers are stale or replayed`;
  }
}

/**
 * The reference gateway agent (DESIGN.md "Gateway API"; lib/agent/README.md). One-shot:
 * pull, verify, apply, reduce the input file once, check in; returns an {@link EXIT} code.
 * Watch: poll at the bundle's interval with jitter while following the input file,
 * until `signal` aborts; returns 0, or 1 when it cannot start.
 */
export async function runAgent(opts: AgentOptions): Promise<number> {
  let agent: Agent;
  try {
    agent = new Agent(opts);
  } catch (e) {
    opts.log((e as Error).message);
    return EXIT.fatal;
  }
  return opts.watch ? watch(agent) : once(agent);
}

async function once(agent: Agent): Promise<number> {
  const { opts } = agent;
  const outcome = await agent.cycle();
  const current = agent.current;
  if (current === null) {
    opts.log("no bundle to reduce with: none pulled and none stored");
    return EXIT.fatal;
  }
  agent.reducer = new Reducer(current.plan);
  try {
    const { problems } = await reduceFile(opts.input, opts.output, agent.reducer, opts.log);
    if (problems > 0) opts.log(`${problems} input line(s) skipped`);
  } catch (e) {
    opts.log(`reducing ${opts.input}: ${(e as Error).message}`);
    await agent.report(outcome);
    return EXIT.fatal;
  }
  await agent.report(outcome);
  const alarm = agent.silence();
  if (alarm) opts.log(alarm);
  if (outcome.kind === "rejected") return EXIT.fatal;
  if (alarm) return EXIT.silence;
  return outcome.kind === "refused" || outcome.kind === "failed" ? EXIT.refused : EXIT.ok;
}

function pause(ms: number, signal: AbortSignal | undefined): Promise<void> {
  return new Promise((resolve) => {
    if (signal?.aborted) return resolve();
    const timer = setTimeout(done, ms);
    function done() {
      clearTimeout(timer);
      signal?.removeEventListener("abort", done);
      resolve();
    }
    signal?.addEventListener("abort", done, { once: true });
  });
}

async function watch(agent: Agent): Promise<number> {
  const { opts } = agent;
  const random = opts.random ?? Math.random;
  const output = new GrowingOutput(opts.output);
  const tail = new Tail(opts.input);
  const lines = new LineReducer(() => agent.reducer!, opts.log);
  const start = () => {
    if (agent.reducer !== null || agent.current === null) return;
    agent.reducer = new Reducer(agent.current.plan);
    output.reset();
  };
  const readInput = () => {
    if (agent.reducer === null) return;
    try {
      const got = tail.read();
      if (got.restarted) {
        opts.log(`${opts.input} was replaced; reading it from its start`);
        lines.restart();
      }
      output.append(lines.lines(got.lines));
    } catch (e) {
      opts.log(`reading ${opts.input}: ${(e as Error).message}`);
    }
  };
  start();
  const timer = setInterval(readInput, opts.tailMs ?? 1000);
  try {
    while (!opts.signal?.aborted) {
      const outcome = await agent.cycle();
      start();
      readInput();
      await agent.report(outcome);
      const alarm = agent.silence();
      if (alarm) opts.log(alarm);
      const poll = agent.current?.plan.bundle.poll ?? 60;
      const wait = Math.max(pollDelay(poll, random), outcome.kind === "unreachable" ? (outcome.retryAfterMs ?? 0) : 0);
      await pause(wait, opts.signal);
    }
  } finally {
    clearInterval(timer);
  }
  if (agent.reducer !== null) {
    readInput();
    output.append(rowsText(agent.reducer.finish()));
    await agent.report(null);
  }
  return EXIT.ok;
}
