import { describe, expect, it } from "vitest";
import { calibrate, labelMetres, lengthLabel, metresPerPtAtScale, parseScale, pathLengthPt } from "./measure";

describe("lengths on a sheet", () => {
  it("reads the first ratio of a stated scale", () => {
    expect(parseScale("1:50")).toBe(50);
    expect(parseScale("Scale 1 : 100 @ A1")).toBe(100);
    expect(parseScale("1:20, 1:5")).toBe(20);
    expect(parseScale("NTS")).toBeNull();
    expect(parseScale(null)).toBeNull();
  });

  it("turns points into site metres at 1:50 (72 pt = 25.4 mm on paper = 1.27 m on site)", () => {
    expect(72 * metresPerPtAtScale(50)).toBeCloseTo(1.27, 10);
    expect(lengthLabel([0, 0, 72, 0, 72, 72], metresPerPtAtScale(50))).toBe("2.54 m");
    expect(lengthLabel([0, 0, 72, 0], null)).toBeUndefined();
  });

  it("calibrates from two points a known distance apart, and refuses what cannot work", () => {
    expect(calibrate([0, 0, 300, 400], 5)).toBeCloseTo(0.01, 10);
    expect(calibrate([10, 10, 10, 10], 5)).toBeNull();
    expect(calibrate([0, 0, 100, 0], 0)).toBeNull();
    expect(pathLengthPt([0, 0, 3, 4, 3, 10])).toBe(11);
  });

  it("reads back the metres a label states", () => {
    expect(labelMetres("12.5 m")).toBe(12.5);
    expect(labelMetres("Pipe run 3.40 m total")).toBe(3.4);
    expect(labelMetres(undefined)).toBeNull();
  });
});
