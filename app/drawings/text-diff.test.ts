import { describe, expect, it } from "vitest";
import { diffText, normaliseWhitespace, pageTextInOrder } from "./text-diff";

describe("text diff", () => {
  it("ignores differences in spacing", () => {
    expect(normaliseWhitespace("  Hot   water\n\tsupply ")).toBe("Hot water supply");
    const d = diffText("Hot  water supply", "Hot water\nsupply");
    expect(d.addedWords).toEqual([]);
    expect(d.removedWords).toEqual([]);
  });

  it("marks words added and removed", () => {
    const d = diffText("Supply DN22 to geyser", "Supply DN28 insulated to geyser");
    expect(d.removedWords).toEqual(["DN22"]);
    expect(d.addedWords).toEqual(["DN28", "insulated"]);
    expect(d.parts.map((p) => p.value).join("")).toContain("geyser");
  });

  it("reads runs line by line, left to right", () => {
    const runs = [
      { s: "second", x: 10, y: 50, w: 40, h: 10 },
      { s: "world", x: 60, y: 10.5, w: 30, h: 10 },
      { s: "hello", x: 10, y: 10, w: 30, h: 10 },
    ];
    expect(pageTextInOrder(runs)).toBe("hello world second");
    expect(pageTextInOrder(null)).toBe("");
  });
});
