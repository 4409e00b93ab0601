import { describe, expect, it } from "vitest";
import { bundleEtag, ifNoneMatchMatches, parseEntityTags } from "@/lib/gateway/conditional";
import { bearerToken, generateToken, hashToken, TOKEN_PATTERN } from "@/lib/gateway/token";

describe("If-None-Match (RFC 9110 §13.1.2, weak comparison §8.8.3.2)", () => {
  const current = '"abc123"';
  it("matches the same tag, weak or strong, anywhere in a list, and *", () => {
    expect(ifNoneMatchMatches('"abc123"', current)).toBe(true);
    expect(ifNoneMatchMatches('W/"abc123"', current)).toBe(true);
    expect(ifNoneMatchMatches('"x", "y", W/"abc123"', current)).toBe(true);
    expect(ifNoneMatchMatches("*", current)).toBe(true);
    expect(ifNoneMatchMatches("  *  ", current)).toBe(true);
  });
  it("does not match other tags, unquoted values, or nothing", () => {
    expect(ifNoneMatchMatches(null, current)).toBe(false);
    expect(ifNoneMatchMatches("", current)).toBe(false);
    expect(ifNoneMatchMatches("abc123", current)).toBe(false);
    expect(ifNoneMatchMatches('"ABC123"', current)).toBe(false); // opaque tags compare octet by octet
    expect(ifNoneMatchMatches('"abc123-gzip"', current)).toBe(false);
    expect(ifNoneMatchMatches('w/"abc123"', current)).toBe(false); // W/ is case-sensitive (§8.8.3)
  });
  it("parses the weak-comparison table's examples (RFC 9110 §8.8.3.2)", () => {
    // W/"1" vs W/"1": weak match; W/"1" vs W/"2": no match; W/"1" vs "1": weak match; "1" vs "1": match.
    expect(parseEntityTags('W/"1", W/"2", "1"')).toEqual([
      { weak: true, opaque: "1" },
      { weak: true, opaque: "2" },
      { weak: false, opaque: "1" },
    ]);
    expect(ifNoneMatchMatches('W/"1"', 'W/"1"')).toBe(true);
    expect(ifNoneMatchMatches('W/"1"', 'W/"2"')).toBe(false);
    expect(ifNoneMatchMatches('W/"1"', '"1"')).toBe(true);
  });
  it("skips a malformed member and still reads the rest", () => {
    expect(parseEntityTags('bogus, "ok", "has space"x, W/"w"')).toEqual([
      { weak: false, opaque: "ok" },
      { weak: true, opaque: "w" },
    ]);
  });
  it("quotes the digest as a strong tag (RFC 9110 §8.8.3)", () => {
    expect(bundleEtag("ab")).toBe('"ab"');
    expect(ifNoneMatchMatches(bundleEtag("ab"), bundleEtag("ab"))).toBe(true);
  });
});

describe("gateway tokens", () => {
  it("carry 256 bits, a shown prefix, and are stored as SHA-256", () => {
    const seen = new Set<string>();
    for (let i = 0; i < 200; i++) {
      const t = generateToken();
      expect(t.token).toMatch(TOKEN_PATTERN);
      expect(Buffer.from(t.token.slice(4), "base64url")).toHaveLength(32);
      expect(t.prefix).toBe(t.token.slice(0, 12));
      expect(t.hash).toBe(hashToken(t.token));
      seen.add(t.token);
    }
    expect(seen.size).toBe(200);
    // SHA-256("abc") from FIPS 180-2, appendix B.1.
    expect(hashToken("abc")).toBe("ba7816bf8f01cfea414140de5dae2223b00361a396177a9cb410ff61f20015ad");
  });
  it("are read from a Bearer header only (RFC 6750 §2.1; scheme case-insensitive)", () => {
    expect(bearerToken(null)).toBeNull();
    expect(bearerToken("  ")).toBeNull();
    expect(bearerToken("Bearer sgw_abc")).toBe("sgw_abc");
    expect(bearerToken("bearer   sgw_abc ")).toBe("sgw_abc");
    expect(bearerToken("Basic dXNlcjpwYXNz")).toBe("");
    expect(bearerToken("Bearer a b")).toBe("");
    expect(bearerToken("Bearer")).toBe("");
  });
});
