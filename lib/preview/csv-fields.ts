/**
 * Hand-written scanners for the fields of a sample CSV: numbers, ISO 8601 timestamps and
 * quality words, read straight from the file's text by character code, without a
 * substring or an object per row. Used by parseSampleCsv.
 */

const POW10 = Array.from({ length: 23 }, (_, k) => 10 ** k); // exact doubles 1 … 1e22
const DAY = 86_400_000;
const DAYS_IN_MONTH = [0, 31, 28, 31, 30, 31, 30, 31, 31, 30, 31, 30, 31];

/**
 * The decimal number in text[i, e) times 10^scale, or NaN when the field is not a number
 * (sign, digits with one decimal point — or comma with `comma` — and an optional
 * exponent). Correctly rounded, like Number(): with at most 15 significant digits and a
 * net power of ten within ±22, the result is one IEEE operation on two exact doubles
 * (W. D. Clinger, "How to read floating point numbers accurately", PLDI 1990, the fast
 * path); otherwise Number() reads the digits with the net exponent.
 */
export function parseDecimal(text: string, i: number, e: number, scale: number, comma: boolean): number {
  let neg = false;
  let c = text.charCodeAt(i);
  if (c === 45 || c === 43) {
    neg = c === 45;
    i++;
  }
  const start = i;
  let m = 0;
  let digits = 0;
  let sig = 0;
  let frac = 0;
  let dot = -1;
  for (; i < e; i++) {
    c = text.charCodeAt(i);
    if (c >= 48 && c <= 57) {
      if (sig > 0 || c !== 48) sig++;
      m = m * 10 + (c - 48);
      digits++;
      if (dot >= 0) frac++;
    } else if (dot < 0 && (c === 46 || (comma && c === 44))) {
      dot = i;
    } else break;
  }
  if (digits === 0) return Number.NaN;
  const mantissaEnd = i;
  let exp = 0;
  if (i < e) {
    if (c !== 101 && c !== 69) return Number.NaN;
    i++;
    let expNeg = false;
    c = text.charCodeAt(i);
    if (c === 45 || c === 43) {
      expNeg = c === 45;
      i++;
    }
    if (i >= e) return Number.NaN;
    for (; i < e; i++) {
      c = text.charCodeAt(i);
      if (c < 48 || c > 57) return Number.NaN;
      if (exp < 100_000) exp = exp * 10 + (c - 48);
    }
    if (expNeg) exp = -exp;
  }
  const e10 = exp - frac + scale;
  let x: number;
  if (sig <= 15 && e10 >= -22 && e10 <= 22) x = e10 >= 0 ? m * POW10[e10] : m / POW10[-e10];
  else {
    const all = dot < 0 ? text.slice(start, mantissaEnd) : text.slice(start, dot) + text.slice(dot + 1, mantissaEnd);
    x = Number(`${all}e${e10}`);
  }
  return neg ? -x : x;
}

/** Quality in text[i, e): 0/1/2 or good/uncertain/bad (any case); −1 when it is neither. */
export function parseQuality(text: string, i: number, e: number): number {
  if (e - i === 1) {
    const c = text.charCodeAt(i) - 48;
    return c >= 0 && c <= 2 ? c : -1;
  }
  const word = text.slice(i, e).toLowerCase();
  return word === "good" ? 0 : word === "uncertain" ? 1 : word === "bad" ? 2 : -1;
}

/** Days from 1970-01-01 to a proleptic Gregorian date (H. Hinnant, "chrono-Compatible Low-Level Date Algorithms", days_from_civil). */
export function daysFromCivil(y: number, m: number, d: number): number {
  y -= m <= 2 ? 1 : 0;
  const era = Math.floor(y / 400);
  const yoe = y - era * 400;
  const doy = Math.floor((153 * (m > 2 ? m - 3 : m + 9) + 2) / 5) + d - 1;
  const doe = yoe * 365 + Math.floor(yoe / 4) - Math.floor(yoe / 100) + doy;
  return era * 146097 + doe - 719468;
}

function two(text: string, i: number): number {
  const a = text.charCodeAt(i) - 48;
  const b = text.charCodeAt(i + 1) - 48;
  return a >= 0 && a <= 9 && b >= 0 && b <= 9 ? a * 10 + b : -1;
}

/** ISO 8601 result codes of {@link parseIso}. */
export const ISO_BAD = 0;
export const ISO_OFFSET = 1;
export const ISO_LOCAL = 2;

/**
 * An ISO 8601 date and time in text[i, e) — ISO 8601-1:2019 extended format, as RFC 3339
 * profiles it: `YYYY-MM-DD`, `T` or a space, `hh:mm[:ss[.fraction]]`, then `Z`, `±hh:mm`,
 * `±hhmm`, `±hh` or nothing. Writes the UTC instant (with an offset) or the wall-clock
 * time as if it were UTC (without) to out[0] in ms, and returns ISO_OFFSET, ISO_LOCAL or
 * ISO_BAD. Fields out of range (month 13, 30 February, 24:00, second 60) are ISO_BAD.
 */
export function parseIso(text: string, i: number, e: number, out: Float64Array): number {
  if (e - i < 16) return ISO_BAD;
  const century = two(text, i);
  const yy = two(text, i + 2);
  const y = century * 100 + yy;
  const mo = two(text, i + 5);
  const d = two(text, i + 8);
  const sepT = text.charCodeAt(i + 10);
  const hh = two(text, i + 11);
  const mi = two(text, i + 14);
  if (century < 0 || yy < 0 || text.charCodeAt(i + 4) !== 45 || text.charCodeAt(i + 7) !== 45 || text.charCodeAt(i + 13) !== 58) return ISO_BAD;
  if (!(sepT === 84 || sepT === 116 || sepT === 32) || mo < 1 || mo > 12 || d < 1 || hh < 0 || hh > 23 || mi < 0 || mi > 59) return ISO_BAD;
  const leap = mo === 2 && (y % 4 === 0 && (y % 100 !== 0 || y % 400 === 0)) ? 1 : 0;
  if (d > DAYS_IN_MONTH[mo] + leap) return ISO_BAD;
  let p = i + 16;
  let ms = 0;
  if (p < e && text.charCodeAt(p) === 58) {
    const s = two(text, p + 1);
    if (s < 0 || s > 59 || p + 3 > e) return ISO_BAD;
    ms = s * 1000;
    p += 3;
    const c = text.charCodeAt(p);
    if (p < e && (c === 46 || c === 44)) {
      p++;
      let f = 0;
      let n = 0;
      for (; p < e; p++) {
        const x = text.charCodeAt(p) - 48;
        if (x < 0 || x > 9) break;
        if (n < 15) {
          f = f * 10 + x;
          n++;
        }
      }
      if (n === 0) return ISO_BAD;
      ms += n <= 3 ? f * POW10[3 - n] : f / POW10[n - 3];
    }
  }
  const wall = daysFromCivil(y, mo, d) * DAY + hh * 3_600_000 + mi * 60_000 + ms;
  if (p === e) {
    out[0] = wall;
    return ISO_LOCAL;
  }
  const c = text.charCodeAt(p);
  if ((c === 90 || c === 122) && p + 1 === e) {
    out[0] = wall;
    return ISO_OFFSET;
  }
  if (c !== 43 && c !== 45) return ISO_BAD;
  const oh = two(text, p + 1);
  let om = 0;
  if (p + 3 === e) om = 0;
  else if (p + 6 === e && text.charCodeAt(p + 3) === 58) om = two(text, p + 4);
  else if (p + 5 === e) om = two(text, p + 3);
  else return ISO_BAD;
  if (oh < 0 || oh > 23 || om < 0 || om > 59) return ISO_BAD;
  const offset = (oh * 60 + om) * 60_000;
  out[0] = c === 43 ? wall - offset : wall + offset;
  return ISO_OFFSET;
}

/**
 * Field bounds of text[s, e) for the first `need` fields into b (start, end pairs),
 * RFC 4180 quoting (a quoted field's bounds are inside the quotes); spaces around an
 * unquoted field are dropped. Returns the number of fields found (at most `need`).
 */
export function splitFields(text: string, s: number, e: number, sep: number, need: number, b: Int32Array): number {
  let k = 0;
  let i = s;
  while (k < need && i <= e) {
    let fs = i;
    while (fs < e && text.charCodeAt(fs) === 32) fs++;
    let n: number;
    if (fs < e && text.charCodeAt(fs) === 34) {
      let j = fs + 1;
      while (j < e && !(text.charCodeAt(j) === 34 && text.charCodeAt(j + 1) !== 34)) j += text.charCodeAt(j) === 34 ? 2 : 1;
      b[2 * k] = fs + 1;
      b[2 * k + 1] = Math.min(j, e);
      n = j + 1;
      while (n < e && text.charCodeAt(n) !== sep) n++;
    } else {
      n = fs;
      while (n < e && text.charCodeAt(n) !== sep) n++;
      let fe = n;
      while (fe > fs && text.charCodeAt(fe - 1) === 32) fe--;
      b[2 * k] = fs;
      b[2 * k + 1] = fe;
    }
    k++;
    i = n + 1;
  }
  return k;
}
