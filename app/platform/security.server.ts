// Security headers for every response, and the Content-Security-Policy for documents (nonce-based, while still
// letting the PDF viewer's worker, blob URLs and the object store's presigned URLs work).
import { env } from "./env.server";

function storageOrigin() {
  try {
    return env.S3_ENDPOINT ? new URL(env.S3_ENDPOINT).origin : "";
  } catch {
    return "";
  }
}

export function contentSecurityPolicy(nonce: string) {
  const s3 = storageOrigin();
  return [
    "default-src 'self'",
    `script-src 'self' 'nonce-${nonce}'`,
    "style-src 'self' 'unsafe-inline'",
    `img-src 'self' data: blob: ${s3}`,
    "font-src 'self' data:",
    `connect-src 'self' ${s3}`,
    "worker-src 'self' blob:",
    "object-src 'none'",
    "base-uri 'self'",
    "form-action 'self'",
    "frame-ancestors 'none'",
  ].join("; ");
}

export function applySecurityHeaders(headers: Headers) {
  headers.set("X-Content-Type-Options", "nosniff");
  headers.set("Referrer-Policy", "same-origin");
  headers.set("X-Frame-Options", "DENY");
  headers.set("Cross-Origin-Opener-Policy", "same-origin");
  headers.set("Permissions-Policy", "camera=(self), geolocation=(), microphone=()");
  if (env.APP_URL.startsWith("https:")) headers.set("Strict-Transport-Security", "max-age=31536000");
}
