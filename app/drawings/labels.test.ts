import { describe, expect, it } from "vitest";
import { compareLabels, compareSheetNumbers, isValidLabel, labelKind, nextLabel } from "./labels";

describe("revision labels", () => {
  it("accepts the project scheme and nothing else", () => {
    for (const l of ["P1", "p2", "P12", "A", "b", "Z", "AA"]) expect(isValidLabel(l), l).toBe(true);
    for (const l of ["", "P0", "I", "O", "1", "A1", "rev A", "P-1"]) expect(isValidLabel(l), l).toBe(false);
  });

  it("tells preliminary from construction", () => {
    expect(labelKind("P3")).toBe("preliminary");
    expect(labelKind("C")).toBe("construction");
    expect(labelKind("X1")).toBeNull();
  });

  it("counts on from the highest label of the kind, skipping I and O", () => {
    expect(nextLabel([], "preliminary")).toBe("P1");
    expect(nextLabel(["P1", "P2", "A"], "preliminary")).toBe("P3");
    expect(nextLabel(["P1", "P9"], "preliminary")).toBe("P10");
    expect(nextLabel(["P1"], "construction")).toBe("A");
    expect(nextLabel(["A", "H"], "construction")).toBe("J");
    expect(nextLabel(["N"], "construction")).toBe("P");
    expect(nextLabel(["Z"], "construction")).toBe("AA");
  });

  it("orders every preliminary label before every construction label", () => {
    expect(["B", "P10", "A", "P2", "P1"].sort(compareLabels)).toEqual(["P1", "P2", "P10", "A", "B"]);
    expect(compareLabels("Z", "AA")).toBeLessThan(0);
  });
});

describe("compareSheetNumbers", () => {
  it("orders sheet numbers exactly as localeCompare does", () => {
    const sheets = ["PL-0105", "pl-0104", "PL-10", "PL-9", "ME-001", "Ä-1", "A-1", "a-1", "PL 0105", "PL-0105a", "", "ZZ"];
    expect([...sheets].sort(compareSheetNumbers)).toEqual([...sheets].sort((a, b) => a.localeCompare(b)));
  });
});
