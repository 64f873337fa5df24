import fc from "fast-check";
import { describe, expect, it } from "vitest";
import { IdTable } from "./ids";

describe("IdTable", () => {
  it("numbers ids in the order first added and finds them again", () => {
    const table = new IdTable();
    expect(table.add("S")).toBe(0);
    expect(table.add("M")).toBe(1);
    expect(table.add("S")).toBe(0);
    expect(table.get("M")).toBe(1);
    expect(table.get("nowhere")).toBe(-1);
    expect(table.ids).toEqual(["S", "M"]);
    expect(table.size).toBe(2);
  });

  it("answers -1 for what is not a string", () => {
    const table = new IdTable();
    table.add("1");
    expect(table.get(1)).toBe(-1);
    expect(table.get(undefined)).toBe(-1);
  });

  it("tells apart ids a Map tells apart, however many and whatever the expected size", () => {
    fc.assert(
      fc.property(fc.array(fc.string({ maxLength: 6 }), { maxLength: 300 }), fc.nat(50), (ids, expected) => {
        const table = new IdTable(expected);
        const reference = new Map<string, number>();
        for (const id of ids) {
          if (!reference.has(id)) reference.set(id, reference.size);
          expect(table.add(id)).toBe(reference.get(id));
        }
        expect(table.ids).toEqual([...reference.keys()]);
        for (const id of ids) expect(table.get(id)).toBe(reference.get(id));
        expect(table.get("\u0000absent")).toBe(reference.get("\u0000absent") ?? -1);
      }),
    );
  });
});
