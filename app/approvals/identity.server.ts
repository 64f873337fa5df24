// An engineer's signing identity: an RSA key and an X.509 certificate naming the engineer and their professional
// registration, issued when the registration is verified. The private key is kept encrypted at rest
// (AES-256-GCM under a key derived from SIGNING_KEY_SECRET) and is decrypted only for the moment of signing.
import { createCipheriv, createDecipheriv, generateKeyPairSync, randomBytes, scryptSync } from "node:crypto";
import forge from "node-forge";

export interface SigningSubject {
  name: string;
  email: string;
  registrationNumber: string;
  registrationBody?: string | null;
}

export interface SigningIdentity {
  certificatePem: string;
  privateKeyPem: string;
}

const VALID_YEARS = 5;

export function issueSigningIdentity(subject: SigningSubject, now = new Date()): SigningIdentity {
  const { privateKey, publicKey } = generateKeyPairSync("rsa", { modulusLength: 2048 });
  const privateKeyPem = privateKey.export({ type: "pkcs8", format: "pem" }).toString();
  const cert = forge.pki.createCertificate();
  cert.publicKey = forge.pki.publicKeyFromPem(publicKey.export({ type: "spki", format: "pem" }).toString());
  // A positive 16-byte serial: the leading nibble is kept below 8.
  cert.serialNumber = "4" + randomBytes(16).toString("hex").slice(1);
  cert.validity.notBefore = new Date(now.getTime() - 60_000);
  cert.validity.notAfter = new Date(now.getTime() + VALID_YEARS * 365 * 86_400_000);
  const attrs = [
    { name: "commonName", value: subject.name },
    { name: "emailAddress", value: subject.email },
    { name: "organizationName", value: "Countersign engineer signature" },
    { name: "organizationalUnitName", value: (subject.registrationBody || "Professional registration").slice(0, 64) },
    { type: "2.5.4.5", value: subject.registrationNumber },
  ];
  cert.setSubject(attrs);
  cert.setIssuer(attrs);
  cert.setExtensions([
    { name: "basicConstraints", cA: false },
    { name: "keyUsage", digitalSignature: true, nonRepudiation: true },
    { name: "subjectKeyIdentifier" },
  ]);
  cert.sign(forge.pki.privateKeyFromPem(privateKey.export({ type: "pkcs1", format: "pem" }).toString()), forge.md.sha256.create());
  return { certificatePem: forge.pki.certificateToPem(cert), privateKeyPem };
}

function keyFrom(secret: string, salt: Buffer) {
  return scryptSync(secret, salt, 32, { N: 2 ** 14, r: 8, p: 1 });
}

export function encryptPrivateKey(pem: string, secret: string): string {
  const salt = randomBytes(16);
  const iv = randomBytes(12);
  const cipher = createCipheriv("aes-256-gcm", keyFrom(secret, salt), iv);
  const body = Buffer.concat([cipher.update(pem, "utf8"), cipher.final()]);
  return ["v1", salt, iv, cipher.getAuthTag(), body].map((p) => (typeof p === "string" ? p : p.toString("base64"))).join(":");
}

export function decryptPrivateKey(stored: string, secret: string): string {
  const [version, salt, iv, tag, body] = stored.split(":");
  if (version !== "v1" || !salt || !iv || !tag || !body) throw new Error("unrecognised key format");
  const decipher = createDecipheriv("aes-256-gcm", keyFrom(secret, Buffer.from(salt, "base64")), Buffer.from(iv, "base64"));
  decipher.setAuthTag(Buffer.from(tag, "base64"));
  return Buffer.concat([decipher.update(Buffer.from(body, "base64")), decipher.final()]).toString("utf8");
}
