import { randomBytes } from "node:crypto";
import fs from "node:fs";
import path from "node:path";
import { type PinnedKey, keyListText, readKeyList } from "./keys";

/**
 * Writes a file so a reader sees the old bytes or the new, never a mix: a temporary file
 * in the same directory, flushed to disk, then renamed over the target (POSIX rename is
 * atomic within a file system).
 */
export function writeFileAtomic(file: string, data: string | Uint8Array, mode = 0o600): void {
  const tmp = path.join(path.dirname(file), `.${path.basename(file)}.${process.pid}.${randomBytes(4).toString("hex")}.tmp`);
  const fd = fs.openSync(tmp, "wx", mode);
  try {
    fs.writeSync(fd, typeof data === "string" ? Buffer.from(data, "utf8") : data);
    fs.fsyncSync(fd);
  } finally {
    fs.closeSync(fd);
  }
  try {
    fs.renameSync(tmp, file);
  } catch (e) {
    fs.rmSync(tmp, { force: true });
    throw e;
  }
}

/** The last good bundle: bytes and everything needed to check them again, kept in one file so they change together. */
export type StoredBundle = { release: number; gateway: string; digest: string; keyId: string; signature: string; text: string; appliedAt: string };

/** What the agent remembers between runs besides keys and bundle. */
export type AgentState = {
  /** When (agent clock, epoch ms) a valid freshness statement was last seen. */
  freshAt?: number;
  /** The end of the last report's counters: the next report counts from here (ISO 8601). */
  countedTo?: string;
};

/** A check-in report (DESIGN.md "Gateway API": `PUT /api/gateway/v1/check-in`). */
export type Report = {
  report: string;
  release: number;
  digest: string;
  status: "running" | "failed";
  appliedAt: string;
  pointsIn: number;
  pointsOut: number;
  from: string;
  to: string;
  message?: string;
  unknownTags?: string[];
};

const KEYS = "keys.json";
const BUNDLE = "bundle.json";
const STATE = "state.json";
const OUTBOX = "outbox";

/** The agent's state directory: pinned keys, the last good bundle, its memory and the outbox of unsent reports. */
export class StateDir {
  constructor(readonly dir: string) {
    fs.mkdirSync(path.join(dir, OUTBOX), { recursive: true, mode: 0o700 });
  }

  private file(name: string) {
    return path.join(this.dir, name);
  }

  private readText(name: string): string | null {
    try {
      return fs.readFileSync(this.file(name), "utf8");
    } catch (e) {
      if ((e as NodeJS.ErrnoException).code === "ENOENT") return null;
      throw e;
    }
  }

  /** The pinned keys, or null before the first run copied the trust file. */
  readKeys(): PinnedKey[] | null {
    const text = this.readText(KEYS);
    return text === null ? null : readKeyList(text, path.join(this.dir, KEYS));
  }

  writeKeys(keys: readonly PinnedKey[]): void {
    writeFileAtomic(this.file(KEYS), keyListText(keys));
  }

  readBundle(): StoredBundle | null {
    const text = this.readText(BUNDLE);
    return text === null ? null : (JSON.parse(text) as StoredBundle);
  }

  writeBundle(b: StoredBundle): void {
    writeFileAtomic(this.file(BUNDLE), `${JSON.stringify(b)}\n`);
  }

  readState(): AgentState {
    const text = this.readText(STATE);
    return text === null ? {} : (JSON.parse(text) as AgentState);
  }

  updateState(change: Partial<AgentState>): AgentState {
    const next = { ...this.readState(), ...change };
    writeFileAtomic(this.file(STATE), `${JSON.stringify(next)}\n`);
    return next;
  }

  /** Keeps a report until the registry has it; file names sort in the order the reports were made. */
  putReport(r: Report): void {
    const name = `${Date.parse(r.to).toString().padStart(15, "0")}-${r.report}.json`;
    writeFileAtomic(path.join(this.dir, OUTBOX, name), `${JSON.stringify(r)}\n`);
  }

  /** The unsent reports, oldest first, with the file each is kept in. */
  pendingReports(): { file: string; report: Report }[] {
    const dir = path.join(this.dir, OUTBOX);
    return fs
      .readdirSync(dir)
      .filter((n) => n.endsWith(".json") && !n.startsWith("."))
      .sort()
      .map((n) => ({ file: path.join(dir, n), report: JSON.parse(fs.readFileSync(path.join(dir, n), "utf8")) as Report }));
  }

  removeReport(file: string): void {
    fs.rmSync(file, { force: true });
  }
}
