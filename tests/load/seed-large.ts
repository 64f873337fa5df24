// A large project for load runs, inserted with bulk SQL straight into the slot's database: sheets with revisions
// (every revision points at one small real PDF in object storage, under its content-addressed key, so the file
// and viewer routes really serve), requests across every state with versions, comments, decisions with their
// assessments, and markups spread over the requests and sheets. Names are invented.
//   seedLarge("tiny" | "full" | { ...counts }) → the project, its team and the rows a load run aims at.
// As a script (slot environment from storage/profile.sh): npx tsx tests/load/seed-large.ts full > seeded.json
import { createHash } from "node:crypto";
import { PDFDocument, StandardFonts } from "pdf-lib";
import { QueryTypes } from "sequelize";
import { sequelize } from "../../db/models";
import { keys } from "../../app/drawings/errors";
import { putObject } from "../../app/platform/storage.server";
import { PRINCIPLES } from "../../app/review/principles";
import { PROVISION_IDS } from "../../app/requests/provisions";
import { makeProjectTeam, PASSWORD } from "../support/factory";

export interface SeedSize {
  drawings: number;
  revisionsPerDrawing: number;
  requests: number;
  commentsPerRequest: number;
  markups: number;
}

export const SIZES = {
  tiny: { drawings: 5, revisionsPerDrawing: 2, requests: 20, commentsPerRequest: 1, markups: 200 },
  full: { drawings: 400, revisionsPerDrawing: 3, requests: 3000, commentsPerRequest: 2, markups: 100_000 },
} satisfies Record<string, SeedSize>;

export interface SeededProject {
  projectId: string;
  /** Everyone signs in with this password. */
  password: string;
  users: Record<"manager" | "architect" | "engineer" | "site_plumber", { id: string; email: string }>;
  /** A request in review, assigned to the engineer, with markups: the review desk and sheet of the load run. */
  requestId: string;
  /** A revision that request has markups on. */
  revisionId: string;
  counts: Record<string, number>;
  seconds: number;
}

const A3: [number, number] = [1191, 842];

async function samplePdf() {
  const doc = await PDFDocument.create();
  const page = doc.addPage(A3);
  const font = await doc.embedFont(StandardFonts.Helvetica);
  page.drawText("Load-run sheet: hot and cold supply layout (invented)", { x: 60, y: A3[1] - 80, size: 24, font });
  page.drawRectangle({ x: 60, y: 60, width: A3[0] - 120, height: A3[1] - 180, borderWidth: 2 });
  return doc.save({ useObjectStreams: false });
}

// Every request state, in proportion to a busy project: most requests finished or in flight, few drafts.
const STATE_CYCLE = ["decided", "closed", "in_review", "submitted", "decided", "info_requested", "resubmitted", "in_review", "withdrawn", "draft", "decided", "superseded"];

export async function seedLarge(which: keyof typeof SIZES | SeedSize = "tiny"): Promise<SeededProject> {
  const size = typeof which === "string" ? SIZES[which] : which;
  const started = performance.now();
  const team = await makeProjectTeam();
  const p = team.project.id;
  await team.project.update({ name: "Load-run project (large)", siteAddress: "12 Invented Avenue, Testville" });
  const u = team.users;

  const pdf = await samplePdf();
  const sha = createHash("sha256").update(pdf).digest("hex");
  const objectKey = keys(p).revision(sha);
  await putObject(objectKey, pdf, { contentType: "application/pdf", contentLength: pdf.byteLength });

  const run = (sql: string, replacements: Record<string, unknown> = {}) => sequelize.query(sql, { replacements: { p, ...replacements } });
  await sequelize.transaction(async (transaction) => {
    const q = (sql: string, replacements: Record<string, unknown> = {}) => sequelize.query(sql, { replacements: { p, ...replacements }, transaction });
    await q(
      `INSERT INTO drawings (id, project_id, sheet_number, title, discipline, scale_text, created_by_id, created_at, updated_at)
       SELECT gen_random_uuid(), :p, 'PL-' || lpad(g::text, 4, '0'), 'Supply layout, block ' || g, 'plumbing', '1:50', :a,
              now() - make_interval(days => 60), now() - make_interval(mins => g)
       FROM generate_series(1, :n) g`,
      { n: size.drawings, a: u.architect.id },
    );
    // Labels P1 … P(k-1), then A: earlier ones superseded, the last accepted (every seventh sheet still for review).
    // The first revision carries the PDF's real hash; the rest share its object under a distinct made-up hash.
    await q(
      `WITH d AS (SELECT id, row_number() OVER (ORDER BY sheet_number) AS i FROM drawings WHERE project_id = :p)
       INSERT INTO drawing_revisions (id, project_id, drawing_id, label, status, description, object_key, sha256, byte_size,
         original_filename, page_count, pages, processing, processed_pages, uploaded_by_id, issued_by_id, issued_at, created_at, updated_at)
       SELECT gen_random_uuid(), :p, d.id,
              CASE WHEN r = :k THEN 'A' ELSE 'P' || r END,
              CASE WHEN r < :k THEN 'superseded' WHEN d.i % 7 = 0 THEN 'for_review' ELSE 'accepted' END,
              'Issued for the load run', :key,
              CASE WHEN d.i = 1 AND r = 1 THEN :sha ELSE encode(digest(d.id::text || '/' || r, 'sha256'), 'hex') END,
              :bytes, 'sheet-' || d.i || '.pdf', 1, :pages::jsonb, 'done', 1, :a,
              CASE WHEN r = :k THEN CAST(:a AS uuid) END, CASE WHEN r = :k THEN now() - make_interval(days => 5) END,
              now() - make_interval(days => 40 - r * 10, mins => d.i::int), now()
       FROM d CROSS JOIN generate_series(1, :k) r`,
      { k: size.revisionsPerDrawing, key: objectKey, sha, bytes: pdf.byteLength, pages: JSON.stringify([{ widthPt: A3[0], heightPt: A3[1] }]), a: u.architect.id },
    );
    await q(
      `INSERT INTO deviation_requests (id, project_id, number, title, provision, clause_ref, state, assignee_id, due_at, submitted_at,
         state_changed_at, created_by_id, lock_version, created_at, updated_at)
       SELECT gen_random_uuid(), :p, g, 'Deviation ' || g || ': discharge route on a flat roof', (ARRAY[:provisions])[1 + g % :np], '',
              s.state,
              CASE WHEN s.state IN ('draft', 'submitted', 'resubmitted') AND g % 2 = 0 THEN NULL ELSE CAST(:e AS uuid) END,
              CASE WHEN s.state <> 'draft' THEN now() + make_interval(days => (g % 20) - 6) END,
              CASE WHEN s.state <> 'draft' THEN now() - make_interval(days => 10, mins => g) END,
              now() - make_interval(mins => g * 7), :pl, 0,
              now() - make_interval(days => 12, mins => g), now() - make_interval(mins => g)
       FROM generate_series(1, :n) g
       CROSS JOIN LATERAL (SELECT (ARRAY[:states])[1 + g % :ns] AS state) s`,
      { n: size.requests, provisions: PROVISION_IDS, np: PROVISION_IDS.length, states: STATE_CYCLE, ns: STATE_CYCLE.length, e: u.engineer.id, pl: u.site_plumber.id },
    );
    // One version for a draft (not sent), one to three sent versions otherwise.
    await q(
      `INSERT INTO request_versions (id, request_id, n, title, provision, clause_ref, site_constraint, proposal, measurements,
         created_by_id, submitted_at, created_at, updated_at)
       SELECT gen_random_uuid(), r.id, v, r.title, r.provision, '',
              'No space for the discharge pipe to fall to a safe point; the roof is flat (version ' || v || ').',
              'Run the discharge pipe along the parapet to a tundish over the gully; pipe one size up.',
              '[{"kind":"lengthM","name":"Discharge run","value":"7.5","unit":"m"}]'::jsonb, r.created_by_id,
              CASE WHEN r.state <> 'draft' THEN r.submitted_at + make_interval(days => v - 1) END, r.created_at, r.updated_at
       FROM deviation_requests r
       CROSS JOIN LATERAL generate_series(1, CASE WHEN r.state = 'draft' THEN 1 ELSE 1 + r.number % 3 END) v
       WHERE r.project_id = :p`,
    );
    await q(
      `INSERT INTO comments (id, request_id, author_id, body, mentions, created_at)
       SELECT gen_random_uuid(), r.id, CASE WHEN c % 2 = 0 THEN CAST(:e AS uuid) ELSE r.created_by_id END,
              'Comment ' || c || ' on request ' || r.number || ': please confirm the pipe size on site.', '{}', r.created_at + make_interval(hours => c)
       FROM deviation_requests r CROSS JOIN generate_series(1, :c) c
       WHERE r.project_id = :p AND r.state <> 'draft'`,
      { c: size.commentsPerRequest, e: u.engineer.id },
    );
    // Decided and closed requests carry a recorded decision on their last version; every other request in
    // review a draft the engineer is working on.
    await q(
      `INSERT INTO decisions (id, request_id, request_version_id, outcome, conditions, reasons, rests_on, decided_by_id, recorded_at, created_at, updated_at)
       SELECT gen_random_uuid(), r.id, v.id,
              CASE WHEN r.state IN ('decided', 'closed') THEN 'approved_with_conditions' END,
              CASE WHEN r.state IN ('decided', 'closed') THEN '[{"n":1,"text":"Insulate the run along the parapet."}]'::jsonb ELSE '[]'::jsonb END,
              '', '{}', :e, CASE WHEN r.state IN ('decided', 'closed') THEN r.state_changed_at END, r.state_changed_at, r.state_changed_at
       FROM deviation_requests r
       JOIN LATERAL (SELECT id FROM request_versions WHERE request_id = r.id ORDER BY n DESC LIMIT 1) v ON true
       WHERE r.project_id = :p AND (r.state IN ('decided', 'closed') OR (r.state = 'in_review' AND r.number % 2 = 0))`,
      { e: u.engineer.id },
    );
    await q(
      `INSERT INTO assessments (id, decision_id, principle, outcome, reasoning, evidence, created_at, updated_at)
       SELECT gen_random_uuid(), d.id, pr, CASE WHEN d.recorded_at IS NOT NULL THEN 'maintained' END,
              CASE WHEN d.recorded_at IS NOT NULL THEN 'Kept by the longer run at one size up.' ELSE '' END, '[]', d.created_at, d.updated_at
       FROM decisions d JOIN deviation_requests r ON r.id = d.request_id CROSS JOIN unnest(ARRAY[:principles]::text[]) pr
       WHERE r.project_id = :p`,
      { principles: PRINCIPLES.map((x) => x.id) },
    );
    // Markup g goes to request g mod R (requests that were sent) on one of three sheets of that request.
    await q(
      `WITH r AS (SELECT id, row_number() OVER (ORDER BY number) - 1 AS i FROM deviation_requests WHERE project_id = :p AND state <> 'draft'),
            v AS (SELECT id, row_number() OVER (ORDER BY created_at, id) - 1 AS i FROM drawing_revisions WHERE project_id = :p),
            nr AS (SELECT count(*) AS c FROM r), nv AS (SELECT count(*) AS c FROM v)
       INSERT INTO markups (id, project_id, request_id, revision_id, page, kind, shape, author_id, version, created_at, updated_at)
       SELECT gen_random_uuid(), :p, r.id, v.id, 1, 'rectangle',
              jsonb_build_object('kind', 'rectangle', 'points', jsonb_build_array(40 + g % 900, 40 + g % 600, 140 + g % 900, 100 + g % 600),
                                 'color', '#9a4a20', 'strokeWidthPt', 1.5),
              :e, 1, now() - make_interval(mins => g::int), now() - make_interval(mins => g::int)
       FROM generate_series(0, :n - 1) g CROSS JOIN nr CROSS JOIN nv
       JOIN r ON r.i = g % nr.c
       JOIN v ON v.i = (r.i * 3 + (g / nr.c) % 3) % nv.c`,
      { n: size.markups, e: u.engineer.id },
    );
  });
  await run(`ANALYZE drawings, drawing_revisions, deviation_requests, request_versions, comments, decisions, assessments, markups`);

  const [target] = await sequelize.query<{ request_id: string; revision_id: string }>(
    `SELECT m.request_id, m.revision_id FROM markups m JOIN deviation_requests r ON r.id = m.request_id
     WHERE m.project_id = :p AND r.state = 'in_review' AND r.assignee_id = :e
     GROUP BY m.request_id, m.revision_id, r.number ORDER BY count(*) DESC, r.number LIMIT 1`,
    { replacements: { p, e: u.engineer.id }, type: QueryTypes.SELECT },
  );
  if (!target) throw new Error("The seed made no request in review with markups; raise the sizes.");
  const counts: Record<string, number> = {};
  for (const t of ["drawings", "drawing_revisions", "deviation_requests", "request_versions", "comments", "decisions", "assessments", "markups"]) {
    const where = ["drawings", "drawing_revisions", "deviation_requests", "markups"].includes(t) ? "project_id = :p" : t === "assessments" ? "decision_id IN (SELECT d.id FROM decisions d JOIN deviation_requests r ON r.id = d.request_id WHERE r.project_id = :p)" : "request_id IN (SELECT id FROM deviation_requests WHERE project_id = :p)";
    const [row] = await sequelize.query<{ n: string }>(`SELECT count(*) AS n FROM ${t} WHERE ${where}`, { replacements: { p }, type: QueryTypes.SELECT });
    counts[t] = Number(row!.n);
  }
  const person = (x: { id: string; email: string }) => ({ id: x.id, email: x.email });
  return {
    projectId: p,
    password: PASSWORD,
    users: { manager: person(u.manager), architect: person(u.architect), engineer: person(u.engineer), site_plumber: person(u.site_plumber) },
    requestId: target.request_id,
    revisionId: target.revision_id,
    counts,
    seconds: Math.round((performance.now() - started) / 100) / 10,
  };
}

if (import.meta.url === `file://${process.argv[1]}`) {
  const arg = process.argv[2] ?? "tiny";
  if (!(arg in SIZES)) throw new Error(`Size is one of ${Object.keys(SIZES).join(", ")}.`);
  const seeded = await seedLarge(arg as keyof typeof SIZES);
  process.stdout.write(`${JSON.stringify(seeded, null, 2)}\n`);
  await sequelize.close();
}
