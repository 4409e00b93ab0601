/** A source of uniform numbers in [0, 1): Math.random in the agent, a seeded one in tests. */
export type Random = () => number;
/** Waits `ms` milliseconds (setTimeout in the agent; vitest's fake timers drive it in tests). */
export type Sleep = (ms: number) => Promise<void>;

export type RetryPolicy = {
  /** First ceiling of the delay (ms); it doubles with every attempt. */
  baseMs: number;
  /** The ceiling never grows past this (ms). */
  capMs: number;
  /** Requests per call, the first included. */
  maxAttempts: number;
  /** A Retry-After longer than this (ms) ends the retries instead of waiting. */
  maxWaitMs: number;
};

export const DEFAULT_RETRY: RetryPolicy = { baseMs: 1000, capMs: 60_000, maxAttempts: 5, maxWaitMs: 300_000 };

export const sleep: Sleep = (ms) => new Promise((resolve) => setTimeout(resolve, ms));

/**
 * The delay before retry number `attempt` (0 for the first retry) with full jitter:
 * uniform in [0, min(cap, base · 2^attempt)) — M. Brooker, "Exponential Backoff and
 * Jitter", AWS Architecture Blog, 2015 ("Full Jitter").
 */
export function backoffDelay(attempt: number, policy: Pick<RetryPolicy, "baseMs" | "capMs">, random: Random): number {
  const ceiling = Math.min(policy.capMs, policy.baseMs * 2 ** Math.min(attempt, 52));
  return random() * ceiling;
}

/** The time to the next poll: the bundle's poll interval ± `share` (default 10 %), uniformly. */
export function pollDelay(pollSeconds: number, random: Random, share = 0.1): number {
  return pollSeconds * 1000 * (1 - share + 2 * share * random());
}

const MONTHS = ["Jan", "Feb", "Mar", "Apr", "May", "Jun", "Jul", "Aug", "Sep", "Oct", "Nov", "Dec"];
// RFC 9110 §5.6.7: IMF-fixdate, and the obsolete rfc850-date and asctime-date a recipient must accept.
const IMF_FIXDATE = /^(?:Mon|Tue|Wed|Thu|Fri|Sat|Sun), (\d{2}) ([A-Z][a-z]{2}) (\d{4}) (\d{2}):(\d{2}):(\d{2}) GMT$/;
const RFC850_DATE = /^(?:Monday|Tuesday|Wednesday|Thursday|Friday|Saturday|Sunday), (\d{2})-([A-Z][a-z]{2})-(\d{2}) (\d{2}):(\d{2}):(\d{2}) GMT$/;
const ASCTIME_DATE = /^(?:Mon|Tue|Wed|Thu|Fri|Sat|Sun) ([A-Z][a-z]{2}) ([ \d]\d) (\d{2}):(\d{2}):(\d{2}) (\d{4})$/;

/** An HTTP-date (RFC 9110 §5.6.7) as epoch ms, or undefined. */
export function parseHttpDate(text: string, nowMs: number): number | undefined {
  let m = IMF_FIXDATE.exec(text);
  let parts: [number, string, number, number, number, number] | undefined;
  if (m) parts = [Number(m[1]), m[2], Number(m[3]), Number(m[4]), Number(m[5]), Number(m[6])];
  else if ((m = RFC850_DATE.exec(text))) {
    // A two-digit year more than 50 years in the future is the most recent past year with those digits (§5.6.7).
    const nowYear = new Date(nowMs).getUTCFullYear();
    let year = Math.floor(nowYear / 100) * 100 + Number(m[3]);
    if (year > nowYear + 50) year -= 100;
    parts = [Number(m[1]), m[2], year, Number(m[4]), Number(m[5]), Number(m[6])];
  } else if ((m = ASCTIME_DATE.exec(text))) parts = [Number(m[2].trim()), m[1], Number(m[6]), Number(m[3]), Number(m[4]), Number(m[5])];
  if (!parts) return undefined;
  const [day, mon, year, h, min, s] = parts;
  const month = MONTHS.indexOf(mon);
  if (month < 0 || day < 1 || day > 31 || h > 23 || min > 59 || s > 60) return undefined;
  const ms = Date.UTC(year, month, day, h, min, Math.min(s, 59));
  return new Date(ms).getUTCDate() === day ? ms : undefined;
}

/**
 * `Retry-After` (RFC 9110 §10.2.3) as a delay in ms from `nowMs`: delay-seconds (a run of
 * digits) or an HTTP-date (a date in the past is 0). Undefined when absent or unreadable.
 */
export function parseRetryAfter(value: string | null | undefined, nowMs: number): number | undefined {
  if (value === null || value === undefined) return undefined;
  const text = value.trim();
  if (/^\d+$/.test(text)) return Number(text) * 1000;
  const at = parseHttpDate(text, nowMs);
  return at === undefined ? undefined : Math.max(0, at - nowMs);
}

/** Statuses worth asking again: timeouts, throttling and server trouble (never 401, 403 or 404). */
export function isRetryable(status: number): boolean {
  return status === 408 || status === 429 || status === 500 || status === 502 || status === 503 || status === 504;
}

/** Why the retries ended without an answer worth returning. */
export class UnreachableError extends Error {
  constructor(
    message: string,
    readonly retryAfterMs?: number,
  ) {
    super(message);
    this.name = "UnreachableError";
  }
}

export type RetryDeps = { policy: RetryPolicy; random: Random; sleep: Sleep; now: () => number; onRetry?: (why: string, delayMs: number) => void };

/**
 * Sends until an answer that is not worth retrying arrives, and returns it (a 2xx, a 304,
 * 401, 403, 404, any other 4xx). Network errors and {@link isRetryable} statuses are tried
 * again after {@link backoffDelay}; on 429 and 503 a readable `Retry-After` is waited
 * instead (RFC 9110 §10.2.3 — it wins over the backoff). Throws an
 * {@link UnreachableError} after `maxAttempts`, or when Retry-After asks for longer than
 * `maxWaitMs`.
 */
export async function withRetries(send: () => Promise<Response>, deps: RetryDeps): Promise<Response> {
  const { policy } = deps;
  let why = "";
  let retryAfterMs: number | undefined;
  for (let attempt = 0; attempt < policy.maxAttempts; attempt++) {
    let response: Response;
    try {
      response = await send();
    } catch (e) {
      why = `network error: ${(e as Error).message}${causeOf(e)}`;
      retryAfterMs = undefined;
      if (attempt + 1 < policy.maxAttempts) await wait(deps, why, backoffDelay(attempt, policy, deps.random));
      continue;
    }
    if (!isRetryable(response.status)) return response;
    await response.body?.cancel();
    why = `HTTP ${response.status}`;
    retryAfterMs = response.status === 429 || response.status === 503 ? parseRetryAfter(response.headers.get("retry-after"), deps.now()) : undefined;
    if (retryAfterMs !== undefined && retryAfterMs > policy.maxWaitMs) {
      throw new UnreachableError(`${why}: the registry asks to wait ${Math.ceil(retryAfterMs / 1000)} s`, retryAfterMs);
    }
    if (attempt + 1 < policy.maxAttempts) await wait(deps, why, retryAfterMs ?? backoffDelay(attempt, policy, deps.random));
  }
  throw new UnreachableError(`${why} (gave up after ${policy.maxAttempts} attempts)`, retryAfterMs);
}

async function wait(deps: RetryDeps, why: string, ms: number) {
  deps.onRetry?.(why, ms);
  await deps.sleep(ms);
}

function causeOf(e: unknown): string {
  const cause = (e as { cause?: { code?: string; message?: string } }).cause;
  return cause ? ` (${cause.code ?? cause.message})` : "";
}
