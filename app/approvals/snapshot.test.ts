import fc from "fast-check";
import { describe, expect, it } from "vitest";
import { canonicalJson } from "./snapshot";

describe("canonical snapshot JSON", () => {
  it("sorts keys at every level and keeps array order", () => {
    expect(canonicalJson({ b: 1, a: { d: [3, { z: 1, y: 2 }], c: null } })).toBe('{"a":{"c":null,"d":[3,{"y":2,"z":1}]},"b":1}');
  });

  it("is the same for any key order and round-trips as JSON", () => {
    fc.assert(
      fc.property(fc.dictionary(fc.string(), fc.jsonValue()), (obj) => {
        const shuffled = Object.fromEntries(Object.entries(obj).reverse());
        expect(canonicalJson(shuffled)).toBe(canonicalJson(obj));
        expect(JSON.parse(canonicalJson(obj))).toEqual(JSON.parse(JSON.stringify(obj)));
      }),
    );
  });
});
