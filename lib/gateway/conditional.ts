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

/**
 * The strong ETag of a bundle: its quoted SHA-256 hex. Bundles are always sent with the
 * identity coding: Next.js 16 drops a route handler's Content-Encoding header, so a gzip
 * body could not be labelled. A proxy that compresses in front of Sluice must give the
 * compressed representation another ETag (RFC 9110 §8.8.3; a weak one is enough, since
 * If-None-Match uses the weak comparison).
 */
export function bundleEtag(digest: string): string {
  return `"${digest}"`;
}
