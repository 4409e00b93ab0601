/**
 * A profile that cannot run as asked: a bad document, a step that does not suit the
 * tag's kind, a percent parameter on a tag without an engineering range, a unit that
 * does not convert. `output` and `step` (0-based) locate it when it belongs to a step.
 */
export class ProfileError extends Error {
  readonly output: string | undefined;
  readonly step: number | undefined;
  readonly method: string | undefined;
  readonly parameter: string | undefined;

  constructor(problem: string, where: { output?: string; step?: number; method?: string; parameter?: string } = {}) {
    super(`${describe(where)}${problem}`);
    this.name = "ProfileError";
    this.output = where.output;
    this.step = where.step;
    this.method = where.method;
    this.parameter = where.parameter;
  }
}

function describe(where: { output?: string; step?: number; method?: string; parameter?: string }): string {
  const parts: string[] = [];
  if (where.output !== undefined) parts.push(`output "${where.output}"`);
  if (where.step !== undefined) parts.push(`step ${where.step}${where.method ? ` (${where.method})` : ""}`);
  if (where.parameter !== undefined) parts.push(`parameter "${where.parameter}"`);
  return parts.length ? `${parts.join(", ")}: ` : "";
}
