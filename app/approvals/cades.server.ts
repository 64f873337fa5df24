// A CAdES-style detached CMS signature for PDFs (PAdES baseline B): the stock signer omits the ESS
// signing-certificate-v2 attribute, which binds the signer's certificate into what is signed. This signer builds
// the SignedData itself (node-forge for ASN.1, node:crypto for RSA-SHA256) with content type, signing time,
// message digest and signing-certificate-v2 as signed attributes.
import { createHash, createSign } from "node:crypto";
import { Signer } from "@signpdf/utils";
import forge from "node-forge";

const { asn1 } = forge;
const OID = {
  data: "1.2.840.113549.1.7.1",
  signedData: "1.2.840.113549.1.7.2",
  contentType: "1.2.840.113549.1.9.3",
  messageDigest: "1.2.840.113549.1.9.4",
  signingTime: "1.2.840.113549.1.9.5",
  signingCertificateV2: "1.2.840.113549.1.9.16.2.47",
  sha256: "2.16.840.1.101.3.4.2.1",
  rsaEncryption: "1.2.840.113549.1.1.1",
} as const;

const U = asn1.Class.UNIVERSAL;
const T = asn1.Type;
const oid = (id: string) => asn1.create(U, T.OID, false, asn1.oidToDer(id).getBytes());
const seq = (items: forge.asn1.Asn1[]) => asn1.create(U, T.SEQUENCE, true, items);
const set = (items: forge.asn1.Asn1[]) => asn1.create(U, T.SET, true, items);
const octets = (bytes: string) => asn1.create(U, T.OCTETSTRING, false, bytes);
const integer = (hex: string) => asn1.create(U, T.INTEGER, false, forge.util.hexToBytes(hex.length % 2 ? `0${hex}` : hex));
const algorithm = (id: string) => seq([oid(id), asn1.create(U, T.NULL, false, "")]);
const der = (node: forge.asn1.Asn1) => asn1.toDer(node).getBytes();
const sha256 = (binary: string | Buffer) => createHash("sha256").update(typeof binary === "string" ? Buffer.from(binary, "binary") : binary).digest();

function attribute(type: string, value: forge.asn1.Asn1) {
  return seq([oid(type), set([value])]);
}

/** DER requires the members of a SET OF in ascending order of their encodings. */
function derSet(items: forge.asn1.Asn1[]) {
  return items.map((node) => ({ node, bytes: der(node) })).sort((a, b) => (a.bytes < b.bytes ? -1 : a.bytes > b.bytes ? 1 : 0)).map((x) => x.node);
}

export class CadesSigner extends Signer {
  private readonly cert: forge.pki.Certificate;
  constructor(
    private readonly certificatePem: string,
    private readonly privateKeyPem: string,
  ) {
    super();
    this.cert = forge.pki.certificateFromPem(certificatePem);
  }

  async sign(pdfBuffer: Buffer, signingTime: Date = new Date()): Promise<Buffer> {
    const certAsn1 = forge.pki.certificateToAsn1(this.cert);
    const issuer = forge.pki.distinguishedNameToAsn1(this.cert.issuer);
    const serial = integer(this.cert.serialNumber);
    const essCertIdV2 = seq([
      // hashAlgorithm is omitted: its DEFAULT is SHA-256.
      octets(sha256(der(certAsn1)).toString("binary")),
      seq([seq([asn1.create(asn1.Class.CONTEXT_SPECIFIC, 4, true, [issuer])]), integer(this.cert.serialNumber)]),
    ]);
    const attributes = derSet([
      attribute(OID.contentType, oid(OID.data)),
      attribute(OID.signingTime, asn1.create(U, T.UTCTIME, false, asn1.dateToUtcTime(signingTime))),
      attribute(OID.messageDigest, octets(sha256(pdfBuffer).toString("binary"))),
      attribute(OID.signingCertificateV2, seq([seq([essCertIdV2])])),
    ]);
    const signature = createSign("sha256").update(Buffer.from(der(set(attributes)), "binary")).sign(this.privateKeyPem);

    const signerInfo = seq([
      integer("01"),
      seq([issuer, serial]),
      algorithm(OID.sha256),
      asn1.create(asn1.Class.CONTEXT_SPECIFIC, 0, true, attributes),
      algorithm(OID.rsaEncryption),
      octets(signature.toString("binary")),
    ]);
    const signedData = seq([
      integer("01"),
      set([algorithm(OID.sha256)]),
      seq([oid(OID.data)]),
      asn1.create(asn1.Class.CONTEXT_SPECIFIC, 0, true, [certAsn1]),
      set([signerInfo]),
    ]);
    const contentInfo = seq([oid(OID.signedData), asn1.create(asn1.Class.CONTEXT_SPECIFIC, 0, true, [signedData])]);
    return Buffer.from(der(contentInfo), "binary");
  }
}

export const CMS_OIDS = OID;
