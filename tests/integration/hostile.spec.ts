// Hostile input against the running app: over a thousand bad inputs, listed or generated with fixed fast-check
// seeds — every JSON field of the API with wrong types, bad numbers and awkward or scripted text; raw bodies that
// are not JSON, nest deeply or run long; every page form; guessed and malformed ids in every kind of path; mutated
// and disguised PDFs and broken multipart bodies against each upload. Each answer is judged (tests/support/hostile/
// corpus.ts): never a 5xx; what must be refused gets a 4xx with a readable message and no stack or SQL. Afterwards
// the database and the bucket still agree (no orphan object, no row without its object), and no page puts stored
// markup into the document raw.
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import fc from "fast-check";
import { DeviationRequest, DrawingRevision } from "../../db/models";
import { EXAMPLES } from "../../app/calculations/examples";
import { KINDS } from "../../app/calculations/kinds";
import { checkConsistency } from "../support/consistency";
import { makeSheet, until, upload } from "../support/drawings";
import { makeProjectTeam, PASSWORD } from "../support/factory";
import { Client, uniqueEmail } from "../support/http";
import { describeReport, runCorpus, type Expectation, type HostileCase } from "../support/hostile/corpus";
import { brokenMultiparts, hostileFiles } from "../support/hostile/files";
import { anyJson, anyNumberish, anyText, BAD_IDS, BAD_NUMBERS, deepJson, RAW_MARKERS, sample, TEXT_HOSTILES, toJsonText, WRONG_TYPES } from "../support/hostile/payloads";
import { api, CONTENT, makePhoto } from "../support/requests";

type Role = "manager" | "architect" | "engineer" | "site_plumber";
let team: Awaited<ReturnType<typeof makeProjectTeam>>;
const as = {} as Record<Role, Client>;
const ids = {} as { p: string; draft: string; moves: string; review: string; revision: string; drawing: string };

/** Bad numbers a numeric field must refuse; null, [1] and huge values may be coerced or range-checked. */
const MUST_REFUSE_NUMBER = new Set(["infinity", "negInfinity", "nanString", "text", "object"]);
/** The bad numbers sent to every calculator input (the full list goes to pins and markups). */
const CALC_NUMBERS = ["infinity", "nanString", "text", "null", "object", "huge"];
/** The hostile texts for forms and names: scripts, the characters a database refuses, and the awkward rest. */
const FORM_TEXTS = Object.fromEntries(
  ["script1", "script2", "script3", "script5", "nul", "loneHighSurrogate", "rtlOverride", "long10k", "crlfInjection", "sqlish"].map((k) => [k, TEXT_HOSTILES[k]!]),
);
/** Malformed ids for every id-bearing path (the full list goes to the project id). */
const PATH_IDS = ["not-a-uuid", "123", "00000000-0000-0000-0000-000000000000", "ZZZZZZZZ-ZZZZ-ZZZZ-ZZZZ-ZZZZZZZZZZZZ", "0f8fad5b-d9cb-469f-a165-70867728950e-extra", "' OR '1'='1", "%00", "%E0%A4%A", "a".repeat(2000)];

function jsonCase(target: string, name: string, who: Client, method: string, path: string, body: string, expect: Expectation, type = "application/json"): HostileCase {
  return { target, name, expect, send: () => who.request(path, { method, body, headers: { accept: "application/json", "content-type": type } }) };
}

function formCase(target: string, name: string, who: Client, path: string, fields: Record<string, string>, expect: Expectation): HostileCase {
  return { target, name, expect, send: () => who.post(path, fields) };
}

/** Every number leaf of a value, as a path of keys. */
function numberPaths(value: unknown, at: (string | number)[] = []): (string | number)[][] {
  if (typeof value === "number") return [at];
  if (Array.isArray(value)) return value.flatMap((v, i) => numberPaths(v, [...at, i]));
  if (value && typeof value === "object") return Object.entries(value).flatMap(([k, v]) => numberPaths(v, [...at, k]));
  return [];
}
function withValue<T>(base: T, path: (string | number)[], value: unknown): T {
  const copy = structuredClone(base) as any;
  let node = copy;
  for (const key of path.slice(0, -1)) node = node[key];
  node[path.at(-1)!] = value;
  return copy;
}

/**
 * For one JSON endpoint: each text field × the hostile texts, each field × wrong types (but the `valid` ones, such
 * as an empty list where a list may be empty), raw bodies, and generated bodies.
 */
function fieldCases(target: string, who: Client, path: string, base: Record<string, unknown>, fields: { text?: string[]; required?: string[]; valid?: Record<string, string[]> }, seed: number) {
  const cases: HostileCase[] = [];
  for (const field of fields.text ?? []) {
    for (const [name, text] of Object.entries(TEXT_HOSTILES)) {
      cases.push(jsonCase(target, `${field}=${name}`, who, "POST", path, toJsonText({ ...base, [field]: text }), "no-crash"));
    }
  }
  for (const field of fields.required ?? []) {
    for (const [name, value] of Object.entries(WRONG_TYPES)) {
      const expect: Expectation = fields.valid?.[field]?.includes(name) ? "no-crash" : "refuse";
      cases.push(jsonCase(target, `${field}:${name}`, who, "POST", path, toJsonText({ ...base, [field]: value }), expect));
    }
  }
  // Raw bodies that are not the JSON object the endpoint reads.
  const raws: [string, string, Expectation, string?][] = [
    ["empty", "", "refuse"],
    ["truncated", "{\"title\": \"x", "refuse"],
    ["array", "[]", "refuse"],
    ["null", "null", "refuse"],
    ["number", "1e999", "refuse"],
    ["string", "\"hello\"", "refuse"],
    ["bom", "\ufeff{}", "refuse"],
    ["deep-arrays-100k", `{"a":${deepJson(100_000)}}`, "refuse"],
    ["deep-objects-20k", `{"a":${deepJson(20_000, "{\"a\":", "}")}}`.replace(/\{"a":\}/, "{}"), "refuse"],
    ["oversized-3mb", JSON.stringify({ ...base, [fields.text?.[0] ?? "x"]: "x".repeat(3 * 1024 * 1024) }), "refuse"],
    ["duplicate-keys", `{"title":"a","title":{"$ne":null}}`, "refuse"],
    ["text-plain-type", JSON.stringify(base), "no-crash", "text/plain"],
    ["form-type", "a=1&b=2", "refuse", "application/x-www-form-urlencoded"],
  ];
  for (const [name, body, expect, type] of raws) cases.push(jsonCase(target, `raw:${name}`, who, "POST", path, body, expect, type));
  // Generated: any JSON as the body, and the right shape with any text or numberish value in each field.
  for (const [i, value] of sample(anyJson, seed, 12).entries()) cases.push(jsonCase(target, `gen-body#${seed}.${i}`, who, "POST", path, toJsonText(value), "no-crash"));
  const keys = Object.keys(base);
  const generated = sample(fc.record({ key: fc.constantFrom(...keys), value: fc.oneof(anyText, anyNumberish, anyJson) }), seed + 1, 16);
  for (const [i, g] of generated.entries()) cases.push(jsonCase(target, `gen-${g.key}#${seed + 1}.${i}`, who, "POST", path, toJsonText({ ...base, [g.key]: g.value }), "no-crash"));
  return cases;
}

function calculationCases(): HostileCase[] {
  const cases: HostileCase[] = [];
  for (const kind of KINDS) {
    const base = EXAMPLES[kind];
    const paths = numberPaths(base);
    // Every numeric input of every calculator with each bad number (sampled for the large balance network).
    const chosen = kind === "balance" ? sample(fc.constantFrom(...paths), 11, 16) : paths;
    for (const path of chosen) {
      for (const name of CALC_NUMBERS) {
        const value = BAD_NUMBERS[name];
        const expect: Expectation = MUST_REFUSE_NUMBER.has(name) ? "refuse" : "no-crash";
        cases.push(jsonCase(`api:calculate.${kind}`, `${path.join(".")}=${name}`, as.engineer, "POST", `/api/calculations/${kind}`, toJsonText(withValue(base, path, value)), expect));
      }
    }
  }
  return cases;
}

async function uploadCases(): Promise<HostileCase[]> {
  const cases: HostileCase[] = [];
  const files = await hostileFiles();
  let n = 0;
  const form = (fields: Record<string, string>, bytes: Uint8Array, filename: string, type: string) => {
    const f = new FormData();
    for (const [k, v] of Object.entries(fields)) f.append(k, v);
    f.append("file", new Blob([new Uint8Array(bytes)], { type }), filename);
    return f;
  };
  const post = (who: Client, path: string, body: BodyInit, contentType?: string) =>
    who.request(path, { method: "POST", body, headers: { accept: "application/json", ...(contentType ? { "content-type": contentType } : {}) } });
  const drawingUpload = `/projects/${ids.p}/drawings/upload`;
  const attachment = `/projects/${ids.p}/requests/${ids.draft}/attachments`;
  for (const f of files) {
    const expect: Expectation = f.mustRefuse ? "refuse" : "no-crash";
    cases.push({ target: "upload:drawing", name: f.name, expect, send: () => post(as.architect, drawingUpload, form({ sheetNumber: `HX-${n++}`, title: "Hostile sheet" }, f.bytes, f.filename, f.type)) });
    // An attachment is any photo or PDF, told by its first bytes and kept as sent; only other files must be refused.
    const attachable = /^(%PDF-|\x89PNG|\xff\xd8\xff)/.test(Buffer.from(f.bytes.subarray(0, 8)).toString("latin1"));
    cases.push({ target: "upload:attachment", name: f.name, expect: f.mustRefuse && !attachable ? "refuse" : "no-crash", send: () => post(as.site_plumber, attachment, form({}, f.bytes, f.filename, f.type)) });
  }
  // Good bytes with hostile names and fields.
  const sheet = await makeSheet({ tag: "hostile-names" });
  for (const [name, text] of Object.entries(FORM_TEXTS)) {
    cases.push({ target: "upload:drawing-fields", name: `title=${name}`, expect: "no-crash", send: () => post(as.architect, drawingUpload, form({ sheetNumber: `HN-${n++}`, title: text }, sheet, "sheet.pdf", "application/pdf")) });
    cases.push({ target: "upload:drawing-fields", name: `sheetNumber=${name}`, expect: "no-crash", send: () => post(as.architect, drawingUpload, form({ sheetNumber: text, title: "Hostile number" }, sheet, "sheet.pdf", "application/pdf")) });
  }
  const photo = await makePhoto(32, 32);
  for (const [name, text] of Object.entries(FORM_TEXTS)) {
    cases.push({ target: "upload:attachment-name", name: `filename=${name}`, expect: "no-crash", send: () => post(as.site_plumber, attachment, form({}, photo, `${text}.jpg`, "image/jpeg")) });
  }
  for (const m of brokenMultiparts(sheet)) {
    const expect: Expectation = ["two-files", "filename-crlf", "filename-nul-traversal", "filename-star-encoding"].includes(m.name) ? "no-crash" : "refuse";
    cases.push({ target: "upload:multipart-drawing", name: m.name, expect, send: () => post(as.architect, drawingUpload, new Uint8Array(m.body), m.contentType) });
    cases.push({ target: "upload:multipart-attachment", name: m.name, expect: m.name === "file-without-fields" ? "no-crash" : expect, send: () => post(as.site_plumber, attachment, new Uint8Array(m.body), m.contentType) });
  }
  return cases;
}

function formCases(): HostileCase[] {
  const cases: HostileCase[] = [];
  const project = { name: "Hostile form project", siteAddress: "1 Invented Lane, Testville", clientName: "", description: "" };
  const requestNew = { title: "Hostile form request", provision: "discharge", clauseRef: "" };
  for (const [name, text] of Object.entries(FORM_TEXTS)) {
    for (const field of Object.keys(project)) {
      cases.push(formCase("form:project.new", `${field}=${name}`, as.manager, "/projects/new", { ...project, [field]: text }, "no-crash"));
      cases.push(formCase("form:project.settings", `${field}=${name}`, as.manager, `/projects/${ids.p}/settings`, { ...project, [field]: text }, "no-crash"));
    }
    for (const field of Object.keys(requestNew)) {
      cases.push(formCase("form:request.new", `${field}=${name}`, as.site_plumber, `/projects/${ids.p}/requests/new`, { ...requestNew, [field]: text }, field === "provision" ? "refuse" : "no-crash"));
    }
    cases.push(formCase("form:members.invite", `email=${name}`, as.manager, `/projects/${ids.p}/members`, { intent: "invite", email: text, role: "engineer" }, "refuse"));
    cases.push(formCase("form:members.invite", `role=${name}`, as.manager, `/projects/${ids.p}/members`, { intent: "invite", email: uniqueEmail("hostile-invite"), role: text }, "refuse"));
    cases.push(formCase("form:members", `intent=${name}`, as.manager, `/projects/${ids.p}/members`, { intent: text }, "refuse"));
    for (const field of ["name", "phone", "registrationNumber"]) {
      const fields = { name: "Hostile Sign Up", email: uniqueEmail("hostile-signup"), password: "a long enough password", profession: "engineer", phone: "", registrationNumber: "PR-1", registrationBody: "Invented board", [field]: text };
      cases.push({ target: "form:sign-up", name: `${field}=${name}`, expect: field === "phone" && text.trim() ? "refuse" : "no-crash", send: () => new Client().post("/sign-up", fields) });
    }
    cases.push({ target: "form:sign-up", name: `email=${name}`, expect: "refuse", send: () => new Client().post("/sign-up", { name: "Hostile", email: text, password: "a long enough password", profession: "other" }) });
    cases.push({ target: "form:sign-in", name: `email=${name}`, expect: "refuse", send: () => new Client().post("/sign-in", { email: text, password: "whatever it is" }) });
    cases.push({ target: "form:reset", name: `email=${name}`, expect: "no-crash", send: () => new Client().post("/reset-password", { email: text }) });
    cases.push(formCase("form:profile", `name=${name}`, as.architect, "/profile", { name: text, phone: "", profession: "architect" }, "no-crash"));
    cases.push(formCase("form:request.move", `note=${name}`, as.site_plumber, `/projects/${ids.p}/requests/${ids.draft}`, { intent: "move", action: "withdraw", lockVersion: "999999", note: text }, "refuse"));
    cases.push(formCase("form:request.move", `action=${name}`, as.site_plumber, `/projects/${ids.p}/requests/${ids.draft}`, { intent: "move", action: text, lockVersion: "0" }, "refuse"));
    cases.push(formCase("form:request.move", `lockVersion=${name}`, as.site_plumber, `/projects/${ids.p}/requests/${ids.draft}`, { intent: "move", action: "submit", lockVersion: text }, "refuse"));
  }
  // Form bodies that are not forms.
  for (const [name, body, type] of [
    ["json-to-form", "{\"name\":\"x\"}", "application/json"],
    ["garbage-urlencoded", "%E0%A4%A&&&==%%", "application/x-www-form-urlencoded"],
    ["many-fields", Array.from({ length: 5000 }, (_, i) => `f${i}=v`).join("&"), "application/x-www-form-urlencoded"],
    ["oversized", `name=${"x".repeat(3 * 1024 * 1024)}`, "application/x-www-form-urlencoded"],
  ] as const) {
    for (const path of ["/projects/new", `/projects/${ids.p}/settings`, `/projects/${ids.p}/requests/new`, `/projects/${ids.p}/members`, "/profile"]) {
      cases.push({ target: "form:raw", name: `${path} ${name}`, expect: "refuse", send: () => as.manager.request(path, { method: "POST", body, headers: { "content-type": type } }) });
    }
  }
  return cases;
}

function idCases(): HostileCase[] {
  const cases: HostileCase[] = [];
  const pages = (bad: string) => [
    `/projects/${bad}`,
    `/projects/${bad}/drawings`,
    `/projects/${ids.p}/drawings/${bad}`,
    `/projects/${ids.p}/drawings/${ids.drawing}/revisions/${bad}/file`,
    `/projects/${ids.p}/drawings/${ids.drawing}/revisions/${ids.revision}/thumbs/${bad}`,
    `/projects/${ids.p}/requests/${bad}`,
    `/projects/${ids.p}/requests/${bad}/review`,
    `/projects/${ids.p}/requests/${ids.draft}/attachments/${bad}`,
    `/projects/${ids.p}/approvals/${bad}`,
    `/projects/${ids.p}/calculations/${bad}`,
    `/projects/${ids.p}/transmittals/${bad}`,
    `/projects/${ids.p}/members/${bad}/verify`,
    `/api/projects/${bad}/requests`,
    `/api/projects/${ids.p}/requests/${bad}`,
    `/api/projects/${ids.p}/drawings/${bad}`,
    `/api/projects/${ids.p}/drawings/${ids.drawing}/revisions/${bad}/download`,
    `/api/projects/${ids.p}/requests/${ids.review}/markups/${bad}`,
    `/api/projects/${ids.p}/approvals/${bad}`,
    `/api/projects/${ids.p}/calculations/${bad}`,
  ];
  for (const bad of BAD_IDS) {
    cases.push({ target: "id:get", name: `/projects/${bad}`, expect: "refuse", send: () => as.manager.get(`/projects/${bad}`) });
  }
  for (const bad of PATH_IDS) {
    for (const path of pages(bad).slice(1)) cases.push({ target: "id:get", name: path.replace(ids.p, ":p"), expect: "refuse", send: () => as.manager.get(path, { headers: path.startsWith("/api/") ? { accept: "application/json" } : {} }) });
    // Tokens and codes: a page that says the link is not valid (200 or 4xx), never a crash.
    for (const path of [`/verify/${bad}`, `/invitations/${bad}`, `/reset-password/${bad}`]) cases.push({ target: "id:token", name: path, expect: "no-crash", send: () => new Client().get(path) });
    cases.push(jsonCase("id:post", `markup revisionId=${bad}`, as.engineer, "POST", `/api/projects/${ids.p}/requests/${ids.review}/markups`, JSON.stringify({ revisionId: bad, page: 1, shape: { kind: "cloud", points: [10, 10, 50, 50], color: "#9a4a20", strokeWidthPt: 1 } }), "refuse"));
    cases.push(jsonCase("id:post", `comment attachmentIds=[${bad}]`, as.engineer, "POST", `/api/projects/${ids.p}/requests/${ids.review}/comments`, JSON.stringify({ body: "Look", attachmentIds: [bad] }), "refuse"));
  }
  return cases;
}

let report: Awaited<ReturnType<typeof runCorpus>>;
let total = 0;

beforeAll(async () => {
  team = await makeProjectTeam();
  for (const role of ["manager", "architect", "engineer", "site_plumber"] as Role[]) {
    as[role] = new Client();
    await as[role].signIn(team.users[role].email, PASSWORD);
  }
  ids.p = team.project.id;
  const up = await upload(as.architect, ids.p, await makeSheet({ tag: "hostile-register" }), { sheetNumber: "HX-BASE", title: "Roof plumbing" });
  expect(up.status, JSON.stringify(up.body)).toBe(201);
  ids.revision = up.body.stored[0].revisionId;
  ids.drawing = up.body.stored[0].drawingId;
  const draft = await api(as.site_plumber, "POST", `/api/projects/${ids.p}/requests`, CONTENT);
  ids.draft = draft.body.request.id;
  ids.moves = (await api(as.site_plumber, "POST", `/api/projects/${ids.p}/requests`, CONTENT)).body.request.id;
  const review = await api(as.site_plumber, "POST", `/api/projects/${ids.p}/requests`, CONTENT);
  ids.review = review.body.request.id;
  for (const [who, action] of [["site_plumber", "submit"], ["engineer", "start_review"]] as const) {
    const current = (await DeviationRequest.findByPk(ids.review))!;
    const moved = await api(as[who], "POST", `/api/projects/${ids.p}/requests/${ids.review}/transitions`, { action, lockVersion: current.lockVersion });
    expect(moved.status, JSON.stringify(moved.body)).toBe(200);
  }
}, 60_000);

describe("a corpus of hostile input", () => {
  it("answers every case without a server error, refusing what must be refused with a readable message", async () => {
    const markup = { revisionId: ids.revision, page: 1, shape: { kind: "callout", points: [10, 10, 60, 60], text: "Note", color: "#9a4a20", strokeWidthPt: 1 } };
    const cases: HostileCase[] = [
      ...fieldCases("api:requests.create", as.site_plumber, `/api/projects/${ids.p}/requests`, { ...CONTENT }, { text: ["title", "clauseRef", "siteConstraint", "proposal"], required: ["title", "provision", "measurements"], valid: { measurements: ["emptyArray"] } }, 1),
      ...fieldCases("api:requests.save", as.site_plumber, `/api/projects/${ids.p}/requests/${ids.draft}`, { ...CONTENT }, { text: ["siteConstraint", "proposal"], required: ["provision", "measurements"], valid: { measurements: ["emptyArray"] } }, 3),
      ...fieldCases("api:comments", as.engineer, `/api/projects/${ids.p}/requests/${ids.review}/comments`, { body: "A comment", attachmentIds: [] }, { text: ["body"], required: ["body"] }, 5),
      ...fieldCases("api:markups", as.engineer, `/api/projects/${ids.p}/requests/${ids.review}/markups`, markup, { required: ["revisionId", "shape"] }, 7),
      ...fieldCases("api:markup-shape", as.engineer, `/api/projects/${ids.p}/requests/${ids.review}/markups`, markup, {}, 9).filter((c) => c.name.startsWith("gen")),
      ...Object.entries(TEXT_HOSTILES).map(([name, text]) =>
        jsonCase("api:markups", `shape.text=${name}`, as.engineer, "POST", `/api/projects/${ids.p}/requests/${ids.review}/markups`, toJsonText({ ...markup, shape: { ...markup.shape, text } }), "no-crash"),
      ),
      ...["kind", "points", "color", "strokeWidthPt"].flatMap((field) =>
        Object.entries(WRONG_TYPES).filter(([name]) => !(field === "strokeWidthPt" && name === "float")).map(([name, value]) =>
          jsonCase("api:markups", `shape.${field}:${name}`, as.engineer, "POST", `/api/projects/${ids.p}/requests/${ids.review}/markups`, toJsonText({ ...markup, shape: { ...markup.shape, [field]: value } }), "refuse"),
        ),
      ),
      ...["xPt", "yPt", "page"].flatMap((field) =>
        Object.entries(BAD_NUMBERS).map(([name, value]) =>
          jsonCase("api:pins", `${field}=${name}`, as.site_plumber, "POST", `/api/projects/${ids.p}/requests/${ids.draft}/pins`, toJsonText({ revisionId: ids.revision, page: 1, xPt: 20, yPt: 20, [field]: value }), MUST_REFUSE_NUMBER.has(name) ? "refuse" : "no-crash"),
        ),
      ),
      // On a stale version every move is refused; a lock version of 0 is the draft's own, so that one may move it.
      ...fieldCases("api:transitions", as.site_plumber, `/api/projects/${ids.p}/requests/${ids.moves}/transitions`, { action: "submit", lockVersion: 999_999, note: "" }, { text: ["note"], required: ["action", "lockVersion"] }, 13).map((c) => ({ ...c, expect: c.name === "lockVersion:zero" ? "no-crash" : "refuse" as Expectation })),
      ...fieldCases("api:calculations.save", as.engineer, `/api/projects/${ids.p}/calculations`, { kind: "segment", title: "Hostile", inputs: EXAMPLES.segment }, { text: ["title"], required: ["kind", "inputs"] }, 15),
      ...calculationCases(),
      ...formCases(),
      ...idCases(),
      ...(await uploadCases()),
    ];
    total = cases.length;
    report = await runCorpus(cases, 3);
    console.log(describeReport(report));
    expect(cases.length).toBeGreaterThanOrEqual(1000);
    expect(report.serverErrors.map((r) => `${r.target} ${r.name}: ${r.status}`)).toEqual([]);
    expect(report.problems.map((r) => `${r.target} ${r.name}: ${r.problem}`)).toEqual([]);
  }, 600_000);

  it("leaves the database and the bucket agreeing: no orphan object, no row without its object", async () => {
    // Accepted uploads are still being processed in the background: wait until every revision settles.
    await until(async () => (await DrawingRevision.count({ where: { projectId: ids.p, processing: ["queued", "running"] } })) === 0, 120_000, "processing to settle");
    const c = await checkConsistency({ projectIds: [ids.p] });
    expect(c).toEqual({ orphanObjects: [], danglingRows: [] });
  }, 150_000);

  it("never puts stored markup into a page raw", async () => {
    // Each page as someone who may see it: the plumber's own draft is hidden from the engineer.
    const pages: [Role, string][] = [
      ["engineer", `/projects/${ids.p}`],
      ["engineer", `/projects/${ids.p}/requests`],
      ["site_plumber", `/projects/${ids.p}/requests/${ids.draft}`],
      ["site_plumber", `/projects/${ids.p}/requests/${ids.draft}/edit`],
      ["engineer", `/projects/${ids.p}/requests/${ids.review}`],
      ["engineer", `/projects/${ids.p}/requests/${ids.review}/review`],
      ["engineer", `/projects/${ids.p}/drawings`],
      ["manager", `/projects/${ids.p}/members`],
      ["engineer", `/projects/${ids.p}/calculations`],
      ["engineer", "/requests"],
      ["manager", "/projects"],
    ];
    for (const [who, path] of pages) {
      const res = await as[who].get(path);
      expect(res.status, path).toBe(200);
      const html = await res.text();
      for (const marker of RAW_MARKERS) expect(html.includes(marker), `${path} contains ${marker}`).toBe(false);
    }
  });
});

afterAll(() => {
  if (report) console.log(`hostile corpus: ${total} cases, ${report.serverErrors.length} 5xx`);
});
