import { createPrivateKey, createPublicKey, generateKeyPairSync, randomBytes, sign, verify, type KeyObject } from "node:crypto";
import fs from "node:fs";
import path from "node:path";

/**
 * A registry signing key (Ed25519, RFC 8032) as PEM: PKCS #8 private, SPKI public. After
 * a rotation the new key carries `signedBy`: the old key's Ed25519 signature over the
 * exact bytes of the new `publicKeyPem` (see lib/bundles/README.md).
 */
export type SigningKey = {
  id: string;
  privateKeyPem: string;
  publicKeyPem: string;
  signedBy?: { keyId: string; signature: string };
};
export type SigningKeys = { active: SigningKey; keys: SigningKey[] };
/** A key as the gateway API publishes it (`GET /api/gateway/v1/signing-key`). */
export type PublicKeyEntry = { id: string; publicKey: string; signedBy?: { keyId: string; signature: string } };

/** Key ids go into the `Bundle-Signature` header and JWS `kid`: no spaces, commas or quotes. */
export const KEY_ID_PATTERN = /^[A-Za-z0-9._-]{1,64}$/;
/** The generated key file under the data directory. */
export const KEY_FILE = "signing-keys.json";

const bytesOf = (bytes: string | Uint8Array) => (typeof bytes === "string" ? Buffer.from(bytes, "utf8") : bytes);

const privateKeys = new Map<string, KeyObject>();
function privateKeyOf(pem: string): KeyObject {
  let k = privateKeys.get(pem);
  if (!k) {
    k = createPrivateKey(pem);
    if (k.asymmetricKeyType !== "ed25519") throw new Error("a signing key must be an Ed25519 private key");
    if (privateKeys.size > 16) privateKeys.clear();
    privateKeys.set(pem, k);
  }
  return k;
}

/** Ed25519 signature (RFC 8032, PureEdDSA) over the exact bytes (UTF-8 for a string), base64. */
export function signBytes(key: Pick<SigningKey, "privateKeyPem">, bytes: string | Uint8Array): string {
  return sign(null, bytesOf(bytes), privateKeyOf(key.privateKeyPem)).toString("base64");
}

/**
 * Whether `signatureB64` is a valid Ed25519 signature of the bytes under the public key.
 * A signature that is not canonical base64 of 64 bytes is false; a key that is not an
 * Ed25519 public key throws.
 */
export function verifyBytes(publicKeyPem: string, bytes: string | Uint8Array, signatureB64: string): boolean {
  const key = createPublicKey(publicKeyPem);
  if (key.asymmetricKeyType !== "ed25519") throw new Error("not an Ed25519 public key");
  const signature = Buffer.from(signatureB64, "base64");
  if (signature.length !== 64 || signature.toString("base64") !== signatureB64) return false;
  return verify(null, bytesOf(bytes), key, signature);
}

/** A new Ed25519 key pair from the operating system's CSPRNG. */
export function generateSigningKey(id: string): SigningKey {
  if (!KEY_ID_PATTERN.test(id)) throw new Error(`"${id}" is not a usable key id (letters, digits, ".", "_", "-"; at most 64)`);
  const { privateKey, publicKey } = generateKeyPairSync("ed25519", {
    privateKeyEncoding: { type: "pkcs8", format: "pem" },
    publicKeyEncoding: { type: "spki", format: "pem" },
  });
  return { id, privateKeyPem: privateKey, publicKeyPem: publicKey };
}

/** A new key whose public key the old key signs, so gateways that trust the old key can trust it. */
export function rotateKey(oldKey: SigningKey, newId: string): SigningKey {
  if (newId === oldKey.id) throw new Error("the new key needs an id of its own");
  const key = generateSigningKey(newId);
  return { ...key, signedBy: { keyId: oldKey.id, signature: signBytes(oldKey, key.publicKeyPem) } };
}

/** The keys as the gateway API publishes them: no private parts. */
export function publicKeys(keys: readonly SigningKey[]): PublicKeyEntry[] {
  return keys.map((k) => ({ id: k.id, publicKey: k.publicKeyPem, ...(k.signedBy ? { signedBy: { ...k.signedBy } } : {}) }));
}

/**
 * The registry's signing keys (DESIGN.md "Bundle"): from `envJson` (an environment value)
 * when given, else from the file at `filePath` (a mounted secret), else from
 * `<dataDir>/signing-keys.json`, generated on the first call (mode 0600, written under a
 * temporary name and linked into place, so concurrent first starts agree on one key). The
 * JSON is `{ "active": "<id>", "keys": [SigningKey, …] }` or a plain array of keys (the last
 * one active). Every key is checked: Ed25519, public key matching the private one, and a
 * `signedBy` by a listed key must verify. Errors never quote key material.
 */
export function loadSigningKeys(opts: { envJson?: string; filePath?: string; dataDir?: string }): SigningKeys {
  if (opts.envJson !== undefined && opts.envJson.trim() !== "") return parseKeys(opts.envJson, "the signing key setting");
  if (opts.filePath) return parseKeys(fs.readFileSync(opts.filePath, "utf8"), opts.filePath);
  if (!opts.dataDir) throw new Error("no signing key: configure one, or give a data directory to keep a generated one in");
  const file = path.join(opts.dataDir, KEY_FILE);
  if (!fs.existsSync(file)) createKeyFile(opts.dataDir, file);
  return parseKeys(fs.readFileSync(file, "utf8"), file);
}

function createKeyFile(dir: string, file: string) {
  fs.mkdirSync(dir, { recursive: true, mode: 0o700 });
  const key = generateSigningKey("k1");
  const tmp = `${file}.${process.pid}.${randomBytes(6).toString("hex")}.tmp`;
  fs.writeFileSync(tmp, `${JSON.stringify({ active: key.id, keys: [key] }, null, 2)}\n`, { mode: 0o600, flag: "wx" });
  try {
    fs.linkSync(tmp, file);
  } catch (e) {
    if ((e as NodeJS.ErrnoException).code !== "EEXIST") throw e;
  } finally {
    fs.unlinkSync(tmp);
  }
}

function parseKeys(text: string, source: string): SigningKeys {
  let raw: unknown;
  try {
    raw = JSON.parse(text);
  } catch {
    throw new Error(`${source} is not JSON`);
  }
  const list = Array.isArray(raw) ? raw : (raw as { keys?: unknown })?.keys;
  if (!Array.isArray(list) || list.length === 0) throw new Error(`${source} lists no signing keys`);
  const keys = list.map((k, i) => checkKey(k, `${source}: key ${i + 1}`));
  const ids = new Set<string>();
  for (const k of keys) {
    if (ids.has(k.id)) throw new Error(`${source}: key id "${k.id}" appears twice`);
    ids.add(k.id);
  }
  for (const k of keys) {
    const signer = k.signedBy && keys.find((x) => x.id === k.signedBy!.keyId);
    if (signer && !verifyBytes(signer.publicKeyPem, k.publicKeyPem, k.signedBy!.signature)) {
      throw new Error(`${source}: the signature of key "${k.id}" by key "${signer.id}" does not verify`);
    }
  }
  const activeId = Array.isArray(raw) ? keys[keys.length - 1].id : (raw as { active?: unknown }).active ?? keys[keys.length - 1].id;
  const active = keys.find((k) => k.id === activeId);
  if (!active) throw new Error(`${source}: the active key "${String(activeId)}" is not listed`);
  return { active, keys };
}

function checkKey(k: unknown, where: string): SigningKey {
  const x = (k ?? {}) as Record<string, unknown>;
  if (typeof x.id !== "string" || !KEY_ID_PATTERN.test(x.id)) throw new Error(`${where} needs an id of letters, digits, ".", "_" or "-"`);
  if (typeof x.privateKeyPem !== "string" || typeof x.publicKeyPem !== "string") throw new Error(`${where} ("${x.id}") needs privateKeyPem and publicKeyPem`);
  let matches: boolean;
  try {
    const priv = privateKeyOf(x.privateKeyPem);
    const pub = createPublicKey(x.publicKeyPem);
    const der = (key: KeyObject) => key.export({ type: "spki", format: "der" });
    matches = pub.asymmetricKeyType === "ed25519" && der(createPublicKey(priv)).equals(der(pub));
  } catch {
    throw new Error(`${where} ("${x.id}") is not a readable Ed25519 key pair in PEM`);
  }
  if (!matches) throw new Error(`${where} ("${x.id}"): the public key does not belong to the private key`);
  const s = x.signedBy as Record<string, unknown> | undefined;
  if (s !== undefined && (typeof s?.keyId !== "string" || typeof s.signature !== "string")) throw new Error(`${where} ("${x.id}"): signedBy needs keyId and signature`);
  return { id: x.id, privateKeyPem: x.privateKeyPem, publicKeyPem: x.publicKeyPem, ...(s ? { signedBy: { keyId: s.keyId as string, signature: s.signature as string } } : {}) };
}
