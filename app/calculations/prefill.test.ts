import { describe, expect, it } from "vitest";
import { EXAMPLES } from "./examples";
import { runCalculation } from "./kinds";
import { prefillFromMeasurements } from "./prefill";

describe("prefill from site measurements", () => {
  it("puts a discharge run's length, size and bends into the discharge check, which then fails as it should", () => {
    const input = prefillFromMeasurements("discharge", EXAMPLES.discharge, [
      { kind: "lengthM", value: 6 },
      { kind: "bendCount", value: 4 },
      { kind: "staticPressureKpa", value: 550 },
    ]) as typeof EXAMPLES.discharge;
    expect(input.lengthM).toBe(6);
    expect(input.bends).toHaveLength(4);
    const result = runCalculation("discharge", input);
    expect(result.ok).toBe(true);
    // 22 mm over 4 m and more than 3 bends both break the rule (common practice limits).
    expect((result as { output: { ok: boolean } }).output.ok).toBe(false);
  });

  it("sets the supply pressure of a balance network and leaves the example otherwise", () => {
    const input = prefillFromMeasurements("balance", EXAMPLES.balance, [{ kind: "staticPressureKpa", value: 550 }]) as typeof EXAMPLES.balance;
    expect(input.network.supply.staticPressureKpa).toBe(550);
    expect(input.network.segments).toEqual(EXAMPLES.balance.network.segments);
    expect(EXAMPLES.balance.network.supply.staticPressureKpa).toBe(500);
  });
});
