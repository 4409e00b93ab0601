import type { MethodInfo } from "./method-info";
import { AGGREGATION_METHODS } from "./methods-aggregation";
import { SELECTION_METHODS } from "./methods-selection";
import type { StepMethod } from "./profile";

export type { MethodInfo, ParamInfo } from "./method-info";

/**
 * Every step method: kinds, role, lossiness, parameters, source and guarantee. The
 * profile editor, the JSON Schema and the bundle renderer read this table; the runner
 * checks documents against it.
 */
export const METHODS: Readonly<Record<StepMethod, MethodInfo>> = { ...SELECTION_METHODS, ...AGGREGATION_METHODS };
