// A streaming multipart/form-data reader for uploads: text fields are collected (small, bounded), a file part is
// handed over as a Node stream while the body is still arriving, so no upload is ever held whole in memory.
// The browser sends the fields first and the file last; one file per request keeps limits and progress simple.
import { PassThrough, type Readable } from "node:stream";

export class MultipartError extends Error {
  constructor(
    message: string,
    readonly status = 400,
  ) {
    super(message);
  }
}

export interface FilePart {
  field: string;
  filename: string;
  contentType: string;
  stream: Readable;
}

export interface MultipartOptions {
  /** Called for the one file part, with the fields read so far; must consume `stream` to the end. */
  onFile: (file: FilePart, fields: Record<string, string>) => Promise<void>;
  maxFieldBytes?: number;
  maxFields?: number;
}

const CRLF = Buffer.from("\r\n");
const HEADER_END = Buffer.from("\r\n\r\n");

export function boundaryOf(contentType: string | null): string | null {
  if (!contentType || !/^multipart\/form-data/i.test(contentType)) return null;
  const match = contentType.match(/boundary=(?:"([^"]+)"|([^;\s]+))/i);
  const boundary = match?.[1] ?? match?.[2];
  return boundary && boundary.length <= 70 ? boundary : null;
}

function parseHeaders(raw: string) {
  const headers: Record<string, string> = {};
  for (const line of raw.split("\r\n")) {
    const colon = line.indexOf(":");
    if (colon > 0) headers[line.slice(0, colon).trim().toLowerCase()] = line.slice(colon + 1).trim();
  }
  const disposition = headers["content-disposition"] ?? "";
  const param = (name: string) => {
    const m = disposition.match(new RegExp(`(?:^|;)\\s*${name}="((?:[^"\\\\]|\\\\.)*)"`, "i")) ?? disposition.match(new RegExp(`(?:^|;)\\s*${name}=([^;]+)`, "i"));
    return m ? m[1]!.replace(/\\(.)/g, "$1") : undefined;
  };
  return { name: param("name"), filename: param("filename"), contentType: headers["content-type"] ?? "application/octet-stream" };
}

/**
 * Reads `body` (a multipart/form-data stream) part by part. Returns the text fields; throws MultipartError on a
 * malformed body or a limit, and re-throws whatever `onFile` throws (the rest of the body is then not read).
 */
export async function readMultipart(
  body: ReadableStream<Uint8Array> | AsyncIterable<Uint8Array>,
  boundary: string,
  options: MultipartOptions,
): Promise<Record<string, string>> {
  const maxFieldBytes = options.maxFieldBytes ?? 64 * 1024;
  const maxFields = options.maxFields ?? 50;
  // A CRLF is put in front so the first delimiter looks like every other one.
  const delimiter = Buffer.from(`\r\n--${boundary}`);
  const fields: Record<string, string> = {};
  let buffer: Buffer = Buffer.from(CRLF);
  let state: "preamble" | "after-delimiter" | "headers" | "field" | "file" | "done" = "preamble";
  let fieldName = "";
  let fieldChunks: Buffer[] = [];
  let fieldSize = 0;
  let fileSeen = false;
  let file: { stream: PassThrough; done: Promise<void> } | null = null;
  let fileFailure: unknown = null;

  // A web stream's own iterator cancels it on an early exit; ours leaves it open so a refusal can be drained.
  const iterator = body instanceof ReadableStream ? streamIterable(body) : body;

  async function writeFile(chunk: Buffer) {
    if (!file || chunk.length === 0) return;
    if (fileFailure) throw fileFailure;
    if (!file.stream.write(chunk)) {
      await new Promise<void>((resolve) => {
        const done = () => {
          file!.stream.off("drain", done);
          file!.stream.off("close", done);
          resolve();
        };
        file!.stream.on("drain", done);
        file!.stream.on("close", done);
      });
    }
    if (fileFailure) throw fileFailure;
  }

  function addField(chunk: Buffer) {
    fieldSize += chunk.length;
    if (fieldSize > maxFieldBytes) throw new MultipartError(`The field "${fieldName}" is too long.`, 413);
    fieldChunks.push(chunk);
  }

  async function endPart() {
    if (state === "field") {
      fields[fieldName] = Buffer.concat(fieldChunks).toString("utf8");
      if (Object.keys(fields).length > maxFields) throw new MultipartError("Too many form fields.", 413);
    } else if (state === "file" && file) {
      file.stream.end();
      await file.done;
      if (fileFailure) throw fileFailure;
      file = null;
    }
  }

  async function process(): Promise<boolean> {
    // Returns true when more input is needed.
    for (;;) {
      if (state === "preamble" || state === "field" || state === "file") {
        const at = buffer.indexOf(delimiter);
        if (at === -1) {
          // Keep a tail that could be the start of a delimiter.
          const keep = Math.min(buffer.length, delimiter.length - 1);
          const out = buffer.subarray(0, buffer.length - keep);
          if (state === "field") addField(Buffer.from(out));
          if (state === "file") await writeFile(Buffer.from(out));
          buffer = buffer.subarray(buffer.length - keep);
          return true;
        }
        const out = buffer.subarray(0, at);
        if (state === "field") addField(Buffer.from(out));
        if (state === "file") await writeFile(Buffer.from(out));
        await endPart();
        buffer = buffer.subarray(at + delimiter.length);
        state = "after-delimiter";
      }
      if (state === "after-delimiter") {
        if (buffer.length < 2) return true;
        if (buffer[0] === 0x2d && buffer[1] === 0x2d) {
          state = "done";
          return false;
        }
        // Transport padding may follow the delimiter before its CRLF.
        const eol = buffer.indexOf(CRLF);
        if (eol === -1) {
          if (buffer.length > 256) throw new MultipartError("The upload was not a valid multipart form.");
          return true;
        }
        buffer = buffer.subarray(eol + 2);
        state = "headers";
      }
      if (state === "headers") {
        const end = buffer.indexOf(HEADER_END);
        if (end === -1) {
          if (buffer.length > 16 * 1024) throw new MultipartError("A form part's headers are too long.");
          return true;
        }
        const headers = parseHeaders(buffer.subarray(0, end).toString("utf8"));
        buffer = buffer.subarray(end + 4);
        if (!headers.name) throw new MultipartError("A form part had no name.");
        if (headers.filename !== undefined) {
          if (fileSeen) throw new MultipartError("Send one file per upload.");
          fileSeen = true;
          const stream = new PassThrough({ highWaterMark: 1024 * 1024 });
          const done = options
            .onFile({ field: headers.name, filename: headers.filename, contentType: headers.contentType, stream }, { ...fields })
            .catch((error) => {
              fileFailure = error;
              stream.destroy();
            });
          file = { stream, done };
          state = "file";
        } else {
          fieldName = headers.name;
          fieldChunks = [];
          fieldSize = 0;
          state = "field";
        }
      }
    }
  }

  try {
    for await (const chunk of iterator) {
      buffer = buffer.length ? Buffer.concat([buffer, chunk]) : Buffer.from(chunk);
      const more = await process();
      if (!more) break;
    }
    if ((state as string) !== "done") throw new MultipartError("The upload ended before it was complete. Check your connection and try again.");
  } catch (error) {
    const f = file as { stream: PassThrough; done: Promise<void> } | null;
    if (f && error !== fileFailure) {
      f.stream.destroy(error instanceof Error ? error : undefined);
      await f.done;
    }
    throw error;
  }
  return fields;
}

async function* streamIterable(stream: ReadableStream<Uint8Array>) {
  const reader = stream.getReader();
  try {
    for (;;) {
      const { done, value } = await reader.read();
      if (done) return;
      yield value;
    }
  } finally {
    // Left open on purpose: the caller may drain the rest so the client gets to read the answer.
    reader.releaseLock();
  }
}

/**
 * Reads and discards what is left of a refused body (up to `maxBytes`), so the client, still sending, gets a
 * clean answer instead of a reset connection. Beyond that the body is cancelled.
 */
export async function drainBody(body: ReadableStream<Uint8Array> | null, maxBytes: number) {
  if (!body || body.locked) return;
  const reader = body.getReader();
  let seen = 0;
  try {
    while (seen <= maxBytes) {
      const { done, value } = await reader.read();
      if (done) return;
      seen += value.length;
    }
    await reader.cancel();
  } catch {
    // The client went away: nothing to answer.
  } finally {
    reader.releaseLock();
  }
}
