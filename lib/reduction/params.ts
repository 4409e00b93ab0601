/** Parameter checks shared by the methods; each throws a RangeError naming the parameter. */

export function requireFinite(name: string, value: number): number {
  if (typeof value !== "number" || !Number.isFinite(value)) {
    throw new RangeError(`${name} must be a finite number, got ${String(value)}`);
  }
  return value;
}

export function requireNonNegative(name: string, value: number): number {
  requireFinite(name, value);
  if (value < 0) throw new RangeError(`${name} must be ≥ 0, got ${value}`);
  return value;
}

export function requirePositive(name: string, value: number): number {
  requireFinite(name, value);
  if (value <= 0) throw new RangeError(`${name} must be > 0, got ${value}`);
  return value;
}

/** An optional max interval: undefined means none; otherwise a positive number of ms. */
export function optionalInterval(name: string, value: number | undefined): number {
  return value === undefined ? Infinity : requirePositive(name, value);
}

export function requireInteger(name: string, value: number, min: number): number {
  if (!Number.isInteger(value) || value < min) {
    throw new RangeError(`${name} must be an integer ≥ ${min}, got ${String(value)}`);
  }
  return value;
}

/** An optional gap threshold: undefined means no gaps; otherwise a positive number of ms. */
export function optionalGap(value: number | undefined): number {
  return value === undefined ? Infinity : requirePositive("gapMs", value);
}

/** An optional share in (0, 1]. */
export function shareParam(name: string, value: number | undefined, fallback: number): number {
  if (value === undefined) return fallback;
  requireFinite(name, value);
  if (!(value > 0 && value <= 1)) throw new RangeError(`${name} must be within (0, 1], got ${value}`);
  return value;
}
