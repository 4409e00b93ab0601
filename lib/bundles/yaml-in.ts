import { Flow, type Scalar, type YamlValue, toYaml } from "./yaml-out";

/**
 * Reads a document in exactly the form `toYaml` writes, or answers undefined. The reading
 * is accepted only when writing it back with `toYaml` gives the same text byte for byte,
 * so whatever it returns is what a YAML parser reads from that text whenever `toYaml` is
 * right (the writer's tests check it against the `yaml` package). Any other text — other
 * indentation, comments, anchors, a second document, a duplicate key — is left to the
 * full parser. It exists because the full parser takes most of a release's time.
 */
export function readCanonical(text: string): unknown {
  let value: Map<string, YamlValue>;
  try {
    const lines = text.split("\n");
    if (lines.pop() !== "") return undefined;
    const reader = { lines, at: 0 };
    value = readMap(reader, 0);
    if (reader.at !== lines.length) return undefined;
  } catch (e) {
    if (e === NOT_CANONICAL) return undefined;
    throw e;
  }
  return toYaml(value) === text ? plain(value) : undefined;
}

const NOT_CANONICAL = new Error("not in canonical form");
const fail = (): never => {
  throw NOT_CANONICAL;
};

type Reader = { lines: string[]; at: number };
const NUMBER = /^-?(?:0|[1-9]\d*)(?:\.\d+)?(?:e[+-]\d+)?$/;

const indentOf = (line: string) => {
  let i = 0;
  while (line.charCodeAt(i) === 32) i++;
  return i;
};

/** A scalar token at `pos`: a JSON string or a plain run up to one of `stops`; returns its end. */
function token(line: string, pos: number, stops: string): [Scalar, number] {
  if (line[pos] === '"') {
    let i = pos + 1;
    while (i < line.length && line[i] !== '"') i += line[i] === "\\" ? 2 : 1;
    if (i >= line.length) fail();
    return [JSON.parse(line.slice(pos, i + 1)) as string, i + 1];
  }
  let end = pos;
  while (end < line.length && !stops.includes(line[end])) end++;
  const raw = line.slice(pos, end);
  if (raw === "") fail();
  if (raw === "true" || raw === "false") return [raw === "true", end];
  if (raw === "null") return [null, end];
  return [NUMBER.test(raw) ? Number(raw) : raw, end];
}

function readFlow(line: string, pos: number): Flow {
  const entries: Record<string, Scalar> = {};
  if (line.length === pos + 2 && line.endsWith("{}")) return new Flow(entries);
  if (!line.startsWith("{ ", pos) || !line.endsWith(" }")) fail();
  const body = line.slice(pos + 2, -2);
  for (let i = 0; ; ) {
    const [key, afterKey] = token(body, i, ":");
    if (typeof key !== "string" || /^\d+$/.test(key) || Object.hasOwn(entries, key) || !body.startsWith(": ", afterKey)) fail();
    const [value, end] = token(body, afterKey + 2, ",");
    entries[key as string] = value;
    if (end === body.length) break;
    if (!body.startsWith(", ", end)) fail();
    i = end + 2;
  }
  return new Flow(entries);
}

/** The value after `key:` on a line, or the block below it. */
function readValue(r: Reader, line: string, pos: number, indent: number): YamlValue {
  if (pos === line.length) {
    const next = r.lines[r.at];
    if (next === undefined) fail();
    if (indentOf(next) === indent + 2 && next.startsWith("- ", indent + 2)) return readSeq(r, indent + 2);
    if (indentOf(next) === indent + 2) return readMap(r, indent + 2);
    return fail();
  }
  if (line[pos] !== " ") fail();
  const rest = line.slice(pos + 1);
  if (rest === "[]") return [];
  if (rest[0] === "{") return readFlow(line, pos + 1);
  const [value, end] = token(line, pos + 1, "");
  if (end !== line.length) fail();
  return value;
}

/** Map entries at `indent`; the first may sit after a "- " already consumed (`first`). */
function readMap(r: Reader, indent: number, first?: { line: string; pos: number }): Map<string, YamlValue> {
  const map = new Map<string, YamlValue>();
  let current = first;
  for (;;) {
    if (!current) {
      const line = r.lines[r.at];
      if (line === undefined || indentOf(line) !== indent || line[indent] === "-") break;
      r.at++;
      current = { line, pos: indent };
    }
    const { line, pos } = current;
    const [key, afterKey] = token(line, pos, ":");
    if (typeof key !== "string" || line[afterKey] !== ":") fail();
    map.set(key as string, readValue(r, line, afterKey + 1, indent));
    current = undefined;
  }
  if (map.size === 0) fail();
  return map;
}

function readSeq(r: Reader, indent: number): YamlValue[] {
  const items: YamlValue[] = [];
  for (;;) {
    const line = r.lines[r.at];
    if (line === undefined || indentOf(line) !== indent || !line.startsWith("- ", indent)) break;
    r.at++;
    const pos = indent + 2;
    if (line[pos] === "{") {
      items.push(readFlow(line, pos));
      continue;
    }
    const [value, end] = token(line, pos, line[pos] === '"' ? "" : ":");
    if (end === line.length) items.push(value);
    else if (line[end] === ":") items.push(readMap(r, indent + 2, { line, pos }));
    else fail();
  }
  return items;
}

/** Maps and flow maps as plain objects, for the schema check. */
function plain(v: YamlValue): unknown {
  if (v instanceof Map) return Object.fromEntries([...v].map(([k, x]) => [k, plain(x)]));
  if (v instanceof Flow) return { ...v.entries };
  if (Array.isArray(v)) return v.map(plain);
  return v;
}
