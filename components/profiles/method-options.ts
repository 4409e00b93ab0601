import { METHODS, type MethodInfo } from "@/lib/reduction/methods";
import type { StepMethod } from "@/lib/reduction/profile";
import type { TagKind } from "@/lib/reduction/profile-names";

export type MethodGroup = { role: MethodInfo["role"]; label: string; methods: { method: StepMethod; title: string }[] };

const ROLE_LABELS: Record<MethodInfo["role"], string> = {
  selection: "Selection — keeps some of the samples",
  aggregation: "Aggregation — one new value per window",
};

/** The kinds among `kinds` that `method` does not suit. */
export function unsuitedKinds(method: StepMethod, kinds: readonly TagKind[]): TagKind[] {
  const suits = METHODS[method].kinds;
  return kinds.filter((k) => !suits.includes(k));
}

/** Methods that suit every chosen kind (all of them when no kind is chosen yet), in table order. */
export function methodsForKinds(kinds: readonly TagKind[]): StepMethod[] {
  return (Object.keys(METHODS) as StepMethod[]).filter((m) => unsuitedKinds(m, kinds).length === 0);
}

/** The methods a new step may use, grouped by role for the picker (empty groups left out). */
export function methodGroups(kinds: readonly TagKind[]): MethodGroup[] {
  const offered = methodsForKinds(kinds);
  return (["selection", "aggregation"] as const)
    .map((role) => ({
      role,
      label: ROLE_LABELS[role],
      methods: offered.filter((m) => METHODS[m].role === role).map((m) => ({ method: m, title: METHODS[m].title })),
    }))
    .filter((g) => g.methods.length > 0);
}

/** Why a step no longer fits the profile's kinds, in words; null when it fits. */
export function unsuitedMessage(method: StepMethod, kinds: readonly TagKind[]): string | null {
  const bad = unsuitedKinds(method, kinds);
  if (bad.length === 0) return null;
  const info = METHODS[method];
  return `${info.title} does not suit ${bad.join(" or ")} tags (it suits ${info.kinds.join(", ")}). Remove this step, or untick ${bad.join(" and ")}.`;
}
