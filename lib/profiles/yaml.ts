import { Document, LineCounter, isMap, isNode, isScalar, isSeq, parseAllDocuments, parseDocument } from "yaml";
import { METHODS } from "@/lib/reduction/methods";
import type { Magnitude, Profile, Step } from "@/lib/reduction/profile";
import { documentProblems } from "./document";
import { type PathSegment, formatPath } from "./problems";

/** The header of our profile file: `sluice: profile/1`. */
export const PROFILE_FILE_FORMAT = "profile/1";
/** Larger files are refused before parsing. */
export const PROFILE_FILE_MAX_BYTES = 256 * 1024;

/** A problem of an imported file: the field's path (as checkProfileDocument names it; "" for the file) and, when known, its line (1-based). */
export type YamlProblem = { path: string; line?: number; message: string };
export type ProfileFromYaml = { ok: true; profile: Profile } | { ok: false; problems: YamlProblem[] };
export type ProfilesFromYaml = { ok: true; profiles: Profile[] } | { ok: false; problems: (YamlProblem & { document: number })[] };
export type ProfileFileMeta = { revision?: number; exported?: string };

const STRINGIFY = { lineWidth: 120, minContentWidth: 40 } as const;
const PARSE = { prettyErrors: false, uniqueKeys: true, strict: true } as const;
const MAX_ALIASES = 100;

/**
 * A profile as our YAML file: `sluice: profile/1`, the informational `revision` and
 * `exported` when given, then name, description, kinds and outputs, each step a flow map
 * with `method` first and its parameters in METHODS order. The same profile always gives
 * the same bytes, so exports diff cleanly.
 */
export function profileToYaml(profile: Profile, meta: ProfileFileMeta = {}): string {
  const doc = new Document({
    sluice: PROFILE_FILE_FORMAT,
    ...(meta.revision !== undefined ? { revision: meta.revision } : {}),
    ...(meta.exported !== undefined ? { exported: meta.exported } : {}),
    name: profile.name,
    ...(profile.description !== undefined ? { description: profile.description } : {}),
    kinds: [...profile.kinds],
    outputs: profile.outputs.map((o) => ({ name: o.name, steps: o.steps.map(orderedStep) })),
  });
  const kinds = doc.get("kinds", true);
  if (isSeq(kinds)) kinds.flow = true;
  const outputs = doc.get("outputs", true);
  for (const output of isSeq(outputs) ? outputs.items : []) {
    const steps = isMap(output) ? output.get("steps", true) : undefined;
    for (const step of isSeq(steps) ? steps.items : []) if (isMap(step)) step.flow = true;
  }
  return doc.toString(STRINGIFY);
}

/** Several profiles as one file of `---`-separated documents. */
export function profilesToYaml(profiles: readonly Profile[], meta: ProfileFileMeta = {}): string {
  return profiles.map((p) => profileToYaml(p, meta)).join("---\n");
}

/**
 * Reads one profile from our YAML file (at most 256 KB): YAML syntax errors with their
 * line, a missing or unknown `sluice:` header, then every problem of the document
 * (checkProfileDocument) at its path and line. `revision` and `exported` are ignored.
 */
export function profileFromYaml(text: string): ProfileFromYaml {
  const tooLarge = sizeProblem(text);
  if (tooLarge) return { ok: false, problems: [tooLarge] };
  const lines = new LineCounter();
  const doc = parseDocument(text, { ...PARSE, lineCounter: lines });
  if (doc.errors.some((e) => e.code === "MULTIPLE_DOCS")) {
    return { ok: false, problems: [{ path: "", message: "The file holds more than one profile; import them as a multi-profile file." }] };
  }
  return readDocument(doc, lines);
}

/** Reads every profile of a file of `---`-separated documents; problems name their document (0-based). */
export function profilesFromYaml(text: string): ProfilesFromYaml {
  const tooLarge = sizeProblem(text);
  if (tooLarge) return { ok: false, problems: [{ ...tooLarge, document: 0 }] };
  const lines = new LineCounter();
  const parsed = parseAllDocuments(text, { ...PARSE, lineCounter: lines });
  const docs = Array.isArray(parsed) ? parsed : [];
  if (docs.length === 0) return { ok: false, problems: [{ document: 0, path: "", message: "The file holds no profile." }] };
  const profiles: Profile[] = [];
  const problems: (YamlProblem & { document: number })[] = [];
  docs.forEach((doc, document) => {
    const read = readDocument(doc, lines);
    if (read.ok) profiles.push(read.profile);
    else problems.push(...read.problems.map((p) => ({ ...p, document })));
  });
  return problems.length > 0 ? { ok: false, problems } : { ok: true, profiles };
}

function sizeProblem(text: string): YamlProblem | undefined {
  const bytes = new TextEncoder().encode(text).length;
  if (bytes <= PROFILE_FILE_MAX_BYTES) return undefined;
  return { path: "", message: `The file is ${Math.ceil(bytes / 1024)} KB; a profile file is at most ${PROFILE_FILE_MAX_BYTES / 1024} KB.` };
}

function readDocument(doc: Document, lines: LineCounter): ProfileFromYaml {
  const lineAt = (offset: number | undefined) => (offset === undefined ? undefined : lines.linePos(offset).line);
  if (doc.errors.length > 0) {
    return { ok: false, problems: doc.errors.map((e) => ({ path: "", line: lineAt(e.pos[0]), message: firstLine(e.message) })) };
  }
  // An unknown tag (!!js/function, !custom) would otherwise be dropped silently and its text kept.
  const unresolved = doc.warnings.filter((w) => w.code === "TAG_RESOLVE_FAILED");
  if (unresolved.length > 0) {
    return { ok: false, problems: unresolved.map((w) => ({ path: "", line: lineAt(w.pos[0]), message: `${firstLine(w.message)}; a profile file uses no tags.` })) };
  }
  let value: unknown;
  try {
    value = doc.toJS({ maxAliasCount: MAX_ALIASES });
  } catch (e) {
    return { ok: false, problems: [{ path: "", message: firstLine((e as Error).message) }] };
  }
  const top = isNode(doc.contents) ? lineAt(doc.contents.range?.[0]) : undefined;
  if (typeof value !== "object" || value === null || Array.isArray(value) || !Object.hasOwn(value, "sluice")) {
    return { ok: false, problems: [{ path: "sluice", line: top, message: `This is not a Sluice profile file: it does not start with "sluice: ${PROFILE_FILE_FORMAT}".` }] };
  }
  const lone = loneSurrogatePath(value);
  if (lone) return { ok: false, problems: [{ path: formatPath(lone), line: lineAt(offsetOf(doc, lone)), message: "The text is not valid Unicode (it holds a lone surrogate such as \\ud800)." }] };
  const { sluice, revision: _revision, exported: _exported, ...document } = value as Record<string, unknown>;
  if (sluice !== PROFILE_FILE_FORMAT) {
    const message = `"sluice: ${String(sluice)}" is not a format this version reads; a profile file says "sluice: ${PROFILE_FILE_FORMAT}".`;
    return { ok: false, problems: [{ path: "sluice", line: lineAt(offsetOf(doc, ["sluice"])), message }] };
  }
  const problems = documentProblems(document);
  if (problems.length === 0) return { ok: true, profile: document as Profile };
  return { ok: false, problems: problems.map((p) => ({ path: formatPath(p.path), line: lineAt(offsetOf(doc, p.path)), message: p.message })) };
}

/** Where the deepest existing node on the path starts (a map entry at its key). */
function offsetOf(doc: Document, path: readonly PathSegment[]): number | undefined {
  let node: unknown = doc.contents;
  let offset = isNode(node) ? node.range?.[0] : undefined;
  for (const seg of path) {
    if (isMap(node)) {
      const pair = node.items.find((p) => String(isScalar(p.key) ? p.key.value : p.key) === String(seg));
      if (pair === undefined) break;
      offset = (isNode(pair.key) ? pair.key.range?.[0] : undefined) ?? offset;
      node = pair.value;
    } else if (isSeq(node) && typeof seg === "number" && seg < node.items.length) {
      node = node.items[seg];
      offset = (isNode(node) ? node.range?.[0] : undefined) ?? offset;
    } else {
      break;
    }
  }
  return offset;
}

/** `method` first, then the parameters in METHODS order, then any others (sorted, for the checker to name). */
function orderedStep(step: Step): Record<string, unknown> {
  const s = step as Record<string, unknown>;
  const known = Object.hasOwn(METHODS, step.method) ? METHODS[step.method].params.map((p) => p.name) : [];
  const keys = ["method", ...known, ...Object.keys(s).filter((k) => k !== "method" && !known.includes(k)).sort()];
  return Object.fromEntries(keys.filter((k) => s[k] !== undefined).map((k) => [k, orderedValue(s[k])]));
}

function orderedValue(v: unknown): unknown {
  if (typeof v !== "object" || v === null || Array.isArray(v)) return v;
  const m = v as Magnitude & Record<string, unknown>;
  const keys = ["value", "unit", "percent"].filter((k) => k in m);
  return Object.fromEntries([...keys, ...Object.keys(m).filter((k) => !keys.includes(k)).sort()].map((k) => [k, m[k]]));
}

function firstLine(message: string): string {
  return message.split("\n")[0];
}

const LONE_SURROGATE = /[\uD800-\uDBFF](?![\uDC00-\uDFFF])|(?<![\uD800-\uDBFF])[\uDC00-\uDFFF]/;

/** Where a key or text holds an unpaired UTF-16 surrogate: YAML can escape one ("\ud800"), but it is no Unicode character. */
function loneSurrogatePath(value: unknown): PathSegment[] | undefined {
  type Node = { v: unknown; key?: PathSegment; up?: Node };
  const pathOf = (node: Node) => {
    const path: PathSegment[] = [];
    for (let n: Node | undefined = node; n?.key !== undefined; n = n.up) path.unshift(n.key);
    return path;
  };
  const stack: Node[] = [{ v: value }];
  while (stack.length > 0) {
    const node = stack.pop()!;
    if (typeof node.v === "string") {
      if (LONE_SURROGATE.test(node.v)) return pathOf(node);
    } else if (node.v !== null && typeof node.v === "object") {
      const entries = Object.entries(node.v);
      for (let i = entries.length - 1; i >= 0; i--) {
        const child: Node = { v: entries[i][1], key: Array.isArray(node.v) ? Number(entries[i][0]) : entries[i][0], up: node };
        if (LONE_SURROGATE.test(entries[i][0])) return pathOf(child);
        stack.push(child);
      }
    }
  }
  return undefined;
}
