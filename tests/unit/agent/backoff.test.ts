import { afterEach, beforeEach, describe, expect, it, vi } from "vitest";
import { UnreachableError, backoffDelay, parseRetryAfter, pollDelay, sleep, withRetries, type RetryPolicy } from "@/lib/agent/backoff";
import { seeded } from "./fixtures";

// Full jitter: delay = random(0, min(cap, base · 2^attempt)) — M. Brooker, "Exponential
// Backoff and Jitter", AWS Architecture Blog, 2015. Retry-After: RFC 9110 §10.2.3.
const policy: RetryPolicy = { baseMs: 1000, capMs: 60_000, maxAttempts: 5, maxWaitMs: 300_000 };

describe("backoffDelay", () => {
  it("stays within [0, min(cap, base · 2^attempt)) for a seeded random source, and spreads over it", () => {
    const random = seeded(42);
    for (let attempt = 0; attempt < 12; attempt++) {
      const ceiling = Math.min(60_000, 1000 * 2 ** attempt);
      const delays = Array.from({ length: 2000 }, () => backoffDelay(attempt, policy, random));
      expect(Math.min(...delays)).toBeGreaterThanOrEqual(0);
      expect(Math.max(...delays)).toBeLessThan(ceiling);
      // Full jitter uses the whole range, not a band near the ceiling.
      expect(Math.min(...delays)).toBeLessThan(0.01 * ceiling);
      expect(Math.max(...delays)).toBeGreaterThan(0.99 * ceiling);
    }
  });

  it("reaches the bounds at the ends of the random source and stops growing at the cap", () => {
    expect(backoffDelay(0, policy, () => 0)).toBe(0);
    const top = 1 - 2 ** -53;
    expect(backoffDelay(0, policy, () => top)).toBeCloseTo(1000, 6);
    expect(backoffDelay(3, policy, () => top)).toBeCloseTo(8000, 6);
    expect(backoffDelay(6, policy, () => top)).toBeCloseTo(60_000, 6); // 64 000 capped
    expect(backoffDelay(1000, policy, () => top)).toBeCloseTo(60_000, 6); // no overflow for a huge attempt
  });
});

describe("pollDelay", () => {
  it("is the poll interval ± 10 %", () => {
    expect(pollDelay(60, () => 0)).toBe(54_000);
    expect(pollDelay(60, () => 0.5)).toBe(60_000);
    const random = seeded(7);
    const all = Array.from({ length: 5000 }, () => pollDelay(60, random));
    expect(Math.min(...all)).toBeGreaterThanOrEqual(54_000);
    expect(Math.max(...all)).toBeLessThan(66_000);
  });
});

describe("parseRetryAfter (RFC 9110 §10.2.3, HTTP-date §5.6.7)", () => {
  const now = Date.UTC(1999, 11, 31, 23, 58, 59);
  it("reads delay-seconds and the standard's own examples", () => {
    expect(parseRetryAfter("120", now)).toBe(120_000);
    expect(parseRetryAfter(" 0 ", now)).toBe(0);
    expect(parseRetryAfter("Fri, 31 Dec 1999 23:59:59 GMT", now)).toBe(60_000);
  });
  it("reads the obsolete date forms a recipient must accept", () => {
    const at = Date.UTC(1994, 10, 6, 8, 49, 37);
    expect(parseRetryAfter("Sunday, 06-Nov-94 08:49:37 GMT", at - 5000)).toBe(5000);
    expect(parseRetryAfter("Sun Nov  6 08:49:37 1994", at - 5000)).toBe(5000);
  });
  it("makes a date in the past 0 and refuses anything else", () => {
    expect(parseRetryAfter("Fri, 31 Dec 1999 23:00:00 GMT", now)).toBe(0);
    for (const bad of [null, undefined, "", "soon", "-5", "1.5", "Fri, 31 Feb 1999 23:59:59 GMT", "Fri, 31 Dec 1999 23:59:59 UTC"]) {
      expect(parseRetryAfter(bad, now)).toBeUndefined();
    }
  });
});

describe("withRetries", () => {
  beforeEach(() => {
    vi.useFakeTimers({ now: Date.UTC(2026, 11, 1, 10, 0, 0) });
  });
  afterEach(() => {
    vi.useRealTimers();
  });

  /** A send that answers from a script and records when (fake clock) each call came. */
  function scripted(answers: (() => Response)[]) {
    const at: number[] = [];
    const send = async () => {
      at.push(Date.now());
      const next = answers.shift();
      if (!next) throw new Error("script ran out");
      return next();
    };
    return { send, at };
  }
  const down = () => {
    throw new TypeError("fetch failed");
  };
  const deps = (random: () => number, over: Partial<RetryPolicy> = {}) => ({ policy: { ...policy, ...over }, random, sleep, now: () => Date.now() });

  it("waits random(0, min(cap, base · 2^attempt)) between network errors, in real timer steps", async () => {
    const { send, at } = scripted([down, down, down, () => new Response("ok")]);
    const t0 = Date.now();
    const done = withRetries(send, deps(() => 0.5));
    await vi.advanceTimersByTimeAsync(0);
    expect(at).toHaveLength(1);
    await vi.advanceTimersByTimeAsync(499);
    expect(at).toHaveLength(1); // 0.5 × 1000 ms not yet over
    await vi.advanceTimersByTimeAsync(1);
    expect(at).toHaveLength(2);
    await vi.advanceTimersByTimeAsync(1000 + 2000);
    expect((await done).status).toBe(200);
    expect(at.map((t) => t - t0)).toEqual([0, 500, 1500, 3500]);
  });

  it("keeps every wait of a seeded run within its full-jitter bound", async () => {
    const random = seeded(1234);
    const { send, at } = scripted([down, down, down, down, () => new Response("ok")]);
    const done = withRetries(send, deps(random, { baseMs: 500, capMs: 3000 }));
    await vi.runAllTimersAsync();
    expect((await done).status).toBe(200);
    const waits = at.slice(1).map((t, i) => t - at[i]);
    const bounds = [500, 1000, 2000, 3000];
    waits.forEach((w, i) => {
      expect(w).toBeGreaterThanOrEqual(0);
      expect(w).toBeLessThan(bounds[i]);
    });
    // The same seed gives the same schedule.
    const again = seeded(1234);
    const expected = bounds.map((b) => again() * b);
    waits.forEach((w, i) => expect(Math.abs(w - expected[i])).toBeLessThanOrEqual(1));
  });

  it("waits exactly Retry-After on 503 and 429 (seconds or HTTP-date), however short the backoff would be", async () => {
    const in30s = new Date(Date.now() + 30_000).toUTCString();
    const { send, at } = scripted([
      () => new Response(null, { status: 503, headers: { "retry-after": "7" } }),
      () => new Response(null, { status: 429, headers: { "retry-after": in30s } }),
      () => new Response("ok"),
    ]);
    const t0 = Date.now();
    const done = withRetries(send, deps(() => 0));
    await vi.advanceTimersByTimeAsync(6999);
    expect(at).toHaveLength(1);
    await vi.advanceTimersByTimeAsync(1);
    expect(at).toHaveLength(2);
    await vi.advanceTimersByTimeAsync(22_999);
    expect(at).toHaveLength(2); // the date names an instant: 30 s after the start, not after the 429
    await vi.advanceTimersByTimeAsync(1);
    expect((await done).status).toBe(200);
    expect(at.map((t) => t - t0)).toEqual([0, 7000, 30_000]);
  });

  it("falls back to the backoff on 429 without Retry-After, and on 500", async () => {
    const { send, at } = scripted([() => new Response(null, { status: 429 }), () => new Response(null, { status: 500 }), () => new Response("ok")]);
    const done = withRetries(send, deps(() => 0.25));
    await vi.runAllTimersAsync();
    expect((await done).status).toBe(200);
    expect(at[1] - at[0]).toBe(250);
    expect(at[2] - at[1]).toBe(500);
  });

  it.each([401, 403, 404, 413, 422])("never retries %i: the answer comes back after one request", async (status) => {
    const { send, at } = scripted([() => new Response(null, { status }), () => new Response("ok")]);
    const res = await withRetries(send, deps(() => 0.5));
    expect(res.status).toBe(status);
    expect(at).toHaveLength(1);
  });

  it("gives up after maxAttempts, and at once when Retry-After is longer than maxWaitMs", async () => {
    const { send, at } = scripted([down, down, down]);
    const done = withRetries(send, deps(() => 0.5, { maxAttempts: 3 })).catch((e) => e);
    await vi.runAllTimersAsync();
    const err = await done;
    expect(err).toBeInstanceOf(UnreachableError);
    expect(err.message).toContain("gave up after 3 attempts");
    expect(at).toHaveLength(3);

    const long = scripted([() => new Response(null, { status: 503, headers: { "retry-after": "3600" } })]);
    const e2 = await withRetries(long.send, deps(() => 0.5)).catch((e) => e);
    expect(e2).toBeInstanceOf(UnreachableError);
    expect(e2.retryAfterMs).toBe(3_600_000);
    expect(long.at).toHaveLength(1);
  });
});
