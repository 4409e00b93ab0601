import { describe, expect, it } from "vitest";
import { resolveSteps, type Profile, type ProfileTag } from "@/lib/reduction/profile";
import { convertUnit, unitMeasure, unitsConvert } from "@/lib/units";

// Where the expected values come from (the units library, convert-units 2.3.4, is what
// is under test). Section and table numbers are from memory.
// - °F = °C × 9/5 + 32, so a difference of 1 °C is 1.8 °F: NIST SP 811 (2008), Appendix B
//   (temperature and temperature interval).
// - 1 bar = 100 kPa: NIST SP 811 (2008), Appendix B; 1 mbar = 100 Pa = 1 hPa follows.
// - 1 L = 1 dm³ = 10⁻³ m³ and 1 h = 60 min: SI Brochure, 9th ed. (2019), non-SI units
//   accepted for use with the SI; so 1 m³/h = 1000 L / 60 min = 16.666… L/min.
// - 0 °C = 273.15 K: SI Brochure, 9th ed. (2019), definition of the Celsius temperature.

describe("convertUnit", () => {
  it("converts 10 °C to 50 °F, in any of our spellings", () => {
    expect(convertUnit(10, "°C", "°F")).toBeCloseTo(50, 12);
    expect(convertUnit(10, "degC", "degF")).toBeCloseTo(50, 12);
    expect(convertUnit(10, "C", "F")).toBeCloseTo(50, 12);
    expect(convertUnit(0, " degC ", "K")).toBeCloseTo(273.15, 12);
  });

  it("converts pressure: 250 kPa = 2.5 bar, 1 mbar = 100 Pa", () => {
    expect(convertUnit(250, "kPa", "bar")).toBeCloseTo(2.5, 12);
    expect(convertUnit(1, "bar", "kPa")).toBeCloseTo(100, 12);
    expect(convertUnit(1, "mbar", "Pa")).toBeCloseTo(100, 12);
    expect(convertUnit(1, "MPa", "kPa")).toBeCloseTo(1000, 9);
  });

  it("converts flow: 1 m3/h = 16.667 L/min", () => {
    expect(convertUnit(1, "m3/h", "L/min")).toBeCloseTo(1000 / 60, 12);
    expect(convertUnit(6, "m³/h", "L/s")).toBeCloseTo(6000 / 3600, 12);
  });

  it("returns the value unchanged for one unit, known or not", () => {
    expect(convertUnit(12.5, "%", "%")).toBe(12.5);
    expect(convertUnit(3, "mm/s", " mm/s")).toBe(3);
    expect(convertUnit(3, "degC", "°C")).toBe(3);
    expect(convertUnit(7, "kWh", "kWh")).toBe(7);
  });

  it("refuses °C to kPa, naming both units", () => {
    expect(() => convertUnit(1, "°C", "kPa")).toThrow(/^°C does not convert to kPa/);
    expect(() => convertUnit(1, "°C", "kPa")).toThrow(/temperature and pressure/);
  });

  it("refuses units the library does not know, and matches case", () => {
    expect(() => convertUnit(1, "mm/s", "m/s")).toThrow("mm/s does not convert to m/s: the units library does not know mm/s");
    expect(() => convertUnit(1, "KPA", "kPa")).toThrow(/does not know KPA/);
    expect(() => convertUnit(1, "%", "ppm")).toThrow(/does not know %/);
  });

  it("tells whether two units convert", () => {
    expect(unitsConvert("degC", "°F")).toBe(true);
    expect(unitsConvert("kWh", "MWh")).toBe(true);
    expect(unitsConvert("rpm", "Hz")).toBe(true);
    expect(unitsConvert("%", "%")).toBe(true);
    expect(unitsConvert("degC", "kPa")).toBe(false);
    expect(unitsConvert("state", "degC")).toBe(false);
    expect(unitMeasure("L/min")).toBe("volumeFlowRate");
    expect(unitMeasure("state")).toBeUndefined();
  });
});

describe("resolveSteps with convertUnit", () => {
  const tag: ProfileTag = { name: "PAST1/TT-101/PV", kind: "analog", unit: "degF", euLow: 32, euHigh: 302, samplePeriodMs: 1000 };
  const profile: Profile = {
    name: "Temperature",
    kinds: ["analog"],
    outputs: [{ name: "hot", steps: [{ method: "swinging-door", deviation: { value: 1, unit: "°C" } }, { method: "time-above", window: 60, threshold: { value: 10, unit: "degC" } }] }],
  };

  it("converts a 1 °C width to 1.8 °F and a 10 °C level to 50 °F", () => {
    const [door, above] = resolveSteps(profile, tag, { convert: convertUnit }).outputs[0].steps;
    expect(door).toMatchObject({ method: "swinging-door" });
    expect((door as { deviation: number }).deviation).toBeCloseTo(1.8, 12);
    expect((above as { threshold: number }).threshold).toBeCloseTo(50, 12);
  });

  it("refuses a unit of another measure, naming both", () => {
    expect(() => resolveSteps(profile, { ...tag, unit: "kPa" }, { convert: convertUnit })).toThrow(/°C does not convert to kPa/);
  });
});
