import fc from "fast-check";
import { describe, expect, it } from "vitest";
import { CAUTION } from "~/engineering";
import { compare, flatten } from "./compare";
import { EXAMPLES } from "./examples";
import { formatNumber } from "./format";
import { issuesByPath } from "./issues";
import { KIND_DEFINITIONS, KINDS, runCalculation } from "./kinds";
import { getIn, parseNumber, setIn } from "./paths";

describe("calculator kinds", () => {
  it.each(KINDS)("%s runs its example, with figures, method, sources and the caution", (kind) => {
    const r = runCalculation(kind, structuredClone(EXAMPLES[kind]));
    expect(r.ok).toBe(true);
    if (!r.ok) return;
    expect(r.output.caution).toBe(CAUTION);
    const def = KIND_DEFINITIONS[kind];
    expect(def.figures(r.input, r.output).length).toBeGreaterThan(0);
    expect(def.method(r.input, r.output).join(" ").length).toBeGreaterThan(20);
    expect(def.sources(r.input, r.output).length).toBeGreaterThan(0);
    expect(JSON.parse(JSON.stringify(r.output))).toEqual(r.output);
  });

  it("turns engine network errors into issues under network", () => {
    const input = structuredClone(EXAMPLES.balance);
    input.network.outlets[0].nodeId = "nowhere";
    const r = runCalculation("balance", input);
    expect(r.ok).toBe(false);
    if (r.ok) return;
    expect(r.issues[0].path).toEqual(["network", "outlets", 0, "nodeId"]);
  });

  it("names NaN typed into a field as not a number", () => {
    const r = runCalculation("segment", { ...EXAMPLES.segment, lengthM: Number.NaN });
    expect(r.ok).toBe(false);
    if (!r.ok) expect(issuesByPath(r.issues).get("lengthM")).toEqual(["Length must be a number"]);
  });

  it("never throws on arbitrary JSON: it answers with a result or with issues", () => {
    fc.assert(
      fc.property(fc.constantFrom(...KINDS), fc.jsonValue(), (kind, value) => {
        const r = runCalculation(kind, value);
        expect(typeof r.ok).toBe("boolean");
      }),
      { numRuns: 300 },
    );
  });
});

describe("paths", () => {
  it("reads and writes by path without mutating, and blank removes a field", () => {
    const a = { x: { y: [1, { z: 2 }] } };
    const b = setIn(a, ["x", "y", 1, "z"], 3);
    expect(getIn(b, ["x", "y", 1, "z"])).toBe(3);
    expect(getIn(a, ["x", "y", 1, "z"])).toBe(2);
    expect(setIn({ p: 1, q: 2 }, ["q"], undefined)).toEqual({ p: 1 });
    expect(parseNumber(" 2,5 ")).toBe(2.5);
    expect(parseNumber("")).toBeUndefined();
    expect(parseNumber("abc")).toBeNaN();
  });
});

describe("compare", () => {
  it("keys list items by id, so a reordered network is not a difference", () => {
    const a = structuredClone(EXAMPLES.balance);
    const b = structuredClone(EXAMPLES.balance);
    b.network.segments.reverse();
    expect([...flatten(a)].sort()).toEqual([...flatten(b)].sort());
  });

  it("marks changed inputs and figures, and added and removed rows", () => {
    const run = (input: unknown) => {
      const r = runCalculation("deadleg", input);
      if (!r.ok) throw new Error("bad");
      return { kind: "deadleg" as const, inputs: r.input, outputs: r.output };
    };
    const a = run(EXAMPLES.deadleg);
    const changed = structuredClone(EXAMPLES.deadleg);
    changed.deadLeg.legs[0].lengthM = 14;
    changed.deadLeg.legs.push({ internalDiameterMm: 10, lengthM: 1 });
    const c = compare(a, run(changed));
    const row = (k: string) => c.inputs.find((r) => r.key === k)!;
    expect(row("deadLeg.legs[1].lengthM")).toMatchObject({ state: "changed", a: "6", b: "14" });
    expect(row("deadLeg.legs[3].lengthM")).toMatchObject({ state: "added", a: null });
    expect(row("delivery.thermostatC").state).toBe("same");
    expect(c.figures.find((r) => r.key === "seconds")!.state).toBe("changed");
    expect(c.changedInputs).toBe(3);
  });

  it("refuses two kinds", () => {
    const x = runCalculation("vacuum", EXAMPLES.vacuum);
    const y = runCalculation("valves", EXAMPLES.valves);
    if (!x.ok || !y.ok) throw new Error("bad");
    expect(() => compare({ kind: "vacuum", inputs: x.input, outputs: x.output }, { kind: "valves", inputs: y.input, outputs: y.output })).toThrow(/same kind/);
  });
});

describe("format", () => {
  it("groups thousands, uses a real minus sign, never shows −0", () => {
    expect(formatNumber(12345.678, 1)).toBe("12 345.7");
    expect(formatNumber(-2.5, 1)).toBe("−2.5");
    expect(formatNumber(-0.0001, 1)).toBe("0.0");
  });
});
