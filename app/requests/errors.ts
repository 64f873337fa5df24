// The one error type of requests and review: a message for people, the HTTP status, and for 422 the field issues.
export class RequestError extends Error {
  constructor(
    message: string,
    readonly status: number,
    readonly code?: string,
    readonly issues?: { path: string; message: string }[],
  ) {
    super(message);
  }
}

export const UUID = /^[0-9a-f]{8}-[0-9a-f]{4}-[0-9a-f]{4}-[0-9a-f]{4}-[0-9a-f]{12}$/i;

export const STALE = "Someone else moved this request first. The page now shows where it is; nothing of yours was changed.";

export function attachmentKeys(projectId: string) {
  return {
    original: (sha256: string) => `projects/${projectId}/attachments/${sha256}`,
    thumb: (sha256: string) => `projects/${projectId}/thumbs/${sha256}-p1.webp`,
  };
}
