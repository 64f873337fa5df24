// The one object-storage client (S3, or the local fake) and the few operations the domains use. Bodies are
// streamed both ways; an unreachable store surfaces as StorageUnavailableError so callers can say so plainly.
import type { Readable } from "node:stream";
import {
  DeleteObjectCommand,
  GetObjectCommand,
  HeadObjectCommand,
  ListObjectsCommand,
  PutObjectCommand,
  S3Client,
  S3ServiceException,
} from "@aws-sdk/client-s3";
import { Upload } from "@aws-sdk/lib-storage";
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

/** Bodies above this go up as a multipart upload, several parts at once; smaller ones in one request. */
const MULTIPART_FROM_BYTES = 32 * 1024 * 1024;

export async function putObject(key: string, body: Readable | Uint8Array, options: { contentType: string; contentLength: number }) {
  try {
    if (options.contentLength > MULTIPART_FROM_BYTES) {
      // A failed part aborts the whole multipart upload (no parts are left behind in the store).
      await new Upload({ client: s3, params: { Bucket, Key: key, Body: body, ContentType: options.contentType }, partSize: 16 * 1024 * 1024, queueSize: 4 }).done();
    } else {
      await s3.send(new PutObjectCommand({ Bucket, Key: key, Body: body, ContentType: options.contentType, ContentLength: options.contentLength }));
    }
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
