// The one error type of the drawing register: a message for people and the HTTP status that goes with it.
export class DrawingError extends Error {
  constructor(
    message: string,
    readonly status: number,
    readonly code?: string,
  ) {
    super(message);
  }
}

export const UUID = /^[0-9a-f]{8}-[0-9a-f]{4}-[0-9a-f]{4}-[0-9a-f]{4}-[0-9a-f]{12}$/i;

export function keys(projectId: string) {
  return {
    revision: (sha256: string) => `projects/${projectId}/revisions/${sha256}.pdf`,
    thumb: (sha256: string, page: number) => `projects/${projectId}/thumbs/${sha256}-p${page}.webp`,
    compare: (fromSha: string, toSha: string, page: number, ext: "json" | "webp") => `projects/${projectId}/compare/${fromSha}-${toSha}-p${page}.${ext}`,
  };
}
