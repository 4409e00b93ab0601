/**
 * `If-None-Match` evaluation (RFC 9110 §13.1.2): the field is `*` or a list of entity tags;
 * it matches when it is `*` and a current representation exists, or when any listed tag
 * matches the current one under the weak comparison (§8.8.3.2: the opaque tags are equal,
 * whether either is marked weak or not). A malformed member is skipped; a field that holds
 * no well-formed member matches nothing.
 */
export function ifNoneMatchMatches(field: string | null, currentTag: string): boolean {
  if (field === null) return false;
  const trimmed = field.trim();
  if (trimmed === "*") return true;
  const current = opaque(currentTag);
  if (current === null) return false;
  for (const tag of parseEntityTags(trimmed)) if (tag.opaque === current) return true;
  return false;
}

export type EntityTag = { weak: boolean; opaque: string };

/** The well-formed entity tags of a comma-separated list (RFC 9110 §8.8.3: `[W/]"<etagc*>"`). */
export function parseEntityTags(list: string): EntityTag[] {
  const out: EntityTag[] = [];
  // etagc = %x21 / %x23-7E / obs-text: no space, no double quote, no control characters.
  const re = /\s*(W\/)?"([\x21\x23-\x7e\x80-\xff]*)"\s*(?:,|$)/gy;
  let m: RegExpExecArray | null;
  let at = 0;
  while (at < list.length) {
    re.lastIndex = at;
    m = re.exec(list);
    if (!m) {
      // Skip a malformed member up to the next comma.
      const comma = list.indexOf(",", at);
      if (comma < 0) break;
      at = comma + 1;
      continue;
    }
    out.push({ weak: m[1] !== undefined, opaque: m[2] });
    at = re.lastIndex;
  }
  return out;
}

function opaque(tag: string): string | null {
  const m = /^(?:W\/)?"([^"]*)"$/.exec(tag);
  return m ? m[1] : null;
}

/** The strong ETag of a representation: the quoted SHA-256 hex, with `-gzip` for the gzip-coded one. */
export function bundleEtag(digest: string, gzip: boolean): string {
  return gzip ? `"${digest}-gzip"` : `"${digest}"`;
}

/**
 * Whether the client accepts gzip (RFC 9110 §12.5.3): `gzip` or `x-gzip` listed with a
 * q-value above 0, or `*` above 0 without gzip refused.
 */
export function acceptsGzip(field: string | null): boolean {
  if (!field) return false;
  let star: number | null = null;
  for (const part of field.split(",")) {
    const [name, ...params] = part.trim().toLowerCase().split(";");
    const qParam = params.map((p) => p.trim()).find((p) => p.startsWith("q="));
    const q = qParam ? Number(qParam.slice(2)) : 1;
    const weight = Number.isFinite(q) ? q : 0;
    if (name === "gzip" || name === "x-gzip") return weight > 0;
    if (name === "*") star = weight;
  }
  return star !== null && star > 0;
}
