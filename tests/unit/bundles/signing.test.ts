import fs from "node:fs";
import os from "node:os";
import path from "node:path";
import { afterEach, describe, expect, it } from "vitest";
import { digestHex } from "@/lib/bundles/digest";
import { generateSigningKey, loadSigningKeys, publicKeys, rotateKey, signBytes, verifyBytes } from "@/lib/bundles/signing";

// FIPS 180-2, Appendix B.1: SHA-256("abc").
const ABC = "ba7816bf8f01cfea414140de5dae2223b00361a396177a9cb410ff61f20015ad";

// RFC 8032 §7.1, TEST 1 (Ed25519, empty message).
const RFC_SECRET = "9d61b19deffd5a60ba844af492ec2cc44449c5697b326919703bac031cae7f60";
const RFC_PUBLIC = "d75a980182b10ab7d54bfed3c964073a0ee172f3daa62325af021a68f707511a";
const RFC_SIGNATURE =
  "e5564300c360ac729086e2cc806e828a84877f1eb8e5d974d873e065224901555fb8821590a33bacc61e39701cf9b46bd25bf5f0595bbe24655141438e7a100b";

/**
 * PEM from the raw 32-byte keys by prefixing their fixed DER headers: PKCS #8
 * PrivateKeyInfo for Ed25519 (RFC 8410 §7: SEQUENCE { INTEGER 0, AlgorithmIdentifier
 * { OID 1.3.101.112 }, OCTET STRING { OCTET STRING seed } }) is 302e020100300506032b657004220420 ‖ seed;
 * SubjectPublicKeyInfo (RFC 8410 §4) is 302a300506032b6570032100 ‖ key.
 */
const pem = (label: string, prefix: string, raw: string) =>
  `-----BEGIN ${label}-----\n${Buffer.from(prefix + raw, "hex").toString("base64")}\n-----END ${label}-----\n`;
const rfcKey = {
  id: "rfc8032",
  privateKeyPem: pem("PRIVATE KEY", "302e020100300506032b657004220420", RFC_SECRET),
  publicKeyPem: pem("PUBLIC KEY", "302a300506032b6570032100", RFC_PUBLIC),
};

describe("digestHex", () => {
  it("is the SHA-256 of the exact UTF-8 bytes", () => {
    expect(digestHex("abc")).toBe(ABC);
    expect(digestHex(new Uint8Array([0x61, 0x62, 0x63]))).toBe(ABC);
    expect(digestHex("é")).toBe(digestHex(new Uint8Array([0xc3, 0xa9])));
  });
});

describe("signBytes / verifyBytes", () => {
  it("reproduces RFC 8032 §7.1 TEST 1", () => {
    const signature = signBytes(rfcKey, new Uint8Array(0));
    expect(Buffer.from(signature, "base64").toString("hex")).toBe(RFC_SIGNATURE);
    expect(verifyBytes(rfcKey.publicKeyPem, "", signature)).toBe(true);
  });

  it("fails verification when one byte of the signature or the message is flipped", () => {
    const sig = Buffer.from(RFC_SIGNATURE, "hex");
    sig[10] ^= 0x01;
    expect(verifyBytes(rfcKey.publicKeyPem, "", sig.toString("base64"))).toBe(false);
    const key = generateSigningKey("k1");
    const message = Buffer.from("sluice: bundle/1\n");
    const good = signBytes(key, message);
    expect(verifyBytes(key.publicKeyPem, message, good)).toBe(true);
    message[0] ^= 0x20;
    expect(verifyBytes(key.publicKeyPem, message, good)).toBe(false);
  });

  it("answers false for a signature that is not 64 bytes of canonical base64", () => {
    const key = generateSigningKey("k1");
    expect(verifyBytes(key.publicKeyPem, "x", "not base64!")).toBe(false);
    expect(verifyBytes(key.publicKeyPem, "x", Buffer.alloc(63).toString("base64"))).toBe(false);
  });
});

describe("rotation", () => {
  it("signs the new public key with the old key", () => {
    const k1 = generateSigningKey("k1");
    const k2 = rotateKey(k1, "k2");
    expect(k2.signedBy?.keyId).toBe("k1");
    expect(verifyBytes(k1.publicKeyPem, k2.publicKeyPem, k2.signedBy!.signature)).toBe(true);
    expect(verifyBytes(k2.publicKeyPem, k2.publicKeyPem, k2.signedBy!.signature)).toBe(false);
    expect(publicKeys([k1, k2])).toEqual([
      { id: "k1", publicKey: k1.publicKeyPem },
      { id: "k2", publicKey: k2.publicKeyPem, signedBy: k2.signedBy },
    ]);
    expect(JSON.stringify(publicKeys([k1, k2]))).not.toContain("PRIVATE");
  });

  it("loads both keys from configuration and refuses a forged chain", () => {
    const k1 = generateSigningKey("k1");
    const k2 = rotateKey(k1, "k2");
    const loaded = loadSigningKeys({ envJson: JSON.stringify({ active: "k1", keys: [k1, k2] }) });
    expect(loaded.active.id).toBe("k1");
    expect(loaded.keys.map((k) => k.id)).toEqual(["k1", "k2"]);
    expect(loadSigningKeys({ envJson: JSON.stringify([k1, k2]) }).active.id).toBe("k2");
    const forged = { ...k2, signedBy: { keyId: "k1", signature: signBytes(k2, k2.publicKeyPem) } };
    expect(() => loadSigningKeys({ envJson: JSON.stringify([k1, forged]) })).toThrow(/does not verify/);
    const mismatched = { ...k1, publicKeyPem: k2.publicKeyPem };
    expect(() => loadSigningKeys({ envJson: JSON.stringify([mismatched]) })).toThrow(/does not belong/);
    try {
      loadSigningKeys({ envJson: JSON.stringify([mismatched]) });
    } catch (e) {
      expect((e as Error).message).not.toContain("PRIVATE");
    }
  });
});

describe("loadSigningKeys", () => {
  const dirs: string[] = [];
  afterEach(() => dirs.splice(0).forEach((d) => fs.rmSync(d, { recursive: true, force: true })));
  const tmp = () => {
    const d = fs.mkdtempSync(path.join(os.tmpdir(), "sluice-keys-"));
    dirs.push(d);
    return d;
  };

  it("generates one key under the data directory on the first call and reuses it", () => {
    const dataDir = path.join(tmp(), ".data");
    const first = loadSigningKeys({ dataDir });
    const file = path.join(dataDir, "signing-keys.json");
    expect(fs.statSync(file).mode & 0o777).toBe(0o600);
    const again = loadSigningKeys({ dataDir });
    expect(again.active).toEqual(first.active);
    expect(again.keys).toHaveLength(1);
    expect(verifyBytes(again.active.publicKeyPem, "x", signBytes(first.active, "x"))).toBe(true);
    expect(fs.readdirSync(dataDir)).toEqual(["signing-keys.json"]);
  });

  it("prefers the environment value, then a mounted file, to the data directory", () => {
    const dir = tmp();
    const k = generateSigningKey("mounted");
    const file = path.join(dir, "keys.json");
    fs.writeFileSync(file, JSON.stringify({ active: "mounted", keys: [k] }));
    const env = generateSigningKey("from-env");
    expect(loadSigningKeys({ envJson: JSON.stringify([env]), filePath: file, dataDir: dir }).active.id).toBe("from-env");
    expect(loadSigningKeys({ envJson: "", filePath: file, dataDir: dir }).active.id).toBe("mounted");
    expect(fs.existsSync(path.join(dir, "signing-keys.json"))).toBe(false);
    expect(() => loadSigningKeys({})).toThrow(/no signing key/);
  });
});
