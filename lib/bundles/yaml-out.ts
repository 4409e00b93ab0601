/**
 * A small YAML 1.2 writer for the bundle's shape: block maps and sequences indented by two
 * spaces, one-line flow maps where asked (`Flow`), no folding, no anchors, no tags. It
 * writes the same text for the same data, and is an order of magnitude faster than
 * building a `yaml` Document for a bundle of thousands of tags. Strings are plain only when
 * every YAML 1.1 and 1.2 reader takes them as that string (letters first, a conservative
 * character set, no word a reader would turn into a boolean or null); every other string
 * is double-quoted with JSON escapes (valid YAML 1.2), with characters YAML does not print
 * escaped as well. The tests check what it writes against the `yaml` package's reading.
 */

export type Scalar = string | number | boolean | null;
export type YamlValue = Scalar | YamlValue[] | Map<string, YamlValue> | Flow | { [key: string]: YamlValue };

/** An object written as a one-line flow map: `{ method: deadband, deadband: 5 }`. */
export class Flow {
  constructor(readonly entries: Readonly<Record<string, Scalar>>) {}
}

const PLAIN = /^[A-Za-z_/][A-Za-z0-9_./()+-]*(?: [A-Za-z0-9_./()+-]+)*$/;
// Words YAML 1.1 or 1.2 readers resolve to booleans or null when plain.
const RESERVED = /^(?:y|Y|yes|Yes|YES|n|N|no|No|NO|true|True|TRUE|false|False|FALSE|on|On|ON|off|Off|OFF|null|Null|NULL)$/;
// Outside YAML 1.2's printable set (§5.1) beyond the C0 controls JSON escapes, and the
// characters YAML 1.1 reads as line breaks (NEL, LS, PS).
const UNPRINTABLE = /[\u007F-\u009F\u2028\u2029\uFFFE\uFFFF]/g;

export function scalar(v: Scalar): string {
  if (v === null) return "null";
  if (typeof v === "boolean") return v ? "true" : "false";
  if (typeof v === "number") {
    if (!Number.isFinite(v)) throw new Error(`${v} cannot be written to a bundle`);
    return String(v);
  }
  if (typeof v !== "string") throw new Error(`${typeof v} is not a value a bundle can hold`);
  if (PLAIN.test(v) && !RESERVED.test(v)) return v;
  return JSON.stringify(v).replace(UNPRINTABLE, (c) => `\\u${c.charCodeAt(0).toString(16).padStart(4, "0")}`);
}

const isScalar = (v: YamlValue): v is Scalar => v === null || typeof v !== "object";
const entriesOf = (v: Map<string, YamlValue> | { [key: string]: YamlValue }): [string, YamlValue][] =>
  v instanceof Map ? [...v] : Object.entries(v).filter(([, x]) => x !== undefined);

function flow(f: Flow): string {
  const parts = Object.entries(f.entries)
    .filter(([, x]) => x !== undefined)
    .map(([k, x]) => `${scalar(k)}: ${scalar(x)}`);
  return parts.length === 0 ? "{}" : `{ ${parts.join(", ")} }`;
}

/** The document for a top-level map. */
export function toYaml(doc: Map<string, YamlValue> | { [key: string]: YamlValue }): string {
  const out: string[] = [];
  writeMap(out, entriesOf(doc), "", "");
  return out.join("");
}

function writeMap(out: string[], entries: [string, YamlValue][], indent: string, firstLead: string) {
  entries.forEach(([k, v], i) => writeEntry(out, `${i === 0 ? firstLead : indent}${scalar(k)}:`, v, indent));
}

function writeEntry(out: string[], head: string, v: YamlValue, indent: string) {
  if (isScalar(v)) out.push(head, " ", scalar(v), "\n");
  else if (v instanceof Flow) out.push(head, " ", flow(v), "\n");
  else if (Array.isArray(v)) {
    if (v.length === 0) return void out.push(head, " []\n");
    out.push(head, "\n");
    const inner = `${indent}  `;
    for (const item of v) writeItem(out, item, inner);
  } else {
    const entries = entriesOf(v);
    if (entries.length === 0) return void out.push(head, " {}\n");
    out.push(head, "\n");
    writeMap(out, entries, `${indent}  `, `${indent}  `);
  }
}

function writeItem(out: string[], item: YamlValue, indent: string) {
  if (isScalar(item)) out.push(indent, "- ", scalar(item), "\n");
  else if (item instanceof Flow) out.push(indent, "- ", flow(item), "\n");
  else if (Array.isArray(item)) throw new Error("a sequence directly inside a sequence is not part of a bundle");
  else {
    const entries = entriesOf(item);
    if (entries.length === 0) out.push(indent, "- {}\n");
    else writeMap(out, entries, `${indent}  `, `${indent}- `);
  }
}
