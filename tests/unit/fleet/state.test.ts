import { describe, expect, it } from "vitest";
import { gatewayState, reductionRatio, staleBefore, type StateInput } from "@/lib/fleet/state";

const now = new Date("2026-12-02T12:00:00.000Z");
const ago = (s: number) => new Date(now.getTime() - s * 1000);
const base: StateInput = { pollSeconds: 60, targetRelease: 5, runningRelease: 5, lastCheckInAt: ago(30), lastStatus: "running" };

describe("gatewayState", () => {
  it("names each state", () => {
    expect(gatewayState(base, now)).toBe("current");
    expect(gatewayState({ ...base, runningRelease: 4 }, now)).toBe("behind");
    expect(gatewayState({ ...base, runningRelease: null }, now)).toBe("behind");
    expect(gatewayState({ ...base, lastStatus: "failed" }, now)).toBe("failing");
    expect(gatewayState({ ...base, lastCheckInAt: ago(181) }, now)).toBe("stale");
    expect(gatewayState({ ...base, runningRelease: null, lastCheckInAt: null, lastStatus: null }, now)).toBe("awaiting");
    expect(gatewayState({ ...base, targetRelease: null, runningRelease: null, lastCheckInAt: null, lastStatus: null }, now)).toBe("no-release");
    expect(gatewayState({ ...base, targetRelease: null }, now)).toBe("no-release");
  });

  it("turns stale after three poll intervals, not at them", () => {
    expect(gatewayState({ ...base, lastCheckInAt: ago(180) }, now)).toBe("current");
    expect(gatewayState({ ...base, lastCheckInAt: new Date(ago(180).getTime() - 1) }, now)).toBe("stale");
    expect(gatewayState({ ...base, pollSeconds: 300, lastCheckInAt: ago(899) }, now)).toBe("current");
    expect(gatewayState({ ...base, pollSeconds: 300, lastCheckInAt: ago(901) }, now)).toBe("stale");
    expect(staleBefore(30, now)).toEqual(ago(90));
  });

  it("puts silence before the last failure, and a failure before the release comparison", () => {
    expect(gatewayState({ ...base, lastStatus: "failed", lastCheckInAt: ago(3600) }, now)).toBe("stale");
    expect(gatewayState({ ...base, lastStatus: "failed", runningRelease: 2 }, now)).toBe("failing");
    expect(gatewayState({ ...base, lastStatus: "failed", targetRelease: null }, now)).toBe("failing");
  });
});

describe("reductionRatio", () => {
  it("divides points in by points out, and has none when nothing went out or came in", () => {
    expect(reductionRatio(1500, 150)).toBe(10);
    expect(reductionRatio(100, 0)).toBeNull();
    expect(reductionRatio(0, 0)).toBeNull();
  });
});
