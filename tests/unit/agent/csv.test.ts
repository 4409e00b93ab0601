import fs from "node:fs";
import os from "node:os";
import path from "node:path";
import { afterEach, beforeEach, describe, expect, it } from "vitest";
import { InputReader, OUTPUT_HEADER, formatRow, readInputHeader, splitCsvLine } from "@/lib/agent/csv";
import { GrowingOutput, Tail } from "@/lib/agent/io";

// CSV fields: RFC 4180. Times: ISO 8601 (with offset, or local in the site's zone) or epoch ms.
const reader = (header = "tag,time,value,quality", zone = "Europe/London") => new InputReader(readInputHeader(header), zone);

describe("splitCsvLine / readInputHeader", () => {
  it("splits RFC 4180 fields, quotes and doubled quotes included", () => {
    expect(splitCsvLine('a,"b,c","d ""e""",')).toEqual(["a", "b,c", 'd "e"', ""]);
    expect(splitCsvLine('"open')).toBeNull();
  });
  it("finds the columns by name in any order and requires tag, time and value", () => {
    expect(readInputHeader("\uFEFFTime,Tag,Value\r")).toEqual({ tag: 1, time: 0, value: 2, quality: -1 });
    expect(() => readInputHeader("tag,timestamp,value")).toThrow(/time missing/);
  });
});

describe("InputReader", () => {
  it("reads epoch ms and ISO 8601 with Z or an offset to the same instant, quality default 0", () => {
    const r = reader("tag,time,value");
    const at = Date.UTC(2026, 11, 1, 10, 0, 0, 250);
    expect(r.read(`A,${at},1.5`)).toEqual({ tag: "A", t: at, v: 1.5, q: 0 });
    expect(r.read("A,2026-12-01T10:00:00.250Z,1.5")).toEqual({ tag: "A", t: at, v: 1.5, q: 0 });
    expect(r.read("A,2026-12-01T11:00:00.250+01:00,1.5")).toEqual({ tag: "A", t: at, v: 1.5, q: 0 });
  });

  it("reads quality 0/1/2 or words, and any value on a bad sample as NaN", () => {
    const r = reader();
    expect(r.read("A,0,1,1")).toMatchObject({ q: 1 });
    expect(r.read("A,0,1,uncertain")).toMatchObject({ q: 1 });
    expect((r.read("A,0,Comm Fail,2") as { v: number }).v).toBeNaN();
    expect(r.read("A,0,,bad")).toMatchObject({ q: 2 });
  });

  it("says what is wrong with a line instead of throwing", () => {
    const r = reader();
    expect(r.read("A,0,abc,0")).toMatch(/not a number/);
    expect(r.read("A,yesterday,1,0")).toMatch(/neither epoch ms nor ISO 8601/);
    expect(r.read("A,0,1,7")).toMatch(/quality "7"/);
    expect(r.read(",0,1,0")).toBe("no tag");
    expect(r.read("A,0")).toBe("too few fields");
  });

  it("reads local times in the site's zone: a skipped spring time is refused, the repeated autumn hour goes by each tag's row order", () => {
    const r = reader("tag,time,value", "Europe/London");
    // Summer: BST is UTC+1.
    expect(r.read("A,2026-07-01T12:00:00,1")).toMatchObject({ t: Date.UTC(2026, 6, 1, 11) });
    // 2026-03-29 01:30 does not exist in London (clocks go 01:00 GMT → 02:00 BST).
    expect(r.read("A,2026-03-29T01:30:00,1")).toMatch(/does not exist in Europe\/London/);
    // 2026-10-25 01:00–02:00 happens twice: first in BST (UTC+1), then in GMT.
    const seq = ["01:15", "01:45", "01:15", "01:45", "02:15"].map((w) => (r.read(`B,2026-10-25T${w}:00,1`) as { t: number }).t);
    expect(seq).toEqual([Date.UTC(2026, 9, 25, 0, 15), Date.UTC(2026, 9, 25, 0, 45), Date.UTC(2026, 9, 25, 1, 15), Date.UTC(2026, 9, 25, 1, 45), Date.UTC(2026, 9, 25, 2, 15)]);
    // Another tag's rows do not move tag B's reading.
    expect((r.read("C,2026-10-25T01:15:00,1") as { t: number }).t).toBe(Date.UTC(2026, 9, 25, 0, 15));
  });
});

describe("formatRow", () => {
  it("writes ISO UTC times, shortest numbers, an empty value for NaN, and quotes where RFC 4180 needs it", () => {
    expect(OUTPUT_HEADER).toBe("tag,output,time,value,quality");
    expect(formatRow({ tag: "PAST1/TT-101/PV", output: "shape", t: Date.UTC(2026, 11, 1, 10), v: 0.1 + 0.2, q: 0 })).toBe("PAST1/TT-101/PV,shape,2026-12-01T10:00:00.000Z,0.30000000000000004,0\n");
    expect(formatRow({ tag: 'odd,"tag"', output: "", t: 0, v: Number.NaN, q: 2 })).toBe('"odd,""tag""",,1970-01-01T00:00:00.000Z,,2\n');
  });
});

describe("Tail and GrowingOutput (real files)", () => {
  let dir: string;
  beforeEach(() => {
    dir = fs.mkdtempSync(path.join(os.tmpdir(), "agent-io-"));
  });
  afterEach(() => {
    fs.rmSync(dir, { recursive: true, force: true });
  });

  it("returns only complete lines appended since the last read, and starts again when the file shrinks", () => {
    const file = path.join(dir, "in.csv");
    const tail = new Tail(file);
    expect(tail.read()).toEqual({ lines: [], restarted: false }); // not there yet
    fs.writeFileSync(file, "tag,time,value\nA,1,1\nA,2,");
    expect(tail.read().lines).toEqual(["tag,time,value", "A,1,1"]);
    expect(tail.read().lines).toEqual([]);
    fs.appendFileSync(file, "2\nA,3,3\n");
    expect(tail.read().lines).toEqual(["A,2,2", "A,3,3"]);
    fs.writeFileSync(file, "tag,time,value\n");
    expect(tail.read()).toEqual({ lines: ["tag,time,value"], restarted: true });
  });

  it("keeps a split UTF-8 character whole across reads", () => {
    const file = path.join(dir, "in.csv");
    const tail = new Tail(file);
    const line = Buffer.from("TÜRM/TT-1/PV,1,1\n");
    fs.writeFileSync(file, line.subarray(0, 3)); // ends inside "Ü"
    expect(tail.read().lines).toEqual([]);
    fs.appendFileSync(file, line.subarray(3));
    expect(tail.read().lines).toEqual(["TÜRM/TT-1/PV,1,1"]);
  });

  it("replaces the output by rename on every change, so it is never half written, and leaves no temporary files", () => {
    const file = path.join(dir, "out.csv");
    const out = new GrowingOutput(file);
    out.reset();
    const inode = fs.statSync(file).ino;
    out.append("A,,1970-01-01T00:00:00.000Z,1,0\n");
    out.append("");
    expect(fs.readFileSync(file, "utf8")).toBe(`${OUTPUT_HEADER}\nA,,1970-01-01T00:00:00.000Z,1,0\n`);
    expect(fs.statSync(file).ino).not.toBe(inode);
    expect(fs.readdirSync(dir)).toEqual(["out.csv"]);
  });
});
