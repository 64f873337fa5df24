// The one error type of requests and review: a message for people, the HTTP status, and for 422 the field issues.
import { DomainError } from "../platform/failures.server";

export class RequestError extends DomainError {}

export { UUID } from "../platform/failures.server";

export const STALE = "Someone else moved this request first. The page now shows where it is; nothing of yours was changed.";

export function attachmentKeys(projectId: string) {
  return {
    original: (sha256: string) => `projects/${projectId}/attachments/${sha256}`,
    thumb: (sha256: string) => `projects/${projectId}/thumbs/${sha256}-p1.webp`,
  };
}
