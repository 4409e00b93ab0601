import { parse } from "yaml";
import { validateBundle } from "@/lib/bundles/validate";
import { readCanonical } from "@/lib/bundles/yaml-in";
import type { StepMethod } from "@/lib/reduction/profile";

type Scalar = string | number | boolean;
/** A step as the bundle carries it: each parameter one value, or a map tag → value. */
export type BundleStep = { method: StepMethod } & Record<string, Scalar | Record<string, Scalar>>;
export type Handling = "pass-through" | "drop";
export type BundleGroup = {
  name: string;
  regulated: boolean;
  handling?: Handling;
  profile?: { name: string; revision: number };
  tags: string[];
  /** Seconds beyond which a time step is a gap: one value, or per tag (absent: no gaps). */
  gap?: number | Record<string, number>;
  outputs?: { name: string; steps: BundleStep[] }[];
};
/** A bundle as schemas/bundle.schema.json describes it (see lib/bundles/render.ts). */
export type AgentBundle = {
  sluice: "bundle/1";
  site: string;
  gateway: string;
  release: number;
  issued: string;
  poll: number;
  key: string;
  "time-zone": string;
  unassigned: { handling: Handling; tags: string[] };
  groups: BundleGroup[];
};

/**
 * Reads bundle text after its signature has been checked: validateBundle (YAML 1.2, the
 * JSON Schema, the rules it cannot state), then the value — directly when the text is in
 * the renderer's form, else through the `yaml` package with the same strictness.
 * Throws with the first problems listed.
 */
export function parseBundle(text: string): AgentBundle {
  const checked = validateBundle(text);
  if (!checked.ok) {
    const problems = checked.problems.slice(0, 3).map((p) => (p.path ? `${p.path}: ${p.message}` : p.message));
    throw new Error(`not a valid bundle: ${problems.join("; ")}`);
  }
  return (readCanonical(text) ?? parse(text, { uniqueKeys: true, strict: true, maxAliasCount: 0 })) as AgentBundle;
}

/** Every tag the bundle names (groups and unassigned). */
export function listedTags(bundle: AgentBundle): Set<string> {
  const out = new Set(bundle.unassigned.tags);
  for (const g of bundle.groups) for (const t of g.tags) out.add(t);
  return out;
}
