import convert from "convert-units";

/**
 * Our spellings of engineering units → the units library's (convert-units 2.3.4). Units
 * the library spells as we do (Pa, kPa, MPa, hPa, bar, psi, K, m3/h, m3, kWh, Wh, MWh,
 * m/s, rpm, Hz, W, kW, A, V, …) need no entry. mbar is the library's hPa (1 mbar =
 * 100 Pa = 1 hPa), not a factor of ours.
 */
const ALIASES: Readonly<Record<string, string>> = {
  degC: "C",
  "°C": "C",
  "℃": "C",
  degF: "F",
  "°F": "F",
  "℉": "F",
  mbar: "hPa",
  "m³/h": "m3/h",
  "m³/s": "m3/s",
  "m³": "m3",
  L: "l",
  mL: "ml",
  "L/s": "l/s",
  "L/min": "l/min",
  "L/h": "l/h",
};

type Known = { abbr: string; measure: string };

let library: Map<string, Known> | undefined;

function known(unit: string): Known | undefined {
  if (library === undefined) {
    library = new Map(convert().possibilities().map((abbr) => [abbr, { abbr, measure: convert().describe(abbr).measure }]));
  }
  const u = unit.trim();
  return library.get(ALIASES[u] ?? u);
}

/**
 * Converts a value between engineering units through the units library (DESIGN.md
 * "Assignment": no hand-written factors). Units match case-sensitively after trimming,
 * with our aliases (degC, °C, C; degF, °F, F; L/min; m³/h; mbar …). Equal spellings and
 * aliases of one unit return the value unchanged, so units the library does not know
 * (%, mm/s, state) still match themselves. Throws "°C does not convert to kPa" with the
 * reason when the measures differ or a unit is unknown. For `RunContext.convert`.
 */
export function convertUnit(value: number, from: string, to: string): number {
  const a = from.trim();
  const b = to.trim();
  if (a === b) return value;
  const x = known(a);
  const y = known(b);
  if (x === undefined || y === undefined) {
    const unknown = [x === undefined ? a : undefined, y === undefined ? b : undefined].filter((u) => u !== undefined);
    throw new Error(`${a} does not convert to ${b}: the units library does not know ${unknown.join(" or ")}`);
  }
  if (x.abbr === y.abbr) return value;
  if (x.measure !== y.measure) throw new Error(`${a} does not convert to ${b}: ${x.measure} and ${y.measure} are different measures`);
  return convert(value).from(x.abbr).to(y.abbr);
}

/** Whether {@link convertUnit} converts between the two units (an assignment's unit check). */
export function unitsConvert(from: string, to: string): boolean {
  const a = from.trim();
  const b = to.trim();
  if (a === b) return true;
  const x = known(a);
  const y = known(b);
  return x !== undefined && y !== undefined && x.measure === y.measure;
}

/** The measure a unit belongs to (temperature, pressure, volumeFlowRate, …), or undefined when the library does not know it. */
export function unitMeasure(unit: string): string | undefined {
  return known(unit)?.measure;
}
