// Reads the verification form: small text fields plus at most one evidence file (PDF, PNG or JPEG, ≤ 10 MB),
// from a multipart body without letting it grow past the limit.
import { boundaryOf, MultipartError, readMultipart } from "../platform/multipart.server";
import { EVIDENCE_MAX_BYTES, evidenceType, type Evidence } from "./verification.server";

export async function readVerificationForm(request: Request): Promise<{ fields: Record<string, string>; evidence?: Evidence; problem?: string }> {
  const boundary = boundaryOf(request.headers.get("content-type"));
  if (!boundary || !request.body) {
    const form = await request.formData();
    return { fields: Object.fromEntries([...form].filter(([, v]) => typeof v === "string")) as Record<string, string> };
  }
  let evidence: Evidence | undefined;
  let problem: string | undefined;
  try {
    const fields = await readMultipart(request.body, boundary, {
      onFile: async (file) => {
        const chunks: Buffer[] = [];
        let size = 0;
        for await (const chunk of file.stream) {
          size += chunk.length;
          if (size > EVIDENCE_MAX_BYTES) {
            problem = "The evidence file is larger than 10 MB.";
            file.stream.resume();
            continue;
          }
          chunks.push(chunk as Buffer);
        }
        if (problem || size === 0) return;
        const bytes = Buffer.concat(chunks);
        const type = evidenceType(bytes);
        if (!type) problem = "Evidence must be a PDF, PNG or JPEG file.";
        else evidence = { filename: file.filename.slice(0, 200), contentType: type, bytes };
      },
    });
    return { fields, evidence: problem ? undefined : evidence, problem };
  } catch (error) {
    if (error instanceof MultipartError) return { fields: {}, problem: error.message };
    throw error;
  }
}
