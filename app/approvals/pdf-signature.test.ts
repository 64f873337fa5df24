// Signed packs checked by two independent readers: poppler's pdfsig (read from its output, since it exits 0 on
// failures) and our own verifier — intact, one byte changed, bytes appended.
import { execFileSync } from "node:child_process";
import { mkdtempSync, writeFileSync } from "node:fs";
import { tmpdir } from "node:os";
import path from "node:path";
import { PDFDocument, StandardFonts } from "pdf-lib";
import { beforeAll, describe, expect, it } from "vitest";
import { decryptPrivateKey, encryptPrivateKey, issueSigningIdentity, type SigningIdentity } from "./identity.server";
import { signPdf, verifyPdfSignature } from "./pdf-signature.server";

const dir = mkdtempSync(path.join(tmpdir(), "countersign-sig-"));
function pdfsig(bytes: Buffer) {
  const file = path.join(dir, `${Math.random().toString(36).slice(2)}.pdf`);
  writeFileSync(file, bytes);
  try {
    return execFileSync("pdfsig", [file], { encoding: "utf8" });
  } catch (e) {
    return String((e as { stdout?: string }).stdout ?? e);
  }
}

async function samplePdf() {
  const doc = await PDFDocument.create();
  const font = await doc.embedFont(StandardFonts.Helvetica);
  doc.addPage([595, 842]).drawText("Approval pack test page: discharge pipe 28 mm, 6.5 m", { x: 50, y: 780, size: 12, font });
  return doc;
}

let identity: SigningIdentity;
let signed: Buffer;

beforeAll(async () => {
  identity = issueSigningIdentity({ name: "Test Engineer", email: "engineer@test.example", registrationNumber: "TEST-777", registrationBody: "Test board" });
  signed = await signPdf(await samplePdf(), identity, { reason: "Approval DR-001 v1", name: "Test Engineer", location: "Countersign", contactInfo: "engineer@test.example" });
});

describe("signed approval packs", () => {
  it("are valid and wholly signed according to pdfsig", () => {
    const out = pdfsig(signed);
    expect(out).toContain("Signature is Valid.");
    expect(out).toContain("Total document signed");
    expect(out).toContain("ETSI.CAdES.detached");
  });

  it("are intact, complete and bound to the signer's certificate by our verifier", () => {
    const r = verifyPdfSignature(signed);
    expect(r).toMatchObject({ signed: true, intact: true, coversWholeDocument: true, certificateBound: true });
    expect(r.signer).toEqual({ name: "Test Engineer", email: "engineer@test.example", registrationNumber: "TEST-777" });
  });

  it("report a one-byte change as a digest mismatch (pdfsig) and modified (ours)", () => {
    const tampered = Buffer.from(signed);
    // One digit of the document's creation date: still a well-formed PDF, no longer the signed one.
    const at = tampered.indexOf("/CreationDate (D:") + 17;
    expect(at).toBeGreaterThan(17);
    tampered[at + 3] = tampered[at + 3] === 0x31 ? 0x32 : 0x31;
    expect(pdfsig(tampered)).toContain("Digest Mismatch.");
    const r = verifyPdfSignature(tampered);
    expect(r.intact).toBe(false);
    expect(r.problem).toContain("modified");
  });

  it("report bytes appended after signing as not covering the whole document", () => {
    const extended = Buffer.concat([signed, Buffer.from("\n% appended later\n")]);
    expect(pdfsig(extended)).not.toContain("Total document signed");
    const r = verifyPdfSignature(extended);
    expect(r.coversWholeDocument).toBe(false);
  });

  it("report an unsigned file as unsigned", async () => {
    const r = verifyPdfSignature(Buffer.from(await (await samplePdf()).save()));
    expect(r.signed).toBe(false);
  });

  it("keep the private key encrypted at rest and refuse a wrong secret", () => {
    const stored = encryptPrivateKey(identity.privateKeyPem, "secret-one-two-three");
    expect(stored).not.toContain("PRIVATE KEY");
    expect(decryptPrivateKey(stored, "secret-one-two-three")).toBe(identity.privateKeyPem);
    expect(() => decryptPrivateKey(stored, "another-secret")).toThrow();
  });
});
