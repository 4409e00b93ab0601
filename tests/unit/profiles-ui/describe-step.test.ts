import { describe, expect, it } from "vitest";
import { describeStep, formatWhen, paramLabel, plural } from "@/components/profiles/describe-step";

describe("steps described in words", () => {
  it("gives the method title and each parameter with its unit", () => {
    expect(describeStep({ method: "swinging-door", deviation: { value: 0.5, unit: "degC" }, "max-interval": 600 })).toBe(
      "Swinging door — deviation 0.5 degC, max interval 600 s",
    );
    expect(describeStep({ method: "deadband", deadband: { percent: 2 } })).toBe("Deadband — deadband 2 % of range");
  });

  it("lists parameters in the method's order and leaves out absent ones", () => {
    expect(describeStep({ method: "aggregate", window: 60, fn: "percentile", percentile: 95, calendar: false })).toBe(
      "Windowed aggregate — statistic percentile, window 60 s, local calendar windows no, percentile 95",
    );
  });

  it("gives a method without parameters by its title alone", () => {
    expect(describeStep({ method: "pass-through" })).toBe("Pass through");
  });

  it("labels parameters and formats times and counts", () => {
    expect(paramLabel("reset-share")).toBe("Reset share");
    expect(paramLabel("something-new")).toBe("Something new");
    expect(formatWhen("2026-12-01T10:00:59.123Z")).toBe("2026-12-01 10:00 UTC");
    expect(plural(1, "group")).toBe("1 group");
    expect(plural(1200, "group")).toBe("1,200 groups");
  });
});
