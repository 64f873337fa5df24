// The pack: sheets carry their markups and a stamp; the record page carries the decision; the whole is signed.
import { execFileSync } from "node:child_process";
import { mkdtempSync, writeFileSync } from "node:fs";
import { tmpdir } from "node:os";
import path from "node:path";
import { PDFDict, PDFDocument, PDFName } from "pdf-lib";
import { describe, expect, it } from "vitest";
import { issueSigningIdentity } from "./identity.server";
import { buildApprovalPack, type PackInput } from "./pack.server";
import { signPdf, verifyPdfSignature } from "./pdf-signature.server";

async function sheetPdf() {
  const doc = await PDFDocument.create();
  doc.addPage([1683.78, 1190.55]); // A2 landscape is enough for a sheet
  return doc.save();
}

async function input(): Promise<PackInput> {
  return {
    approval: { reference: "DR-007", version: 2, decision: "Approved with conditions", signedAt: new Date("2026-12-01T10:00:00Z"), verifyUrl: "http://127.0.0.1:3000/verify/abc", snapshotSha256: "f".repeat(64) },
    engineer: { name: "Test Engineer", registrationNumber: "TEST-1", registrationBody: "Test board" },
    project: { name: "Test project", siteAddress: "1 Test Street" },
    request: { title: "Discharge run on a flat roof", provision: "Discharge pipe run and size", clauseRef: "x.y", constraint: "Roof is 7 m from the gutter.", proposal: "28 mm from the valve outlet, 6.5 m, two 45° bends." },
    principles: [{ label: "Safe discharge", outcome: "Maintained", reasoning: "28 mm run ≤ 9 m; terminates visibly over the gutter." }],
    conditions: ["Insulate the exposed run.", "Label the termination point."],
    calculations: [{ title: "Discharge check", lines: ["28 mm × 6.5 m: OK"], engineVersion: "1.0.0" }],
    sheets: [{ sheetNumber: "P-101", title: "Roof plumbing", revisionLabel: "B", sha256: "a".repeat(64), pdf: await sheetPdf(), markups: [
      { page: 1, kind: "cloud", points: [100, 100, 400, 260], color: "#9a4a20", strokeWidthPt: 2 },
      { page: 1, kind: "callout", points: [400, 260, 520, 320], text: "Enlarge to 28 mm from the valve outlet", color: "#9a4a20", strokeWidthPt: 1 },
      { page: 1, kind: "measure", points: [100, 500, 700, 500], text: "6.50 m", color: "#2d4a6b", strokeWidthPt: 1 },
    ] }],
    caution: "Results support a registered engineer's judgement and defer to local codes.",
  };
}

describe("approval pack", () => {
  it("stamps each sheet, adds the record page, and signs as the last write", async () => {
    const doc = await buildApprovalPack(await input());
    expect(doc.getPageCount()).toBe(2);
    const identity = issueSigningIdentity({ name: "Test Engineer", email: "e@test.example", registrationNumber: "TEST-1" });
    const bytes = await signPdf(doc, identity, { reason: "DR-007 v2", name: "Test Engineer", location: "Countersign", contactInfo: "e@test.example" });
    expect(verifyPdfSignature(bytes)).toMatchObject({ intact: true, coversWholeDocument: true });
    const dir = mkdtempSync(path.join(tmpdir(), "pack-"));
    const file = path.join(dir, "pack.pdf");
    writeFileSync(file, bytes);
    const text = execFileSync("pdftotext", ["-layout", file, "-"], { encoding: "utf8" });
    expect(text).toContain("APPROVED WITH CONDITIONS");
    expect(text).toContain("DR-007 · approval v2");
    expect(text).toContain("Enlarge to 28 mm from the valve outlet");
    expect(text).toContain("6.50 m");
    expect(text).toContain("1. Insulate the exposed run.");
    expect(text).toContain("at most 9 m");
    expect(text).toContain("a".repeat(64));
    expect(execFileSync("pdfsig", [file], { encoding: "utf8" })).toContain("Signature is Valid.");
  });

  it("places one shared stamp on every sheet page, each with its own sheet line, and keeps no stray pages", async () => {
    const base = await input();
    const twoPages = await PDFDocument.create();
    twoPages.addPage([842, 595]);
    twoPages.addPage([1191, 842]);
    const sheets = [
      { ...base.sheets[0]!, sheetNumber: "P-101", revisionLabel: "B" },
      { ...base.sheets[0]!, sheetNumber: "P-102", revisionLabel: "C", pdf: await twoPages.save(), markups: [] },
      { ...base.sheets[0]!, sheetNumber: "P-103", revisionLabel: "A", pdf: await twoPages.save(), pages: [2], markups: [] },
    ];
    const doc = await buildApprovalPack({ ...base, sheets });
    const identity = issueSigningIdentity({ name: "Test Engineer", email: "e@test.example", registrationNumber: "TEST-1" });
    const bytes = await signPdf(doc, identity, { reason: "DR-007 v2", name: "Test Engineer", location: "Countersign", contactInfo: "e@test.example" });
    expect(verifyPdfSignature(bytes)).toMatchObject({ intact: true, coversWholeDocument: true });

    const file = path.join(mkdtempSync(path.join(tmpdir(), "pack-")), "pack.pdf");
    writeFileSync(file, bytes);
    expect(execFileSync("pdfinfo", [file], { encoding: "utf8" })).toMatch(/Pages:\s+5\n/);
    execFileSync("qpdf", ["--check", file]); // throws on a broken cross-reference or stream
    const sheetLines = ["sheet P-101 rev B", "sheet P-102 rev C", "sheet P-102 rev C", "sheet P-103 rev A"];
    for (const [i, line] of sheetLines.entries()) {
      const text = execFileSync("pdftotext", ["-f", String(i + 1), "-l", String(i + 1), "-layout", file, "-"], { encoding: "utf8" });
      expect(text).toContain("APPROVED WITH CONDITIONS");
      expect(text).toContain("Test Engineer");
      expect(text).toContain(`Signed 2026-12-01 · ${line}`);
      expect(text.match(/sheet P-10\d rev/g)).toHaveLength(1);
    }

    // The stamp is one form, stored once, that every sheet page draws; the page it was drawn on is gone.
    const saved = await PDFDocument.load(bytes);
    const forms = saved.getPages().slice(0, 4).map((page) => {
      const xObjects = page.node.Resources()!.lookup(PDFName.of("XObject"), PDFDict);
      return xObjects.values().map((v) => v.toString());
    });
    expect(forms.every((f) => f.length === 1 && f[0] === forms[0]![0])).toBe(true);
    const pageObjects = saved.context.enumerateIndirectObjects().filter(([, o]) => o instanceof PDFDict && o.get(PDFName.of("Type"))?.toString() === "/Page");
    expect(pageObjects).toHaveLength(5);
  });
});
