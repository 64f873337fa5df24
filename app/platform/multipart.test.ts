import fc from "fast-check";
import { describe, expect, it } from "vitest";
import { boundaryOf, MultipartError, readMultipart } from "./multipart.server";

const B = "----test-boundary-7MA4YWxkTrZu0gW";
function body(fields: Record<string, string>, file?: { name: string; bytes: Uint8Array }) {
  const parts: Buffer[] = [];
  for (const [k, v] of Object.entries(fields)) parts.push(Buffer.from(`--${B}\r\nContent-Disposition: form-data; name="${k}"\r\n\r\n${v}\r\n`));
  if (file) {
    parts.push(Buffer.from(`--${B}\r\nContent-Disposition: form-data; name="file"; filename="${file.name}"\r\nContent-Type: application/pdf\r\n\r\n`));
    parts.push(Buffer.from(file.bytes), Buffer.from("\r\n"));
  }
  parts.push(Buffer.from(`--${B}--\r\n`));
  return Buffer.concat(parts);
}
async function* chunks(buf: Buffer, cuts: number[]) {
  let at = 0;
  for (const c of [...new Set(cuts.map((n) => n % (buf.length + 1)))].sort((a, b) => a - b)) {
    yield new Uint8Array(buf.subarray(at, c));
    at = c;
  }
  yield new Uint8Array(buf.subarray(at));
}
async function collect(stream: NodeJS.ReadableStream) {
  const out: Buffer[] = [];
  for await (const c of stream) out.push(c as Buffer);
  return Buffer.concat(out);
}

describe("multipart reader", () => {
  it("finds the boundary in the content type", () => {
    expect(boundaryOf(`multipart/form-data; boundary=${B}`)).toBe(B);
    expect(boundaryOf(`multipart/form-data; boundary="${B}"`)).toBe(B);
    expect(boundaryOf("application/json")).toBeNull();
  });

  it("reads fields and streams the file whole, however the body is cut into chunks", async () => {
    await fc.assert(
      fc.asyncProperty(fc.uint8Array({ minLength: 0, maxLength: 3000 }), fc.array(fc.nat(), { maxLength: 12 }), async (bytes, cuts) => {
        // Bytes that look like the boundary's start must not end the file early.
        const file = Buffer.concat([Buffer.from(`\r\n--${B.slice(0, 10)}`), Buffer.from(bytes)]);
        const raw = body({ sheetNumber: "A-101", title: "Ground floor, “plan”" }, { name: "a.pdf", bytes: file });
        let got: Buffer | null = null;
        let seenFields: Record<string, string> = {};
        const fields = await readMultipart(chunks(raw, cuts), B, {
          async onFile(part, f) {
            seenFields = f;
            expect(part.filename).toBe("a.pdf");
            got = await collect(part.stream);
          },
        });
        expect(fields).toEqual({ sheetNumber: "A-101", title: "Ground floor, “plan”" });
        expect(seenFields.sheetNumber).toBe("A-101");
        expect(got!.equals(file)).toBe(true);
      }),
      { numRuns: 150 },
    );
  });

  it("refuses a body that ends early, a second file, and an over-long field", async () => {
    const raw = body({ a: "1" }, { name: "a.pdf", bytes: new Uint8Array(100) });
    await expect(readMultipart(chunks(raw.subarray(0, raw.length - 20), []), B, { onFile: async (p) => void (await collect(p.stream)) })).rejects.toBeInstanceOf(MultipartError);
    const two = Buffer.concat([body({}, { name: "a.pdf", bytes: new Uint8Array(5) }).subarray(0, -`--${B}--\r\n`.length), body({}, { name: "b.pdf", bytes: new Uint8Array(5) })]);
    await expect(readMultipart(chunks(two, []), B, { onFile: async (p) => void (await collect(p.stream)) })).rejects.toThrow("one file");
    await expect(readMultipart(chunks(body({ a: "x".repeat(100) }), []), B, { maxFieldBytes: 10, onFile: async () => {} })).rejects.toThrow("too long");
  });

  it("passes on what the file handler throws, and stops reading", async () => {
    const raw = body({}, { name: "a.pdf", bytes: new Uint8Array(5000) });
    await expect(
      readMultipart(chunks(raw, [100, 200, 300]), B, {
        async onFile() {
          throw new Error("refused by handler");
        },
      }),
    ).rejects.toThrow("refused by handler");
  });
});
