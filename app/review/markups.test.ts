import { describe, expect, it } from "vitest";
import { cloudPath, markupPath, markupShapeSchema, offPage } from "./markups";

describe("markup geometry", () => {
  it("accepts a well-formed shape and names what is wrong with a bad one", () => {
    expect(markupShapeSchema.safeParse({ kind: "cloud", points: [10, 10, 100, 60], color: "#9a4a20", strokeWidthPt: 1.5 }).success).toBe(true);
    const bad = markupShapeSchema.safeParse({ kind: "line", points: [1, 2, 3], color: "red", strokeWidthPt: 0 });
    expect(bad.success).toBe(false);
    const paths = bad.error!.issues.map((i) => i.path.join("."));
    expect(paths).toEqual(expect.arrayContaining(["points", "color", "strokeWidthPt"]));
    expect(markupShapeSchema.safeParse({ kind: "callout", points: [0, 0, 5, 5], color: "#000000", strokeWidthPt: 1 }).success).toBe(false);
  });

  it("detects points off the page", () => {
    expect(offPage({ points: [0, 0, 842, 595] }, { widthPt: 842, heightPt: 595 })).toBeNull();
    expect(offPage({ points: [10, 10, 900, 10] }, { widthPt: 842, heightPt: 595 })).toContain("Point 2");
  });

  it("draws clouds as closed scalloped outlines and every kind as a path", () => {
    const d = cloudPath(0, 0, 120, 60, 12);
    expect(d.startsWith("M 0 0")).toBe(true);
    expect(d.match(/Q/g)!.length).toBe(10 + 5 + 10 + 5);
    expect(d.endsWith("0.00 0.00")).toBe(true);
    for (const kind of ["line", "arrow", "rectangle", "ellipse", "cloud", "measure"] as const) {
      expect(markupPath({ kind, points: [10, 10, 50, 40], color: "#000000", strokeWidthPt: 1 })).toMatch(/^M /);
    }
  });
});
