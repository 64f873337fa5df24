// Embedding and checking the digital signature of an approval pack. Signing is the last write: nothing may touch
// the bytes afterwards. The checker is ours (not only poppler's), so the public verification page can report
// "intact and complete", "modified" or "extended after signing" for any uploaded file.
import { createHash, createVerify, X509Certificate } from "node:crypto";
import { pdflibAddPlaceholder } from "@signpdf/placeholder-pdf-lib";
import { SignPdf } from "@signpdf/signpdf";
import { SUBFILTER_ETSI_CADES_DETACHED } from "@signpdf/utils";
import forge from "node-forge";
import { PDFDocument } from "pdf-lib";
import { CadesSigner, CMS_OIDS } from "./cades.server";
import type { SigningIdentity } from "./identity.server";

export interface SignatureMeta {
  reason: string;
  name: string;
  location: string;
  contactInfo: string;
  signingTime?: Date;
}

/** Adds a signature placeholder to the finished document and signs it. Returns the final bytes. */
export async function signPdf(document: PDFDocument, identity: SigningIdentity, meta: SignatureMeta): Promise<Buffer> {
  pdflibAddPlaceholder({
    pdfDoc: document,
    reason: meta.reason,
    name: meta.name,
    location: meta.location,
    contactInfo: meta.contactInfo,
    signingTime: meta.signingTime,
    signatureLength: 12_000,
    subFilter: SUBFILTER_ETSI_CADES_DETACHED,
    appName: "Countersign",
  });
  const unsigned = Buffer.from(await document.save({ useObjectStreams: false }));
  return new SignPdf().sign(unsigned, new CadesSigner(identity.certificatePem, identity.privateKeyPem), meta.signingTime);
}

export interface SignatureReport {
  /** A signature dictionary was found. */
  signed: boolean;
  /** The signed bytes hash to the signed message digest, and the signature verifies with the embedded certificate. */
  intact: boolean;
  /** The signature covers every byte of the file (nothing appended after signing). */
  coversWholeDocument: boolean;
  /** The signing-certificate-v2 attribute names the embedded certificate. */
  certificateBound: boolean;
  signer?: { name: string; email?: string; registrationNumber?: string };
  certificateSha256?: string;
  signingTime?: string;
  problem?: string;
}

const { asn1 } = forge;
const sha256 = (b: Buffer | string) => createHash("sha256").update(typeof b === "string" ? Buffer.from(b, "binary") : b).digest();

function attrValue(attrs: forge.asn1.Asn1[], id: string) {
  for (const a of attrs) {
    const [type, values] = a.value as forge.asn1.Asn1[];
    if (asn1.derToOid(type!.value as string) === id) return (values!.value as forge.asn1.Asn1[])[0];
  }
  return undefined;
}

export function verifyPdfSignature(pdf: Buffer): SignatureReport {
  const text = pdf.toString("latin1");
  const ranges = [...text.matchAll(/\/ByteRange\s*\[\s*(\d+)\s+(\d+)\s+(\d+)\s+(\d+)\s*\]/g)];
  const none = { signed: false, intact: false, coversWholeDocument: false, certificateBound: false };
  if (!ranges.length) return { ...none, problem: "The file carries no digital signature." };
  const [a, b, c, d] = ranges[ranges.length - 1]!.slice(1).map(Number) as [number, number, number, number];
  const report: SignatureReport = { ...none, signed: true, coversWholeDocument: a === 0 && c + d === pdf.length };
  if (a !== 0 || b < 0 || c < a + b || c + d > pdf.length) return { ...report, problem: "The signature's byte range is malformed." };
  try {
    // The placeholder is zero-padded; the DER reader stops at the end of the first element, so the padding is
    // left alone (stripping trailing zeros would also cut a signature that happens to end in a zero byte).
    const hex = pdf.subarray(b + 1, c - 1).toString("latin1");
    const cms = asn1.fromDer(forge.util.hexToBytes(hex), { parseAllBytes: false, strict: false } as never);
    const signedData = ((cms.value as forge.asn1.Asn1[])[1]!.value as forge.asn1.Asn1[])[0]!;
    const parts = signedData.value as forge.asn1.Asn1[];
    const certNode = parts.find((p) => p.tagClass === asn1.Class.CONTEXT_SPECIFIC && p.type === 0)!;
    const certAsn1 = (certNode.value as forge.asn1.Asn1[])[0]!;
    const certDer = asn1.toDer(certAsn1).getBytes();
    const certificate = new X509Certificate(Buffer.from(certDer, "binary"));
    const signerInfos = parts[parts.length - 1]!.value as forge.asn1.Asn1[];
    const info = signerInfos[0]!.value as forge.asn1.Asn1[];
    const signedAttrs = info.find((p) => p.tagClass === asn1.Class.CONTEXT_SPECIFIC && p.type === 0)!;
    const attrs = signedAttrs.value as forge.asn1.Asn1[];
    const signature = Buffer.from(info[info.length - 1]!.value as string, "binary");

    const signedBytes = Buffer.concat([pdf.subarray(a, a + b), pdf.subarray(c, c + d)]);
    const digest = attrValue(attrs, CMS_OIDS.messageDigest)?.value as string | undefined;
    const digestMatches = !!digest && Buffer.from(digest, "binary").equals(sha256(signedBytes));
    const attrsDer = Buffer.from(asn1.toDer(asn1.create(asn1.Class.UNIVERSAL, asn1.Type.SET, true, attrs)).getBytes(), "binary");
    const signatureValid = createVerify("sha256").update(attrsDer).verify(certificate.publicKey, signature);

    const ess = attrValue(attrs, CMS_OIDS.signingCertificateV2);
    const essHash = ess ? ((((ess.value as forge.asn1.Asn1[])[0]!.value as forge.asn1.Asn1[])[0]!.value as forge.asn1.Asn1[])[0]!.value as string) : undefined;
    const certHash = sha256(certDer);
    const time = attrValue(attrs, CMS_OIDS.signingTime);

    const forgeCert = forge.pki.certificateFromAsn1(certAsn1);
    const field = (name: string) => forgeCert.subject.getField(name)?.value as string | undefined;
    return {
      ...report,
      intact: digestMatches && signatureValid,
      certificateBound: !!essHash && Buffer.from(essHash, "binary").equals(certHash),
      signer: { name: field("CN") ?? "unknown", email: field("E"), registrationNumber: forgeCert.subject.getField({ type: "2.5.4.5" })?.value as string | undefined },
      certificateSha256: certHash.toString("hex"),
      signingTime: time ? asn1.utcTimeToDate(time.value as string).toISOString() : undefined,
      problem: !digestMatches ? "The signed content has been modified since signing." : !signatureValid ? "The signature does not verify." : undefined,
    };
  } catch {
    return { ...report, problem: "The signature could not be read." };
  }
}
