import { randomBytes } from "node:crypto";
import fs from "node:fs";
import path from "node:path";
import { type InputColumns, InputReader, OUTPUT_HEADER, formatRow, readInputHeader } from "./csv";
import type { OutputRow, Reducer } from "./switch";

/** Problems with input rows are counted; only the first few are logged. */
const LOGGED_PROBLEMS = 5;
/** Lines read before the samples are handed to the reducer. */
const BATCH_LINES = 65_536;

/**
 * Turns input lines into reduced output text: parses each data line, groups the samples
 * by tag (keeping each tag's order) and pushes each tag's run to the reducer. The first
 * line given is the header.
 */
export class LineReducer {
  private reader: InputReader | null = null;
  private cols: InputColumns | null = null;
  private line = 0;
  problems = 0;

  constructor(
    private readonly reducer: () => Reducer,
    private readonly log: (line: string) => void,
  ) {}

  /** Reads lines (without newlines); returns the output lines they produce. */
  lines(lines: readonly string[]): string {
    let out = "";
    const byTag = new Map<string, { t: number[]; v: number[]; q: number[] }>();
    const reducer = this.reducer();
    for (const text of lines) {
      this.line++;
      if (this.cols === null) {
        this.cols = readInputHeader(text);
        continue;
      }
      if (text.trim() === "") continue;
      this.reader ??= new InputReader(this.cols, reducer.plan.bundle["time-zone"]);
      this.reader.setTimeZone(reducer.plan.bundle["time-zone"]);
      const s = this.reader.read(text);
      if (typeof s === "string") {
        if (++this.problems <= LOGGED_PROBLEMS) this.log(`input line ${this.line}: ${s}; skipped`);
        continue;
      }
      let run = byTag.get(s.tag);
      if (!run) byTag.set(s.tag, (run = { t: [], v: [], q: [] }));
      run.t.push(s.t);
      run.v.push(s.v);
      run.q.push(s.q);
    }
    for (const [tag, run] of byTag) {
      out += rowsText(reducer.push(tag, { t: Float64Array.from(run.t), v: Float64Array.from(run.v), q: Uint8Array.from(run.q) }));
    }
    return out;
  }

  /** Starts again at a header (the input file was replaced). */
  restart() {
    this.cols = null;
    this.reader = null;
    this.line = 0;
  }
}

export function rowsText(rows: readonly OutputRow[]): string {
  let s = "";
  for (const r of rows) s += formatRow(r);
  return s;
}

const tmpName = (file: string) => path.join(path.dirname(file), `.${path.basename(file)}.${process.pid}.${randomBytes(4).toString("hex")}.tmp`);

/**
 * One-shot: reduces the whole input file with the reducer and writes the output under a
 * temporary name, renamed into place once complete.
 */
export async function reduceFile(input: string, output: string, reducer: Reducer, log: (line: string) => void): Promise<{ problems: number }> {
  const lr = new LineReducer(() => reducer, log);
  const tmp = tmpName(output);
  const out = fs.openSync(tmp, "wx", 0o644);
  try {
    fs.writeSync(out, `${OUTPUT_HEADER}\n`);
    let rest = "";
    let batch: string[] = [];
    let empty = true;
    for await (const piece of fs.createReadStream(input, { encoding: "utf8", highWaterMark: 1 << 20 })) {
      empty = false;
      const lines = (rest + (piece as string)).split("\n");
      rest = lines.pop()!;
      batch.push(...lines);
      if (batch.length >= BATCH_LINES) {
        fs.writeSync(out, lr.lines(batch));
        batch = [];
      }
    }
    if (empty) throw new Error(`${input} is empty: it needs the header tag,time,value[,quality]`);
    if (rest !== "") batch.push(rest);
    fs.writeSync(out, lr.lines(batch) + rowsText(reducer.finish()));
    fs.fsyncSync(out);
    fs.closeSync(out);
    fs.renameSync(tmp, output);
  } catch (e) {
    try {
      fs.closeSync(out);
    } catch {
      // already closed
    }
    fs.rmSync(tmp, { force: true });
    throw e;
  }
  return { problems: lr.problems };
}

/**
 * Watch: follows a growing input file (like `tail -f`): each `read` returns the complete
 * lines appended since the last one; a line without its newline waits. A file that
 * shrank was replaced, and is read again from its start.
 */
export class Tail {
  private offset = 0;

  constructor(private readonly file: string) {}

  read(): { lines: string[]; restarted: boolean } {
    let size: number;
    try {
      size = fs.statSync(this.file).size;
    } catch (e) {
      if ((e as NodeJS.ErrnoException).code === "ENOENT") return { lines: [], restarted: false };
      throw e;
    }
    let restarted = false;
    if (size < this.offset) {
      this.offset = 0;
      restarted = true;
    }
    if (size === this.offset) return { lines: [], restarted };
    const buf = Buffer.alloc(size - this.offset);
    const fd = fs.openSync(this.file, "r");
    let got = 0;
    try {
      got = fs.readSync(fd, buf, 0, buf.length, this.offset);
    } finally {
      fs.closeSync(fd);
    }
    // Only whole lines: what follows the last newline (perhaps half a UTF-8 sequence) waits for the next read.
    const lastNl = buf.lastIndexOf(0x0a, got - 1);
    if (lastNl < 0) return { lines: [], restarted };
    this.offset += lastNl + 1;
    return { lines: buf.subarray(0, lastNl).toString("utf8").split("\n"), restarted };
  }
}

/** Watch: an output file that grows; every change is copied, appended and renamed into place, so readers never see half a write. */
export class GrowingOutput {
  constructor(private readonly file: string) {}

  reset(): void {
    const tmp = tmpName(this.file);
    fs.writeFileSync(tmp, `${OUTPUT_HEADER}\n`, { flag: "wx", mode: 0o644 });
    fs.renameSync(tmp, this.file);
  }

  append(text: string): void {
    if (text === "") return;
    const tmp = tmpName(this.file);
    fs.copyFileSync(this.file, tmp);
    fs.appendFileSync(tmp, text);
    fs.renameSync(tmp, this.file);
  }
}
