import type { Magnitude, Profile } from "@/lib/reduction/profile";

const show = (v: unknown): string => {
  if (v === undefined) return "(default)";
  if (typeof v === "object" && v !== null) {
    const m = v as Magnitude;
    if ("percent" in m) return `${m.percent} % of range`;
    if ("unit" in m) return `${m.value} ${m.unit}`;
  }
  return String(v);
};

/**
 * Two profile documents compared in words a reviewer reads: kinds, outputs added or
 * removed (what the cloud receives changes), steps added, removed or replaced, and
 * parameter changes with their before → after values.
 */
export function describeProfileDiff(from: Profile, to: Profile): string[] {
  const lines: string[] = [];
  if (from.name !== to.name) lines.push(`Renamed "${from.name}" → "${to.name}"`);
  if ((from.description ?? "") !== (to.description ?? "")) lines.push("Description changed");
  if (from.kinds.join(",") !== to.kinds.join(",")) lines.push(`Kinds ${from.kinds.join(", ")} → ${to.kinds.join(", ")}`);
  const before = new Map(from.outputs.map((o) => [o.name, o]));
  const after = new Map(to.outputs.map((o) => [o.name, o]));
  for (const o of to.outputs) if (!before.has(o.name)) lines.push(`Output "${o.name}" added (the cloud receives a new series)`);
  for (const o of from.outputs) if (!after.has(o.name)) lines.push(`Output "${o.name}" removed (the cloud stops receiving it)`);
  for (const o of to.outputs) {
    const old = before.get(o.name);
    if (!old) continue;
    const n = Math.max(old.steps.length, o.steps.length);
    for (let i = 0; i < n; i++) {
      const a = old.steps[i] as Record<string, unknown> | undefined;
      const b = o.steps[i] as Record<string, unknown> | undefined;
      const where = `Output "${o.name}" step ${i + 1}`;
      if (!a) lines.push(`${where}: ${String(b!.method)} added`);
      else if (!b) lines.push(`${where}: ${String(a.method)} removed`);
      else if (a.method !== b.method) lines.push(`${where}: ${String(a.method)} → ${String(b.method)}`);
      else {
        for (const key of [...new Set([...Object.keys(a), ...Object.keys(b)])]) {
          if (key !== "method" && JSON.stringify(a[key]) !== JSON.stringify(b[key])) {
            lines.push(`${where} (${String(a.method)}): ${key} ${show(a[key])} → ${show(b[key])}`);
          }
        }
      }
    }
  }
  const order = (p: Profile) => p.outputs.map((o) => o.name).filter((n) => before.has(n) && after.has(n));
  if (order(from).join() !== order(to).join()) lines.push("Outputs reordered");
  return lines;
}
