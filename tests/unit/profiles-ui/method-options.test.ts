import { describe, expect, it } from "vitest";
import { methodGroups, methodsForKinds, unsuitedKinds, unsuitedMessage } from "@/components/profiles/method-options";
import { METHODS } from "@/lib/reduction/methods";

describe("methods offered for kinds", () => {
  it("offers every method for analog alone", () => {
    expect(methodsForKinds(["analog"])).toEqual(Object.keys(METHODS));
  });

  it("offers only methods that suit every chosen kind", () => {
    expect(methodsForKinds(["discrete"]).sort()).toEqual(["change-of-state", "drop", "pass-through", "quality-filter", "time-in-state", "transition-count"]);
    expect(methodsForKinds(["counter"]).sort()).toEqual(["counter-delta", "counter-rate", "drop", "pass-through", "quality-filter"]);
    expect(methodsForKinds(["discrete", "counter"]).sort()).toEqual(["drop", "pass-through", "quality-filter"]);
  });

  it("groups the offer by role, with titles, leaving out empty groups", () => {
    const groups = methodGroups(["discrete", "counter"]);
    expect(groups.map((g) => g.role)).toEqual(["selection"]);
    expect(groups[0].methods).toContainEqual({ method: "pass-through", title: "Pass through" });
    expect(methodGroups(["counter"]).map((g) => g.role)).toEqual(["selection", "aggregation"]);
  });

  it("names the kinds a step no longer suits", () => {
    expect(unsuitedKinds("swinging-door", ["analog", "discrete"])).toEqual(["discrete"]);
    expect(unsuitedMessage("swinging-door", ["analog"])).toBeNull();
    expect(unsuitedMessage("swinging-door", ["discrete"])).toBe("Swinging door does not suit discrete tags (it suits analog). Remove this step, or untick discrete.");
  });
});
