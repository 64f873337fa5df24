// The public face of an approval: what an inspector or owner needs to trust a pack, reached by its unguessable
// code, and the check of an uploaded copy against the signed original (hash and signature).
import { createHash } from "node:crypto";
import { Approval } from "../../db/models";
import { verifyPdfSignature } from "./pdf-signature.server";

export interface PublicApproval {
  reference: string;
  version: number;
  state: string;
  outcome: string;
  engineer: { name: string; registrationNumber: string; registrationBody: string };
  signedAt: string;
  drawings: { sheetNumber: string; revisionLabel: string; title: string; sha256: string }[];
  packSha256: string;
  newerVersion: number | null;
}

const CODE = /^[A-Za-z0-9_-]{20,40}$/;

export async function publicApproval(code: string): Promise<PublicApproval | null> {
  if (!CODE.test(code)) return null;
  const a = await Approval.findOne({ where: { verifyCode: code } });
  if (!a) return null;
  const s = a.snapshot as { engineer: PublicApproval["engineer"]; drawings: PublicApproval["drawings"] };
  const newest = (await Approval.max("n", { where: { requestId: a.requestId } })) as number;
  return {
    reference: a.reference,
    version: a.n,
    state: a.state,
    outcome: a.outcome,
    engineer: { name: s.engineer.name, registrationNumber: s.engineer.registrationNumber, registrationBody: s.engineer.registrationBody },
    signedAt: a.signedAt.toISOString(),
    drawings: s.drawings.map(({ sheetNumber, revisionLabel, title, sha256 }) => ({ sheetNumber, revisionLabel, title, sha256 })),
    packSha256: a.packSha256,
    newerVersion: newest > a.n ? newest : null,
  };
}

export type CopyVerdict =
  | { verdict: "original"; detail: string }
  | { verdict: "modified" | "extended" | "other" | "unsigned"; detail: string };

/** Is this file the signed pack of that approval, byte for byte, with an intact signature? */
export function checkCopy(approval: Pick<PublicApproval, "packSha256" | "engineer">, bytes: Buffer): CopyVerdict {
  const sha = createHash("sha256").update(bytes).digest("hex");
  const signature = verifyPdfSignature(bytes);
  if (sha === approval.packSha256 && signature.intact && signature.coversWholeDocument) {
    return { verdict: "original", detail: `This is the signed original: SHA-256 ${sha} matches, and the signature of ${signature.signer?.name ?? "the engineer"} is intact and covers the whole file.` };
  }
  if (!signature.signed) return { verdict: "unsigned", detail: "This file carries no digital signature: it is not the signed pack (a scan or a re-saved copy loses the signature)." };
  if (!signature.intact) return { verdict: "modified", detail: "This file has been modified since it was signed: its content no longer matches the signature." };
  if (!signature.coversWholeDocument) return { verdict: "extended", detail: "Something was added to this file after it was signed: it is not the signed original." };
  return { verdict: "other", detail: `This is a validly signed PDF, but not the pack of this approval (its SHA-256 ${sha.slice(0, 16)}… differs).` };
}
