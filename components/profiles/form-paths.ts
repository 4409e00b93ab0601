import type { FieldErrors, FieldValues } from "react-hook-form";

// Paths of profile fields: the server's issue fields, the form's field names, ids and words.

/**
 * A server issue field as a form field name: `document.outputs.0.steps.1.deviation` and
 * `document.outputs[0].steps[1].deviation` → `outputs.0.steps.1.deviation`; the document
 * itself → "" ; `baseRevision` → null (a conflict, not a field).
 */
export function issueToFormPath(field: string): string | null {
  if (field === "baseRevision") return null;
  const dotted = field
    .replace(/\[(\d+)\]/g, ".$1")
    .replace(/\["([^"]*)"\]/g, ".$1")
    .replace(/^\./, "");
  if (dotted === "document" || dotted === "body" || dotted === "file") return "";
  return dotted.startsWith("document.") ? dotted.slice("document.".length) : dotted;
}

/** A DOM id for a form field name. */
export function fieldId(path: string): string {
  return `pf-${path.replace(/[^A-Za-z0-9]+/g, "-")}`;
}

export type FlatError = { path: string; message: string };

/** Every message in react-hook-form's nested errors, with its field name (array-level errors at the array's name). */
export function flattenErrors(errors: FieldErrors<FieldValues> | Record<string, unknown>, prefix = ""): FlatError[] {
  const out: FlatError[] = [];
  // An array's own error (under "root") comes before its items'.
  const entries = Object.entries(errors).sort(([a], [b]) => Number(b === "root") - Number(a === "root"));
  for (const [key, value] of entries) {
    if (key === "ref" || key === "type" || key === "types" || key === "message" || value === null || typeof value !== "object") continue;
    const path = key === "root" ? prefix : prefix ? `${prefix}.${key}` : key;
    const message = (value as { message?: unknown }).message;
    if (typeof message === "string" && message !== "") out.push({ path, message });
    out.push(...flattenErrors(value as Record<string, unknown>, path));
  }
  return out;
}

/**
 * A field name in words for the list of problems: `outputs.0.steps.1.deviation.value`
 * → `Output "avg", step 2, deviation value`.
 */
export function describeFieldPath(path: string, outputNames: readonly string[] = []): string {
  if (path === "") return "The profile";
  const parts = path.split(".");
  const words: string[] = [];
  for (let i = 0; i < parts.length; i++) {
    const p = parts[i];
    const next = parts[i + 1];
    if (p === "outputs" && next !== undefined && /^\d+$/.test(next)) {
      const n = Number(next);
      words.push(outputNames[n] ? `Output "${outputNames[n]}"` : `Output ${n + 1}`);
      i++;
    } else if (p === "steps" && next !== undefined && /^\d+$/.test(next)) {
      words.push(`step ${Number(next) + 1}`);
      i++;
    } else if (p === "percent") {
      words.push(`${words.pop() ?? ""} (% of range)`.trim());
    } else {
      words.push(p.replace(/-/g, " "));
    }
  }
  const text = words.join(", ").replace(/, (value|unit)\b/g, " $1");
  return text.charAt(0).toUpperCase() + text.slice(1);
}

/** An import problem's message split from its "line N: " prefix. */
export function splitLine(message: string): { line: number | null; message: string } {
  const m = /^line (\d+): (.*)$/s.exec(message);
  return m ? { line: Number(m[1]), message: m[2] } : { line: null, message };
}
