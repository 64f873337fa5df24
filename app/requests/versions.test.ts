import { describe, expect, it } from "vitest";
import { diffVersions, type VersionContent } from "./versions";

const v1: VersionContent = {
  n: 1,
  title: "Unit 5 discharge run",
  provision: "discharge",
  clauseRef: "",
  siteConstraint: "Flat roof, no space for a riser.",
  proposal: "Run the 22 mm discharge pipe 6 m to the parapet.",
  measurements: [
    { kind: "lengthM", name: "Discharge run", value: 6, unit: "m" },
    { kind: "bendCount", name: "Bends", value: 3, unit: "bends" },
  ],
};

describe("diffVersions", () => {
  it("word-diffs changed text fields and leaves unchanged ones out", () => {
    const v2 = { ...v1, n: 2, proposal: "Run a 28 mm discharge pipe 6 m to the parapet." };
    const d = diffVersions(v1, v2);
    expect(d.fields.map((f) => f.field)).toEqual(["proposal"]);
    const parts = d.fields[0]!.parts;
    expect(parts.filter((p) => p.removed).map((p) => p.value).join(" ")).toMatch(/\b22\b/);
    expect(parts.filter((p) => p.added).map((p) => p.value).join(" ")).toMatch(/\b28\b/);
    expect(parts.filter((p) => !p.added && !p.removed).map((p) => p.value).join("")).toContain("discharge pipe 6 m to the parapet.");
    expect(d.unchanged).toBe(false);
  });

  it("reports measurements added, removed and changed", () => {
    const v2 = {
      ...v1,
      n: 2,
      measurements: [
        { kind: "lengthM", name: "discharge run", value: 7.5, unit: "m" },
        { kind: "pipeSizeMm", name: "Discharge pipe", value: 28, unit: "mm" },
      ],
    };
    const d = diffVersions(v1, v2);
    expect(d.measurements).toEqual([
      { change: "changed", name: "discharge run", before: "6 m", after: "7.5 m" },
      { change: "added", name: "Discharge pipe", after: "28 mm" },
      { change: "removed", name: "Bends", before: "3 bends" },
    ]);
  });

  it("says when nothing changed", () => {
    expect(diffVersions(v1, { ...v1, n: 2 }).unchanged).toBe(true);
  });
});
