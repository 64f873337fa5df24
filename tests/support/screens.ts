// One project with something on every screen, built the way people build it (forms and the API over HTTP as
// each role), for browser tests that visit every page: a register with two revisions of a processed sheet, a
// transmittal, a draft request, one in review with a comment and a markup, one decided and waiting to be signed,
// one signed and installed, and a saved calculation. Every text a person types comes from `typed`, so a test can
// fill them with ordinary words or with hostile markup.
import { verifyRegistration } from "../../app/approvals/verification.server";
import { EXAMPLES } from "../../app/calculations/examples";
import { Approval, DeviationRequest, DrawingRevision, ProjectMember } from "../../db/models";
import { makeSheet, until, upload } from "./drawings";
import { makeUser, PASSWORD } from "./factory";
import { Client, pageText } from "./http";
import { api, makePhoto, principles } from "./requests";

/** Every field a person types that other people later read. */
export const TYPED_FIELDS = [
  "managerName", "architectName", "engineerName", "plumberName",
  "projectName", "siteAddress", "clientName", "projectDescription",
  "drawingTitle", "drawingDescription", "sheetText", "transmittalReason",
  "requestTitle", "clauseRef", "siteConstraint", "proposal", "measurementName",
  "infoRequest", "comment", "callout", "reasoning", "condition", "registrationBody", "installationNote", "calculationTitle",
  "noticeOwner", "noticeProperty", "noticeFinding", "noticeRule",
] as const;
export type TypedField = (typeof TYPED_FIELDS)[number];

const ORDINARY: Record<TypedField, string> = {
  managerName: "Thandi Testmanager", architectName: "Ari Testarchitect", engineerName: "Eli Testengineer", plumberName: "Pieter Testplumber",
  projectName: "Harbour View Units", siteAddress: "12 Example Road, Testville", clientName: "Example Body Corporate",
  projectDescription: "Six units with flat roofs.", drawingTitle: "Roof plumbing", drawingDescription: "Geyser positions and discharge routes.", sheetText: "Geyser positions",
  transmittalReason: "For review of the discharge routes.", requestTitle: "Unit 2 discharge run on the flat roof", clauseRef: "discharge pipe clause (test)",
  siteConstraint: "The flat concrete roof leaves no route for the discharge pipe within the usual run.",
  proposal: "Run a 22 mm discharge pipe 6 m along the parapet to the gutter outlet, with two 45° bends.", measurementName: "Discharge run",
  infoRequest: "What size will the pipe be from the valve outlet?", comment: "Which side of the parapet will the pipe run?", callout: "Reroute along the parapet",
  reasoning: "28 mm from the valve outlet keeps the run within its limit.", condition: "Insulate the exposed run.", registrationBody: "Test board",
  installationNote: "Installed as the marked-up sheet shows.", calculationTitle: "Shower balance",
  noticeOwner: "Sam Testowner", noticeProperty: "Unit 4, Harbour View Units", noticeFinding: "No vacuum breaker on the hot outlet.", noticeRule: "vacuum breaker clause (test)",
};

export type Typed = (field: TypedField) => string;
export const ordinary: Typed = (f) => ORDINARY[f];

let n = 0;

async function expectStatus(what: string, res: { status: number; body?: unknown } | Response, ...ok: number[]) {
  if (ok.includes(res.status)) return;
  const body = res instanceof Response ? await res.text() : JSON.stringify(res.body);
  throw new Error(`${what}: ${res.status} ${body.slice(0, 400)}`);
}

export async function makeWorld(typed: Typed = ordinary) {
  const tag = `${Date.now().toString(36)}${n++}`;
  const users = {
    manager: await makeUser({ name: typed("managerName"), profession: "manager" }),
    architect: await makeUser({ name: typed("architectName"), profession: "architect" }),
    engineer: await makeUser({ name: typed("engineerName"), profession: "engineer" }),
    site_plumber: await makeUser({ name: typed("plumberName"), profession: "plumber" }),
  };
  const as = { manager: new Client(), architect: new Client(), engineer: new Client(), site_plumber: new Client() };
  for (const role of Object.keys(as) as (keyof typeof as)[]) await as[role].signIn(users[role].email, PASSWORD);

  // The manager starts the project through its form and adds the team.
  const created = await as.manager.post("/projects/new", { name: typed("projectName"), siteAddress: typed("siteAddress"), clientName: typed("clientName"), description: typed("projectDescription") });
  await expectStatus("create project", created, 302);
  const projectId = created.headers.get("location")!.split("/").pop()!;
  for (const role of ["architect", "engineer", "site_plumber"] as const) await ProjectMember.create({ projectId, userId: users[role].id, role });
  const engineerMember = (await ProjectMember.findOne({ where: { projectId, userId: users.engineer.id } }))!;
  await users.engineer.update({ registrationNumber: `REG-${tag}`.slice(0, 40), registrationBody: typed("registrationBody"), registrationState: "unverified" });
  await verifyRegistration(users.manager.id, projectId, engineerMember.id, { registrationNumber: `REG-${tag}`.slice(0, 40), registrationBody: typed("registrationBody"), checkedOn: new Date().toISOString().slice(0, 10) });

  // The architect uploads two revisions of one sheet (for the viewer and compare) and issues a transmittal.
  const sheetNumber = `S-${tag}`.toUpperCase();
  const fields = { sheetNumber, title: typed("drawingTitle"), description: typed("drawingDescription"), scaleText: "1:50" };
  const first = await upload(as.architect, projectId, await makeSheet({ lines: ["Hot water supply DN22 to geyser", typed("sheetText")], tag }), fields);
  await expectStatus("upload P1", first, 201);
  const second = await upload(as.architect, projectId, await makeSheet({ lines: ["Hot water supply DN28 insulated to geyser", typed("sheetText")], boxes: [{ x: 700, y: 200, w: 200, h: 100 }], tag }), fields);
  await expectStatus("upload P2", second, 201);
  const revisionId = second.body.stored[0].revisionId as string;
  const drawingId = (await DrawingRevision.findByPk(revisionId))!.drawingId as string;
  for (const r of [first, second]) {
    const id = r.body.stored[0].revisionId as string;
    await until(async () => (await DrawingRevision.findByPk(id))?.processing === "done", 30_000, "the sheet to be processed");
  }
  const issue = new URLSearchParams({ intent: "issue", revisionIds: revisionId, status: "for_review", reason: typed("transmittalReason") });
  for (const role of ["engineer", "site_plumber"] as const) issue.append("recipientIds", users[role].id);
  const issued = await as.architect.request(`/projects/${projectId}/transmittals`, { method: "POST", body: issue });
  await expectStatus("issue transmittal", issued, 302);
  const transmittalId = issued.headers.get("location")!.split("/").pop()!;

  // Requests, by the plumber, moved along by the engineer.
  const content = (title: string) => ({
    title, provision: "discharge", clauseRef: typed("clauseRef"), siteConstraint: typed("siteConstraint"), proposal: typed("proposal"),
    measurements: [{ kind: "lengthM", name: typed("measurementName"), value: 6 }, { kind: "bendCount", name: "Bends", value: 2 }],
  });
  const requests: Record<"draft" | "inReview" | "decided" | "signed", string> = {} as never;
  for (const which of ["draft", "inReview", "decided", "signed"] as const) {
    const r = await api(as.site_plumber, "POST", `/api/projects/${projectId}/requests`, content(typed("requestTitle")));
    await expectStatus(`create ${which} request`, r, 201);
    requests[which] = r.body.request.id;
  }
  const move = async (who: Client, id: string, action: string, extra: Record<string, unknown> = {}) => {
    const current = (await DeviationRequest.findByPk(id))!;
    const res = await api(who, "POST", `/api/projects/${projectId}/requests/${id}/transitions`, { action, lockVersion: current.lockVersion, ...extra });
    await expectStatus(action, res, 200);
  };
  const judged = principles();
  judged[2] = { principleId: "safe_discharge", outcome: "maintained", reasoning: typed("reasoning") };
  for (const id of [requests.inReview, requests.decided, requests.signed]) {
    await move(as.site_plumber, id, "submit");
    await move(as.engineer, id, "start_review");
    const said = await api(as.site_plumber, "POST", `/api/projects/${projectId}/requests/${id}/comments`, { body: typed("comment") });
    await expectStatus("comment", said, 201);
    const marked = await api(as.engineer, "POST", `/api/projects/${projectId}/requests/${id}/markups`, {
      revisionId, page: 1, shape: { kind: "callout", points: [100, 100, 260, 160], text: typed("callout"), color: "#9a4a20", strokeWidthPt: 1.5 },
    });
    await expectStatus("markup", marked, 201);
  }
  // The engineer asks the plumber for more on one, who answers; it goes back into review.
  await move(as.engineer, requests.inReview, "request_info", { note: typed("infoRequest") });
  await move(as.site_plumber, requests.inReview, "resubmit");
  await move(as.engineer, requests.inReview, "start_review");
  for (const id of [requests.decided, requests.signed]) {
    await move(as.engineer, id, "decide", { outcome: "approved_with_conditions", principles: judged, conditions: [typed("condition")], restsOn: [revisionId] });
  }

  // The engineer signs one; the plumber records its installation.
  const signPage = await pageText(await as.engineer.get(`/projects/${projectId}/requests/${requests.signed}/sign`));
  const digest = signPage.match(/name="seenDigest" value="([0-9a-f]{64})"/)?.[1];
  if (!digest) throw new Error("no digest on the sign page");
  const signed = await as.engineer.post(`/projects/${projectId}/requests/${requests.signed}/sign`, { password: PASSWORD, seenDigest: digest, confirm: "on" });
  await expectStatus("sign", signed, 302);
  const approval = (await Approval.findOne({ where: { requestId: requests.signed } }))!;
  const installed = new FormData();
  installed.append("installedOn", new Date().toISOString().slice(0, 10));
  installed.append("note", typed("installationNote"));
  installed.append("photo", new Blob([await makePhoto(320, 240) as Uint8Array<ArrayBuffer>], { type: "image/jpeg" }), "installed.jpg");
  await expectStatus("record installation", await as.site_plumber.request(`/projects/${projectId}/approvals/${approval.id}`, { method: "POST", body: installed }), 302);

  // The plumber sends an owner a non-compliance notice found on another job.
  const notice = await as.site_plumber.post(`/projects/${projectId}/notices`, {
    ownerName: typed("noticeOwner"), ownerEmail: `owner-${tag}@test.example`, property: typed("noticeProperty"), inspectedOn: new Date().toISOString().slice(0, 10),
    "items[0].finding": typed("noticeFinding"), "items[0].rule": typed("noticeRule"), "items[0].ownerDecision": "correct_now",
  });
  await expectStatus("send notice", notice, 200);

  // A saved calculation.
  const calc = await api(as.engineer, "POST", `/api/projects/${projectId}/calculations`, { kind: "balance", title: typed("calculationTitle"), inputs: EXAMPLES.balance });
  await expectStatus("save calculation", calc, 201);

  return {
    users, projectId, drawingId, revisionId, transmittalId, requests, engineerMemberId: engineerMember.id,
    approvalId: approval.id, verifyCode: approval.verifyCode, calculationId: calc.body.calculation.id as string,
  };
}
export type World = Awaited<ReturnType<typeof makeWorld>>;
