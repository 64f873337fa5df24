// The one object-storage client (S3, or the local fake) and the few operations the domains use. Bodies are
// streamed both ways; an unreachable store surfaces as StorageUnavailableError so callers can say so plainly.
import type { Readable } from "node:stream";
import {
  AbortMultipartUploadCommand,
  CompleteMultipartUploadCommand,
  CopyObjectCommand,
  CreateMultipartUploadCommand,
  DeleteObjectCommand,
  GetObjectCommand,
  HeadObjectCommand,
  ListObjectsCommand,
  PutObjectCommand,
  S3Client,
  S3ServiceException,
  UploadPartCommand,
} from "@aws-sdk/client-s3";
import { getSignedUrl } from "@aws-sdk/s3-request-presigner";
import { env } from "./env.server";

export const s3 = new S3Client({
  region: env.S3_REGION,
  endpoint: env.S3_ENDPOINT,
  forcePathStyle: env.S3_FORCE_PATH_STYLE,
  credentials: { accessKeyId: env.S3_ACCESS_KEY_ID, secretAccessKey: env.S3_SECRET_ACCESS_KEY },
  // Without these a streamed PutObject is sent aws-chunked and the fake stores the framing inside the object.
  requestChecksumCalculation: "WHEN_REQUIRED",
  responseChecksumValidation: "WHEN_REQUIRED",
  maxAttempts: 2,
});

const Bucket = env.S3_BUCKET;

export class StorageUnavailableError extends Error {
  constructor(cause: unknown) {
    super("The file store is not answering.", { cause });
    this.name = "StorageUnavailableError";
  }
}

function isNotFound(error: unknown) {
  return error instanceof S3ServiceException && (error.$metadata.httpStatusCode === 404 || error.name === "NotFound" || error.name === "NoSuchKey");
}

function unavailable(error: unknown): never {
  if (error instanceof S3ServiceException && error.$metadata.httpStatusCode && error.$metadata.httpStatusCode < 500) throw error;
  throw new StorageUnavailableError(error);
}

/** Bodies above this, or of a length not known in advance, go up as a multipart upload; smaller ones in one request. */
const MULTIPART_FROM_BYTES = 32 * 1024 * 1024;
/** Parts of a multipart upload, and how many go up at once. */
const PART_BYTES = 8 * 1024 * 1024;
const PARTS_AT_ONCE = 4;

/**
 * Stores `body` under `key`. A stream of unknown length (no `contentLength`) is stored as it arrives, a part at a
 * time. A failed part, or a body that fails, aborts a multipart upload (no parts are left behind); a failed put
 * destroys a streamed body, so whatever feeds it stops too.
 */
export async function putObject(key: string, body: Readable | Uint8Array, options: { contentType: string; contentLength?: number }) {
  try {
    if (options.contentLength === undefined || options.contentLength > MULTIPART_FROM_BYTES) {
      await putInParts(key, body instanceof Uint8Array ? [body] : body, options.contentType);
    } else {
      await s3.send(new PutObjectCommand({ Bucket, Key: key, Body: body, ContentType: options.contentType, ContentLength: options.contentLength }));
    }
  } catch (error) {
    // A body that failed (a limit, a client gone) is no outage of the store.
    if (error instanceof BodyFailure) throw error.reason;
    // A store that failed reads no more of the body, so whatever feeds it must stop too.
    if (!(body instanceof Uint8Array)) body.destroy();
    unavailable(error);
  }
}

/** What the body of a put threw, told apart from what the store answered. */
class BodyFailure {
  constructor(readonly reason: unknown) {}
}

async function* readBody(body: AsyncIterable<Uint8Array> | Iterable<Uint8Array>) {
  try {
    yield* body;
  } catch (error) {
    throw new BodyFailure(error);
  }
}

/**
 * A multipart upload whose parts are filled in a few buffers used over and over: PARTS_AT_ONCE parts in flight and
 * one filling, so a streamed upload of any size holds (PARTS_AT_ONCE + 1) × PART_BYTES at most. (lib-storage's
 * Upload allocates every part afresh; the page faults of that new memory and the collections it forces were the
 * largest cost of a large upload.) A body shorter than one part goes up in one request.
 */
async function putInParts(key: string, body: AsyncIterable<Uint8Array> | Iterable<Uint8Array>, contentType: string) {
  const spare: Buffer[] = [];
  const sending = new Set<Promise<void>>();
  const parts: { PartNumber: number; ETag: string }[] = [];
  let started: Promise<string> | undefined;
  let failure: { error: unknown } | undefined;
  let part: Buffer = Buffer.allocUnsafe(PART_BYTES);
  let filled = 0;
  let partNumber = 0;

  const start = () =>
    (started ??= s3.send(new CreateMultipartUploadCommand({ Bucket, Key: key, ContentType: contentType })).then((out) => out.UploadId!));
  async function send(buffer: Buffer, length: number, n: number) {
    const UploadId = await start();
    const out = await s3.send(new UploadPartCommand({ Bucket, Key: key, UploadId, PartNumber: n, Body: buffer.subarray(0, length), ContentLength: length }));
    parts.push({ PartNumber: n, ETag: out.ETag! });
    spare.push(buffer);
  }
  async function flush() {
    while (sending.size >= PARTS_AT_ONCE) await Promise.race(sending);
    if (failure) throw failure.error;
    const sent = send(part, filled, ++partNumber)
      .catch((error) => void (failure ??= { error }))
      .finally(() => sending.delete(sent));
    sending.add(sent);
    part = spare.pop() ?? Buffer.allocUnsafe(PART_BYTES);
    filled = 0;
  }

  try {
    for await (const chunk of readBody(body)) {
      for (let at = 0; at < chunk.length; ) {
        // A full part is sent only once more bytes come: the last part is never empty.
        if (filled === PART_BYTES) await flush();
        const n = Math.min(chunk.length - at, PART_BYTES - filled);
        part.set(chunk.subarray(at, at + n), filled);
        filled += n;
        at += n;
      }
    }
    if (partNumber === 0) {
      await s3.send(new PutObjectCommand({ Bucket, Key: key, Body: part.subarray(0, filled), ContentType: contentType, ContentLength: filled }));
      return;
    }
    await flush();
    await Promise.all(sending);
    if (failure) throw failure.error;
    parts.sort((a, b) => a.PartNumber - b.PartNumber);
    await s3.send(new CompleteMultipartUploadCommand({ Bucket, Key: key, UploadId: await start(), MultipartUpload: { Parts: parts } }));
  } catch (error) {
    await Promise.allSettled(sending);
    const UploadId = await started?.catch(() => undefined);
    if (UploadId) await s3.send(new AbortMultipartUploadCommand({ Bucket, Key: key, UploadId })).catch(() => {});
    throw error;
  }
}

/** Copies an object inside the bucket, in the store itself (S3 copies up to 5 GB in one request). */
export async function copyObject(from: string, to: string) {
  try {
    await s3.send(new CopyObjectCommand({ Bucket, Key: to, CopySource: encodeURI(`${Bucket}/${from}`) }));
  } catch (error) {
    unavailable(error);
  }
}

export async function objectExists(key: string): Promise<boolean> {
  try {
    await s3.send(new HeadObjectCommand({ Bucket, Key: key }));
    return true;
  } catch (error) {
    if (isNotFound(error)) return false;
    unavailable(error);
  }
}

export async function deleteObject(key: string) {
  try {
    await s3.send(new DeleteObjectCommand({ Bucket, Key: key }));
  } catch (error) {
    if (!isNotFound(error)) unavailable(error);
  }
}

/**
 * Cleans up after a write that failed: removes the objects it put, except those a row refers to by now. Keys are
 * named by content, so a concurrent write of the same bytes may have recorded the very object this one put.
 * When in doubt (the check itself fails) the object stays: an orphan is harmless, a missing object is not.
 */
export async function discardObjects(keys: string[], stillReferenced: (key: string) => Promise<boolean>) {
  for (const key of keys) {
    if (await stillReferenced(key).catch(() => true)) continue;
    await deleteObject(key).catch(() => {});
  }
}

/** Bytes [start, end) of an object, in memory: for the small reads a PDF parser asks for. */
export async function getObjectRange(key: string, start: number, end: number): Promise<Uint8Array> {
  try {
    const out = await s3.send(new GetObjectCommand({ Bucket, Key: key, Range: `bytes=${start}-${end - 1}` }));
    return await out.Body!.transformToByteArray();
  } catch (error) {
    unavailable(error);
  }
}

export async function getObjectBytes(key: string): Promise<Uint8Array | null> {
  try {
    const out = await s3.send(new GetObjectCommand({ Bucket, Key: key }));
    return await out.Body!.transformToByteArray();
  } catch (error) {
    if (isNotFound(error)) return null;
    unavailable(error);
  }
}

export interface ObjectStream {
  status: 200 | 206 | 416;
  body: ReadableStream<Uint8Array> | null;
  contentLength: number;
  contentRange?: string;
  contentType?: string;
  etag?: string;
}

/** An object as a web stream, honouring a single `Range: bytes=a-b` header (what PDF viewers send). */
export async function getObjectStream(key: string, range?: string | null): Promise<ObjectStream | null> {
  const wanted = range && /^bytes=\d*-\d*$/.test(range.trim()) ? range.trim() : undefined;
  try {
    const out = await s3.send(new GetObjectCommand({ Bucket, Key: key, Range: wanted }));
    return {
      status: out.ContentRange ? 206 : 200,
      body: out.Body!.transformToWebStream() as ReadableStream<Uint8Array>,
      contentLength: Number(out.ContentLength ?? 0),
      contentRange: out.ContentRange,
      contentType: out.ContentType,
      etag: out.ETag,
    };
  } catch (error) {
    if (isNotFound(error)) return null;
    if (error instanceof S3ServiceException && error.$metadata.httpStatusCode === 416) {
      return { status: 416, body: null, contentLength: 0 };
    }
    unavailable(error);
  }
}

/** A short-lived GET URL straight to the store, for downloads after the app has checked access. */
export async function presignDownload(key: string, filename: string, expiresInSeconds = env.DOWNLOAD_URL_TTL_SECONDS) {
  const safe = filename.replace(/[^\w.\- ]+/g, "_");
  const url = await getSignedUrl(
    s3,
    new GetObjectCommand({ Bucket, Key: key, ResponseContentDisposition: `attachment; filename="${safe}"`, ResponseContentType: "application/pdf" }),
    { expiresIn: expiresInSeconds },
  );
  return { url, expiresAt: new Date(Date.now() + expiresInSeconds * 1000).toISOString() };
}

/**
 * Every key under `prefix` in `bucket`, a page at a time. Uses the original listing call with a marker: the local
 * S3 fake answers 500 to the newer call's continuation pages, and every S3-compatible store supports this one.
 */
export async function* listKeys(prefix = "", bucket = Bucket): AsyncGenerator<string> {
  let marker: string | undefined;
  for (;;) {
    const page = await s3.send(new ListObjectsCommand({ Bucket: bucket, Prefix: prefix || undefined, Marker: marker }));
    const keys = (page.Contents ?? []).map((o) => o.Key!).filter(Boolean);
    yield* keys;
    if (!page.IsTruncated || !keys.length) return;
    marker = page.NextMarker ?? keys.at(-1);
  }
}
