import { describe, expect, it } from "vitest";
import { formToObject, withoutBlankMeasurements } from "./form-data";

describe("formToObject", () => {
  it("nests indexed and dotted names and collects repeated ones", () => {
    const f = new FormData();
    f.append("title", "T");
    f.append("measurements[0].kind", "lengthM");
    f.append("measurements[0].value", "6");
    f.append("measurements[2].kind", "volumeL");
    f.append("principles[0].evidence", "a");
    f.append("principles[0].evidence", "b");
    f.append("restsOn", "x");
    expect(formToObject(f)).toEqual({
      title: "T",
      measurements: [{ kind: "lengthM", value: "6" }, { kind: "volumeL" }],
      principles: [{ evidence: ["a", "b"] }],
      restsOn: "x",
    });
  });
  it("drops measurement rows left blank", () => {
    expect(withoutBlankMeasurements({ measurements: [{ kind: "lengthM", name: "", value: "" }, { kind: "lengthM", value: "2" }] })).toEqual({ measurements: [{ kind: "lengthM", value: "2" }] });
  });
});
