// Reads a form that carries small text fields and at most one small file (evidence, a site photo): the body is
// read as a stream and the file is kept only while under its limit; its type is judged by its first bytes.
import { boundaryOf, MultipartError, readMultipart } from "./multipart.server";

export interface SmallFile {
  filename: string;
  contentType: string;
  bytes: Buffer;
}

export interface SmallUploadOptions {
  maxBytes: number;
  /** The file's real type from its first bytes, or null when it is not acceptable. */
  sniff: (bytes: Buffer) => string | null;
  wrongType: string;
}

export async function readFormWithFile(request: Request, options: SmallUploadOptions): Promise<{ fields: Record<string, string>; file?: SmallFile; problem?: string }> {
  const boundary = boundaryOf(request.headers.get("content-type"));
  if (!boundary || !request.body) {
    const form = await request.formData();
    return { fields: Object.fromEntries([...form].filter(([, v]) => typeof v === "string")) as Record<string, string> };
  }
  let file: SmallFile | undefined;
  let problem: string | undefined;
  try {
    const fields = await readMultipart(request.body, boundary, {
      onFile: async (part) => {
        const chunks: Buffer[] = [];
        let size = 0;
        for await (const chunk of part.stream) {
          size += chunk.length;
          if (size > options.maxBytes) problem = `The file is larger than ${Math.round(options.maxBytes / 1024 / 1024)} MB.`;
          else chunks.push(chunk as Buffer);
        }
        if (problem || size === 0) return;
        const bytes = Buffer.concat(chunks);
        const type = options.sniff(bytes);
        if (!type) problem = options.wrongType;
        else file = { filename: part.filename.slice(0, 200), contentType: type, bytes };
      },
    });
    return { fields, file: problem ? undefined : file, problem };
  } catch (error) {
    if (error instanceof MultipartError) return { fields: {}, problem: error.message };
    throw error;
  }
}

/** PDF, PNG or JPEG. */
export function sniffDocumentOrImage(bytes: Buffer): string | null {
  if (bytes.subarray(0, 5).toString("latin1") === "%PDF-") return "application/pdf";
  return sniffImage(bytes);
}

export function sniffImage(bytes: Buffer): string | null {
  if (bytes.subarray(0, 8).equals(Buffer.from([0x89, 0x50, 0x4e, 0x47, 0x0d, 0x0a, 0x1a, 0x0a]))) return "image/png";
  if (bytes[0] === 0xff && bytes[1] === 0xd8 && bytes[2] === 0xff) return "image/jpeg";
  if (bytes.subarray(0, 4).toString("latin1") === "RIFF" && bytes.subarray(8, 12).toString("latin1") === "WEBP") return "image/webp";
  return null;
}
