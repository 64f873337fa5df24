// The baseline of the load run: for each endpoint, the rows it reads, fetched by hand-written SQL (no ORM, no
// HTTP, no rendering). The member's role and project come first everywhere, as the app checks them on every
// request; the session lookup is left out. Each list of statements runs in order on one pooled client per turn.
import type { LoadTarget } from "./load";

export interface BareQuery {
  sql: string;
  params: unknown[];
}

export function bareQueries(t: LoadTarget, rowsOf: Map<string, number>): Record<string, BareQuery[]> {
  const member: BareQuery = {
    sql: `SELECT pm.role, p.id, p.name, p.site_address, p.client_name, p.description
          FROM project_members pm JOIN projects p ON p.id = pm.project_id WHERE pm.project_id = $1 AND pm.user_id = $2`,
    params: [t.projectId, t.userId],
  };
  const register: BareQuery = {
    sql: `SELECT d.id, d.sheet_number, d.title, d.discipline, d.scale_text, d.updated_at, r.id AS revision_id, r.label, r.status,
                 r.description, r.sha256, r.byte_size, r.original_filename, r.source_page, r.page_count, r.pages, r.processing,
                 r.processing_error, r.processed_pages, r.issued_at, r.supersedes_id, r.superseded_by_id, r.created_at,
                 up.name AS uploaded_by, iss.name AS issued_by
          FROM drawings d
          LEFT JOIN drawing_revisions r ON r.drawing_id = d.id
          LEFT JOIN users up ON up.id = r.uploaded_by_id
          LEFT JOIN users iss ON iss.id = r.issued_by_id
          WHERE d.project_id = $1 ORDER BY d.sheet_number`,
    params: [t.projectId],
  };
  const visible = `(r.state <> 'draft' OR r.created_by_id = $2)`;
  const requestList: BareQuery[] = [
    member,
    { sql: `SELECT r.state, count(*) FROM deviation_requests r WHERE r.project_id = $1 AND ${visible} GROUP BY r.state`, params: [t.projectId, t.userId] },
    {
      sql: `SELECT r.id, r.number, r.title, r.provision, r.state, r.assignee_id, r.created_by_id, r.due_at, r.state_changed_at,
                   a.name AS assignee, c.name AS created_by
            FROM deviation_requests r LEFT JOIN users a ON a.id = r.assignee_id JOIN users c ON c.id = r.created_by_id
            WHERE r.project_id = $1 AND ${visible} ORDER BY r.created_at DESC LIMIT $3`,
      params: [t.projectId, t.userId, rowsOf.get("requests") ?? 50],
    },
    { sql: `SELECT pm.user_id, u.name FROM project_members pm JOIN users u ON u.id = pm.user_id WHERE pm.project_id = $1 AND pm.role = 'engineer'`, params: [t.projectId] },
  ];
  const request: BareQuery = {
    sql: `SELECT r.*, a.name AS assignee, c.name AS created_by FROM deviation_requests r
          LEFT JOIN users a ON a.id = r.assignee_id JOIN users c ON c.id = r.created_by_id
          WHERE r.id = $1 AND r.project_id = $2`,
    params: [t.requestId, t.projectId],
  };
  const versions: BareQuery = { sql: `SELECT * FROM request_versions WHERE request_id = $1 ORDER BY n`, params: [t.requestId] };
  const attachments: BareQuery = {
    sql: `SELECT a.*, u.name AS uploaded_by FROM attachments a JOIN users u ON u.id = a.uploaded_by_id
          WHERE a.request_id = $1 AND a.comment_id IS NULL ORDER BY a.created_at`,
    params: [t.requestId],
  };
  const markups = (byRevision: boolean): BareQuery => ({
    sql: `SELECT m.id, m.revision_id, m.page, m.kind, m.shape, m.version, m.updated_at, m.author_id, u.name AS author
          FROM markups m JOIN users u ON u.id = m.author_id
          WHERE m.project_id = $1 AND m.request_id = $2 AND m.deleted_at IS NULL ${byRevision ? "AND m.revision_id = $3" : ""}
          ORDER BY m.created_at, m.id`,
    params: byRevision ? [t.projectId, t.requestId, t.revisionId] : [t.projectId, t.requestId],
  });
  return {
    "project page": [
      member,
      {
        sql: `SELECT pm.id, pm.user_id, pm.role, pm.version, u.name, u.email, u.profession, u.registration_state
              FROM project_members pm JOIN users u ON u.id = pm.user_id WHERE pm.project_id = $1 ORDER BY u.name LIMIT 500`,
        params: [t.projectId],
      },
    ],
    "drawings register": [member, register],
    "requests list": requestList,
    "review desk": [
      member,
      request,
      versions,
      attachments,
      {
        sql: `SELECT d.*, u.name AS decided_by, coalesce(json_agg(a.*) FILTER (WHERE a.id IS NOT NULL), '[]') AS assessments
              FROM decisions d JOIN users u ON u.id = d.decided_by_id LEFT JOIN assessments a ON a.decision_id = d.id
              WHERE d.request_id = $1 GROUP BY d.id, u.name ORDER BY d.created_at`,
        params: [t.requestId],
      },
      // Each sheet's current revision: the accepted one, else the newest live one.
      {
        sql: `SELECT DISTINCT ON (d.id) d.id, d.sheet_number, d.title, r.id AS revision_id, r.label, r.status
              FROM drawings d JOIN drawing_revisions r ON r.drawing_id = d.id
              WHERE d.project_id = $1 AND r.status NOT IN ('withdrawn', 'superseded')
              ORDER BY d.id, (r.status = 'accepted') DESC, r.created_at DESC`,
        params: [t.projectId],
      },
    ],
    "request sheet": [
      member,
      request,
      {
        sql: `SELECT r.id, r.drawing_id, r.label, r.status, r.pages, r.created_at, d.sheet_number, d.title, d.scale_text
              FROM drawing_revisions r JOIN drawings d ON d.id = r.drawing_id
              WHERE r.project_id = $1 AND r.status <> 'withdrawn' ORDER BY d.sheet_number, r.created_at DESC`,
        params: [t.projectId],
      },
      { sql: `SELECT rests_on FROM decisions WHERE request_id = $1 ORDER BY created_at DESC LIMIT 1`, params: [t.requestId] },
      { sql: `SELECT * FROM request_pins WHERE request_id = $1 ORDER BY n`, params: [t.requestId] },
      markups(true),
    ],
    "GET requests": requestList,
    "GET drawings": [member, register],
    "GET markups": [
      member,
      { sql: `SELECT id, state, created_by_id FROM deviation_requests WHERE id = $1 AND project_id = $2`, params: [t.requestId, t.projectId] },
      markups(false),
    ],
  };
}
