// The one error type of the drawing register: a message for people and the HTTP status that goes with it.
import { DomainError } from "../platform/failures.server";

export class DrawingError extends DomainError {}

export { UUID } from "../platform/failures.server";

export function keys(projectId: string) {
  return {
    revision: (sha256: string) => `projects/${projectId}/revisions/${sha256}.pdf`,
    thumb: (sha256: string, page: number) => `projects/${projectId}/thumbs/${sha256}-p${page}.webp`,
    compare: (fromSha: string, toSha: string, page: number, ext: "json" | "png") => `projects/${projectId}/compare/${fromSha}-${toSha}-p${page}.${ext}`,
  };
}
