import { describe, expect, it } from "vitest";
import { digestHex } from "@/lib/bundles/digest";
import { generateSigningKey, publicKeys, rotateKey, signBytes } from "@/lib/bundles/signing";
import { adoptKeys, readKeyList } from "@/lib/agent/keys";
import { VerificationError, etagDigest, parseSignatureHeader, verifyBundle, verifyFreshness, type Pulled } from "@/lib/agent/verify";
import { bundleText, freshness, pinned } from "./fixtures";

// Ed25519: RFC 8032; SHA-256: FIPS 180-4; ETag: RFC 9110 §8.8.3; JWS: RFC 7515 with
// EdDSA per RFC 8037, made and checked with jose. Real keys and signatures throughout.
const k1 = generateSigningKey("k1");
const other = generateSigningKey("k1"); // same id, other key material
const text = bundleText({ release: 14 });
const bytes = new TextEncoder().encode(text);
const digest = digestHex(text);

const pulled = (over: Partial<Pulled> = {}): Pulled => ({
  body: bytes,
  etag: `"${digest}"`,
  signature: `key=k1, ed25519=${signBytes(k1, bytes)}`,
  release: "14",
  ...over,
});

function refusal(f: () => unknown): VerificationError {
  try {
    f();
  } catch (e) {
    expect(e).toBeInstanceOf(VerificationError);
    return e as VerificationError;
  }
  throw new Error("expected a VerificationError");
}

describe("verifyBundle", () => {
  it("accepts a correctly signed bundle and reads it", () => {
    const v = verifyBundle(pulled(), [pinned(k1)], { gateway: "fw-gw-01", release: 13 });
    expect(v.bundle.gateway).toBe("fw-gw-01");
    expect(v.bundle.release).toBe(14);
    expect(v.digest).toBe(digest);
    expect(v.keyId).toBe("k1");
    // Equal release is a re-pull; the gzip form of the ETag names the same digest.
    expect(verifyBundle(pulled({ etag: `"${digest}-gzip"` }), [pinned(k1)], { release: 14 }).bundle.release).toBe(14);
  });

  it("refuses a tampered body (the digest no longer matches the ETag)", () => {
    const tampered = new TextEncoder().encode(text.replace("deadband: 5", "deadband: 50"));
    expect(refusal(() => verifyBundle(pulled({ body: tampered }), [pinned(k1)], {})).code).toBe("digest");
  });

  it("refuses a tampered body whose ETag was changed to match (the signature no longer verifies)", () => {
    const tampered = text.replace("deadband: 5", "deadband: 50");
    const e = refusal(() => verifyBundle(pulled({ body: new TextEncoder().encode(tampered), etag: `"${digestHex(tampered)}"` }), [pinned(k1)], {}));
    expect(e.code).toBe("signature");
  });

  it("refuses a bad signature: by another key under the pinned id, or not 64 bytes of base64", () => {
    expect(refusal(() => verifyBundle(pulled({ signature: `key=k1, ed25519=${signBytes(other, bytes)}` }), [pinned(k1)], {})).code).toBe("signature");
    expect(refusal(() => verifyBundle(pulled({ signature: "key=k1, ed25519=AAAA" }), [pinned(k1)], {})).code).toBe("signature");
    expect(refusal(() => verifyBundle(pulled({ signature: null }), [pinned(k1)], {})).code).toBe("signature");
  });

  it("refuses a key that is not pinned, naming it", () => {
    const k9 = generateSigningKey("k9");
    const e = refusal(() => verifyBundle(pulled({ signature: `key=k9, ed25519=${signBytes(k9, bytes)}` }), [pinned(k1)], {}));
    expect(e.code).toBe("unknown-key");
    expect(e.keyId).toBe("k9");
  });

  it("refuses a lower release than the one in the state dir, and a Bundle-Release that disagrees", () => {
    const e = refusal(() => verifyBundle(pulled(), [pinned(k1)], { release: 15 }));
    expect(e.code).toBe("release");
    expect(e.message).toContain("lower");
    expect(refusal(() => verifyBundle(pulled({ release: "15" }), [pinned(k1)], {})).code).toBe("release");
  });

  it("refuses a bundle for another gateway", () => {
    const t2 = bundleText({ gateway: "fw-gw-02" });
    const b2 = new TextEncoder().encode(t2);
    const e = refusal(() => verifyBundle({ body: b2, etag: `"${digestHex(t2)}"`, signature: `key=k1, ed25519=${signBytes(k1, b2)}`, release: "14" }, [pinned(k1)], { gateway: "fw-gw-01" }));
    expect(e.code).toBe("gateway");
  });

  it("refuses a signed document that is not a valid bundle, or names another key than it is signed with", () => {
    const bad = text.replace("poll: 60", "poll: soon");
    const bb = new TextEncoder().encode(bad);
    expect(refusal(() => verifyBundle({ body: bb, etag: `"${digestHex(bad)}"`, signature: `key=k1, ed25519=${signBytes(k1, bb)}`, release: null }, [pinned(k1)], {})).code).toBe("bundle");
    const named = bundleText({ keyId: "k0" });
    const nb = new TextEncoder().encode(named);
    expect(refusal(() => verifyBundle({ body: nb, etag: `"${digestHex(named)}"`, signature: `key=k1, ed25519=${signBytes(k1, nb)}`, release: null }, [pinned(k1)], {})).code).toBe("bundle");
  });

  it("reads the header forms of ETag and Bundle-Signature", () => {
    expect(etagDigest(`W/"${digest}"`)).toBe(digest);
    expect(etagDigest(`"${digest}-br"`)).toBeUndefined();
    expect(etagDigest(null)).toBeUndefined();
    expect(parseSignatureHeader('ed25519="c2ln", key=k2')).toEqual({ keyId: "k2", signature: "c2ln" });
  });
});

describe("verifyFreshness", () => {
  const now = Date.UTC(2026, 11, 1, 10, 0, 0);
  const s = now / 1000;
  const subject = { gateway: "fw-gw-01", release: 14, digest };
  const claims = (over: Record<string, unknown> = {}) => ({ ...subject, iat: s - 10, exp: s + 170, ...over });

  it("accepts a statement signed by the pinned key its kid names", async () => {
    const f = await verifyFreshness(await freshness(k1, claims()), [pinned(k1)], subject, now, 60);
    expect(f).toMatchObject({ ...subject, kid: "k1" });
  });

  it("refuses an expired statement beyond the skew, and accepts one within it", async () => {
    const expired = await freshness(k1, claims({ iat: s - 400, exp: s - 61 }));
    const e = await verifyFreshness(expired, [pinned(k1)], subject, now, 60).catch((x) => x);
    expect(e).toBeInstanceOf(VerificationError);
    expect(e.message).toContain("expired");
    await expect(verifyFreshness(await freshness(k1, claims({ exp: s - 59 })), [pinned(k1)], subject, now, 60)).resolves.toBeTruthy();
    await expect(verifyFreshness(await freshness(k1, claims({ exp: s - 59 })), [pinned(k1)], subject, now, 0)).rejects.toThrow(/expired/);
  });

  it("refuses a stale statement for an older release or other bytes (a replayed answer)", async () => {
    for (const over of [{ release: 13 }, { digest: "0".repeat(64) }, { gateway: "fw-gw-02" }]) {
      await expect(verifyFreshness(await freshness(k1, claims(over)), [pinned(k1)], subject, now, 60)).rejects.toThrow(/freshness statement is for/);
    }
  });

  it("refuses a statement issued in the future beyond the skew", async () => {
    await expect(verifyFreshness(await freshness(k1, claims({ iat: s + 120, exp: s + 400 })), [pinned(k1)], subject, now, 60)).rejects.toThrow(/future/);
  });

  it("refuses a badly signed statement: another key under the pinned kid, a changed payload, an unpinned kid, another alg", async () => {
    await expect(verifyFreshness(await freshness(other, claims()), [pinned(k1)], subject, now, 60)).rejects.toThrow(/does not verify/);
    const [h, , sig] = (await freshness(k1, claims())).split(".");
    const forged = Buffer.from(JSON.stringify(claims({ exp: s + 10_000 }))).toString("base64url");
    await expect(verifyFreshness(`${h}.${forged}.${sig}`, [pinned(k1)], subject, now, 60)).rejects.toThrow(/does not verify/);
    const k9 = generateSigningKey("k9");
    const unknown = await verifyFreshness(await freshness(k9, claims()), [pinned(k1)], subject, now, 60).catch((x) => x);
    expect(unknown.code).toBe("unknown-key");
    const none = `${Buffer.from(JSON.stringify({ alg: "none", kid: "k1" })).toString("base64url")}.${Buffer.from(JSON.stringify(claims())).toString("base64url")}.`;
    await expect(verifyFreshness(none, [pinned(k1)], subject, now, 60)).rejects.toThrow(/does not verify/);
    await expect(verifyFreshness(null, [pinned(k1)], subject, now, 60)).rejects.toThrow(/no Bundle-Freshness/);
  });
});

describe("key pinning", () => {
  it("pins a published key only when a pinned key signed it, following a chain in any order", () => {
    const k2 = rotateKey(k1, "k2");
    const k3 = rotateKey(k2, "k3");
    const a = adoptKeys([pinned(k1)], publicKeys([k3, k2, k1]));
    expect(a.added).toEqual(["k2", "k3"]);
    expect(a.pinned.map((k) => k.id)).toEqual(["k1", "k2", "k3"]);
    expect(a.refused).toEqual([]);
  });

  it("refuses an unsigned key, a key signed by an unpinned one, a bad signature, and other material under a pinned id", () => {
    const k2 = rotateKey(k1, "k2");
    const stranger = generateSigningKey("s1");
    const byStranger = rotateKey(stranger, "k4");
    const forged = { ...publicKeys([generateSigningKey("k5")])[0], signedBy: { keyId: "k1", signature: signBytes(k1, "something else") } };
    const swapped = publicKeys([other])[0];
    const a = adoptKeys([pinned(k1)], [...publicKeys([stranger, byStranger]), forged, swapped]);
    expect(a.added).toEqual([]);
    expect(a.pinned).toEqual([pinned(k1)]);
    expect(Object.fromEntries(a.refused.map((r) => [r.id, r.reason]))).toEqual({
      k1: "a pinned key has this id with other key material",
      s1: "not signed by a pinned key",
      k4: 'signed by "s1", which is not pinned',
      k5: 'its signature by "k1" does not verify',
    });
    expect(adoptKeys([pinned(k1)], publicKeys([k2])).added).toEqual(["k2"]);
  });

  it("reads a trust file in the signing-key answer's form or as a list, and refuses what is not an Ed25519 key", () => {
    const answer = JSON.stringify({ keys: publicKeys([k1]) });
    expect(readKeyList(answer, "keys.json")).toEqual([pinned(k1)]);
    expect(readKeyList(JSON.stringify([pinned(k1)]), "keys.json")).toEqual([pinned(k1)]);
    expect(() => readKeyList("{}", "keys.json")).toThrow(/lists no keys/);
    expect(() => readKeyList(JSON.stringify([{ id: "k1", publicKey: "nope" }]), "keys.json")).toThrow(/not a readable public key/);
    expect(() => readKeyList(JSON.stringify([pinned(k1), pinned(k1)]), "keys.json")).toThrow(/twice/);
  });
});
