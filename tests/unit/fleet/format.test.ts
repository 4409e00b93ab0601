import { describe, expect, it } from "vitest";
import { ratioText, relativeTime, shortDigest, utcTime } from "@/components/fleet/format";

const now = new Date("2026-12-02T12:00:00.000Z");
const ago = (s: number) => new Date(now.getTime() - s * 1000);

describe("fleet formats", () => {
  it("says how long ago, in the largest whole unit", () => {
    expect(relativeTime(ago(0), now)).toBe("0 s ago");
    expect(relativeTime(ago(59), now)).toBe("59 s ago");
    expect(relativeTime(ago(60), now)).toBe("1 min ago");
    expect(relativeTime(ago(3599), now)).toBe("59 min ago");
    expect(relativeTime(ago(7200), now)).toBe("2 h ago");
    expect(relativeTime(ago(47 * 3600), now)).toBe("47 h ago");
    expect(relativeTime(ago(5 * 86_400), now)).toBe("5 d ago");
    expect(relativeTime(ago(-5), now)).toBe("in 5 s");
  });

  it("writes UTC times, ratios and short digests", () => {
    expect(utcTime(new Date("2026-12-02T09:05:07.123Z"))).toBe("2026-12-02 09:05:07 UTC");
    expect(ratioText(10, true)).toBe("10:1");
    expect(ratioText(1.8181818, true)).toBe("1.82:1");
    expect(ratioText(null, true)).toBe("nothing sent");
    expect(ratioText(null, false)).toBe("—");
    expect(shortDigest("abcdef0123456789".repeat(4))).toBe("abcdef012345");
    expect(shortDigest(null)).toBe("—");
  });
});
