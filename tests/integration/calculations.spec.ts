// Calculations over real HTTP against the built app and PostgreSQL: every calculator through the API (and
// the 422 that names impossible input by field), saving with the server's own recomputation, reopening,
// comparing, the printable sheet, and the access matrix for every calculation route.
import { execFileSync } from "node:child_process";
import { mkdtempSync, writeFileSync } from "node:fs";
import { tmpdir } from "node:os";
import { join } from "node:path";
import { beforeAll, describe, expect, it } from "vitest";
import { AuditEvent, Calculation } from "../../db/models";
import { EXAMPLES } from "../../app/calculations/examples";
import { KINDS, type CalculationKind } from "../../app/calculations/kinds";
import { CAUTION, ENGINE_VERSION } from "../../app/engineering";
import { can, ROLES, type Action, type Role } from "../../app/projects/permissions";
import { makeProjectTeam, PASSWORD } from "../support/factory";
import { Client, pageText } from "../support/http";

type Caller = Role | "outsider" | "signed_out";
let team: Awaited<ReturnType<typeof makeProjectTeam>>;
const as = new Map<Caller, Client>();
const projectId = () => team.project.id;

beforeAll(async () => {
  team = await makeProjectTeam();
  for (const role of ROLES) {
    const c = new Client();
    await c.signIn(team.users[role].email, PASSWORD);
    as.set(role, c);
  }
  const outsider = new Client();
  await outsider.signIn(team.outsider.email, PASSWORD);
  as.set("outsider", outsider);
  as.set("signed_out", new Client());
});

async function postJson(who: Caller, path: string, body: unknown) {
  const res = await as.get(who)!.request(path, { method: "POST", headers: { "content-type": "application/json", accept: "application/json" }, body: JSON.stringify(body) });
  const text = await res.text();
  let json: any = null;
  try {
    json = JSON.parse(text);
  } catch {
    json = { text };
  }
  return { status: res.status, body: json };
}

const example = (kind: CalculationKind): any => structuredClone(EXAMPLES[kind]);
const paths = (body: any) => (body.issues as { path: (string | number)[] }[]).map((i) => i.path.join("."));

async function save(kind: CalculationKind, title: string, inputs: unknown, extra: Record<string, unknown> = {}) {
  const res = await postJson("engineer", `/api/projects/${projectId()}/calculations`, { kind, title, inputs, ...extra });
  expect(res.status, JSON.stringify(res.body)).toBe(201);
  return res.body.calculation as { id: string; inputs: any; outputs: any; engineVersion: string; createdBy: { name: string } };
}

describe("POST /api/calculations/:kind", () => {
  it.each(KINDS)("runs %s on its example and answers JSON with the caution", async (kind) => {
    const res = await postJson("site_plumber", `/api/calculations/${kind}`, example(kind));
    expect(res.status, JSON.stringify(res.body)).toBe(200);
    expect(res.body.kind).toBe(kind);
    expect(res.body.engineVersion).toBe(ENGINE_VERSION);
    expect(res.body.output.caution).toBe(CAUTION);
    expect(typeof res.body.output.ok).toBe("boolean");
  });

  it("computes the balance example: the shower mixer passes, with hot and cold profiles", async () => {
    const res = await postJson("engineer", "/api/calculations/balance", example("balance"));
    const mp = res.body.output.mixingPoints[0];
    expect(mp).toMatchObject({ id: "shower", ok: true });
    expect(mp.differencePercent).toBeLessThan(20);
    expect(mp.hotProfile.length).toBeGreaterThan(2);
    expect(mp.coldProfile.length).toBeGreaterThan(2);
  });

  it("fails a mixing point when the hot run is long and small, and suggests the change that fixes it", async () => {
    const input = example("balance");
    const hot = input.network.segments.find((s: any) => s.id === "hot-run");
    Object.assign(hot, { pipeId: "cu-c0-15", lengthM: 40 });
    const res = await postJson("engineer", "/api/calculations/balance", input);
    expect(res.status).toBe(200);
    expect(res.body.output.mixingPoints[0].ok).toBe(false);
    expect(res.body.output.findings.map((f: any) => f.code)).toContain("pressure-imbalance");
    expect(res.body.output.suggestion.resolved).toBe(true);
    expect(res.body.output.suggestion.changes.map((c: any) => c.segmentId)).toContain("hot-run");
  });

  it("names a negative length as such, with its field path", async () => {
    const input = example("balance");
    input.network.segments[2].lengthM = -5;
    const res = await postJson("engineer", "/api/calculations/balance", input);
    expect(res.status).toBe(422);
    expect(res.body).toMatchObject({ status: 422, message: expect.stringContaining("problem") });
    const issue = res.body.issues.find((i: any) => i.path.join(".") === "network.segments.2.lengthM");
    expect(issue.message).toMatch(/cannot be negative/);
  });

  it("refuses a PRV set above the supply: a PRV can only reduce pressure", async () => {
    const input = example("balance");
    input.network.supply.prv.settingKpa = 650;
    const res = await postJson("engineer", "/api/calculations/balance", input);
    expect(res.status).toBe(422);
    const issue = res.body.issues.find((i: any) => i.path.join(".") === "network.supply.prv.settingKpa");
    expect(issue.message).toMatch(/only reduce pressure/);
  });

  it("refuses wrong types, field by field", async () => {
    const res = await postJson("engineer", "/api/calculations/segment", { ...example("segment"), flowLps: "lots", tempC: null });
    expect(res.status).toBe(422);
    expect(paths(res.body)).toEqual(expect.arrayContaining(["flowLps", "tempC"]));
    expect(res.body.issues.find((i: any) => i.path[0] === "flowLps").message).toBe("Flow must be a number");
  });

  it("catches what only the engine can see (an unknown pipe, a tree with a loop) with paths too", async () => {
    const input = example("balance");
    input.network.segments[0].pipeId = "no-such-pipe";
    const res = await postJson("engineer", "/api/calculations/balance", input);
    expect(res.status).toBe(422);
    expect(paths(res.body)).toContain("network.segments.0.pipeId");
  });

  it("names impossible storage and discharge input", async () => {
    const storage = example("storage");
    storage.heating.toC = 10;
    const a = await postJson("engineer", "/api/calculations/storage", storage);
    expect(a.status).toBe(422);
    expect(a.body.issues.find((i: any) => i.path.join(".") === "heating.toC").message).toMatch(/cannot be below/);
    const discharge = example("discharge");
    discharge.bends[0].angleDeg = 270;
    const b = await postJson("engineer", "/api/calculations/discharge", discharge);
    expect(b.status).toBe(422);
    expect(paths(b.body)).toContain("bends.0.angleDeg");
  });

  it("answers 400 for a body that is not JSON, 404 for an unknown kind, 401 when signed out", async () => {
    const res = await as.get("engineer")!.request("/api/calculations/balance", { method: "POST", headers: { "content-type": "application/json" }, body: "{nope" });
    expect(res.status).toBe(400);
    expect((await postJson("engineer", "/api/calculations/perpetual-motion", {})).status).toBe(404);
    expect((await postJson("signed_out", "/api/calculations/balance", example("balance"))).status).toBe(401);
  });
});

describe("saved calculations", () => {
  it("recomputes on the server and ignores the outputs a caller sends", async () => {
    const forged = { ok: true, findings: [], caution: "trust me", mixingPoints: [{ id: "shower", ok: true, differencePercent: 0 }] };
    const input = example("balance");
    Object.assign(input.network.segments.find((s: any) => s.id === "hot-run"), { pipeId: "cu-c0-15", lengthM: 40 });
    const saved = await save("balance", "Long hot run", input, { outputs: forged, engineVersion: "0.0.1" });
    expect(saved.outputs.ok).toBe(false);
    expect(saved.outputs.caution).toBe(CAUTION);
    expect(saved.outputs.mixingPoints[0].ok).toBe(false);
    expect(saved.engineVersion).toBe(ENGINE_VERSION);
    expect(saved.createdBy.name).toBe("Test engineer");
    const row = await Calculation.findByPk(saved.id);
    expect((row!.outputs as any).caution).toBe(CAUTION);
    expect(await AuditEvent.count({ where: { subjectId: saved.id, action: "calculation.saved" } })).toBe(1);
  });

  it("refuses to save bad input with paths under inputs, and stores nothing", async () => {
    const before = await Calculation.count({ where: { projectId: projectId() } });
    const input = example("balance");
    input.network.segments[1].lengthM = -1;
    const res = await postJson("engineer", `/api/projects/${projectId()}/calculations`, { kind: "balance", title: "", inputs: input });
    expect(res.status).toBe(422);
    expect(paths(res.body)).toEqual(expect.arrayContaining(["title", "inputs.network.segments.1.lengthM"]));
    expect(await Calculation.count({ where: { projectId: projectId() } })).toBe(before);
  });

  it("reopens through the API and the page, and lists by kind", async () => {
    const saved = await save("storage", "Flat 4 geyser", example("storage"));
    const one = await as.get("site_plumber")!.json(`/api/projects/${projectId()}/calculations/${saved.id}`);
    expect(one.status).toBe(200);
    expect(one.body.calculation.inputs).toEqual(example("storage"));
    const list = await as.get("architect")!.json(`/api/projects/${projectId()}/calculations?kind=storage`);
    expect(list.body.calculations.map((c: any) => c.id)).toContain(saved.id);
    expect(list.body.calculations.every((c: any) => c.kind === "storage")).toBe(true);
    const page = await as.get("engineer")!.get(`/projects/${projectId()}/calculations/${saved.id}`);
    expect(page.status).toBe(200);
    const html = await pageText(page);
    expect(html).toContain("Flat 4 geyser");
    expect(html).toContain("registered professional engineer");
    expect((await as.get("outsider")!.json(`/api/projects/${team.otherProject.id}/calculations/${saved.id}`)).status).toBe(404);
  });

  it("saves from the page form, recomputing there too", async () => {
    const input = example("valves");
    input.expansionValveKpa = 600;
    const res = await as.get("engineer")!.post(`/projects/${projectId()}/calculations/new/valves`, { intent: "save", title: "Mismatched pair", inputs: JSON.stringify(input), outputs: JSON.stringify({ ok: true }) });
    expect(res.status).toBe(302);
    const id = new URL(res.headers.get("location")!, "http://x").pathname.split("/").pop()!;
    const row = await Calculation.findByPk(id);
    expect(row!.title).toBe("Mismatched pair");
    expect((row!.outputs as any).ok).toBe(false);
    const bad = await as.get("engineer")!.post(`/projects/${projectId()}/calculations/new/valves`, { intent: "save", title: "Broken", inputs: JSON.stringify({ ...input, heaterRatingKpa: -1 }) });
    expect(bad.status).toBe(422);
  });

  it("compares two of the same kind, marking what changed", async () => {
    const a = await save("deadleg", "Bathroom as drawn", example("deadleg"));
    const changed = example("deadleg");
    changed.deadLeg.legs[0].lengthM = 14;
    const b = await save("deadleg", "Bathroom via the passage", changed);
    const page = await as.get("site_plumber")!.get(`/projects/${projectId()}/calculations/compare?a=${a.id}&b=${b.id}`);
    expect(page.status).toBe(200);
    const html = await pageText(page);
    expect(html).toContain("Bathroom via the passage");
    expect(html).toMatch(/data-state="changed"[^>]*data-key="deadLeg.legs\[1\].lengthM"|data-key="deadLeg.legs\[1\].lengthM"[^>]*data-state="changed"/);
    expect(html).toMatch(/data-key="seconds"[^>]*data-state="changed"|data-state="changed"[^>]*data-key="seconds"/);
    const other = await save("storage", "Different kind", example("storage"));
    expect((await as.get("engineer")!.get(`/projects/${projectId()}/calculations/compare?a=${a.id}&b=${other.id}`)).status).toBe(400);
  });
});

describe("calculation sheet (PDF)", () => {
  it("prints inputs, method, results, findings, version, date, who ran it and the caution on one page", async () => {
    const input = example("balance");
    Object.assign(input.network.segments.find((s: any) => s.id === "hot-run"), { pipeId: "cu-c0-15", lengthM: 40 });
    const saved = await save("balance", "Sheet check", input);
    const res = await as.get("site_plumber")!.get(`/projects/${projectId()}/calculations/${saved.id}/sheet.pdf`);
    expect(res.status).toBe(200);
    expect(res.headers.get("content-type")).toBe("application/pdf");
    const bytes = Buffer.from(await res.arrayBuffer());
    expect(bytes.subarray(0, 5).toString()).toBe("%PDF-");
    const dir = mkdtempSync(join(tmpdir(), "sheet-"));
    writeFileSync(join(dir, "s.pdf"), bytes);
    const info = execFileSync("pdfinfo", [join(dir, "s.pdf")]).toString();
    expect(info).toMatch(/Pages:\s+1\b/);
    // Set in the product's own face, embedded, like every Countersign PDF.
    expect(execFileSync("pdffonts", [join(dir, "s.pdf")]).toString()).toMatch(/InterTight.*\byes\b/i);
    const text = execFileSync("pdftotext", ["-layout", join(dir, "s.pdf"), "-"]).toString().replace(/\s+/g, " ");
    expect(text).toContain("Sheet check");
    expect(text).toContain("Pressure balance");
    expect(text).toContain("hot-run"); // an input row
    expect(text).toContain("cu-c0-15");
    expect(text).toMatch(/Darcy.Weisbach/);
    expect(text).toMatch(/Colebrook.White/);
    expect(text).toContain("IAPWS");
    expect(text).toMatch(/shower.*FAIL/i); // the result
    expect(text).toMatch(/differ by/); // a finding
    expect(text).toContain(`Engine version: ${ENGINE_VERSION}`);
    expect(text).toContain("Test engineer");
    expect(text).toContain("registered professional engineer");
    expect(text).toContain("licensed practice");
  });

  it.each(KINDS.filter((k) => k !== "balance"))("prints a %s sheet", async (kind) => {
    const saved = await save(kind, `Sheet ${kind}`, example(kind));
    const res = await as.get("engineer")!.get(`/projects/${projectId()}/calculations/${saved.id}/sheet.pdf`);
    expect(res.status).toBe(200);
    const dir = mkdtempSync(join(tmpdir(), "sheet-"));
    writeFileSync(join(dir, "s.pdf"), Buffer.from(await res.arrayBuffer()));
    const text = execFileSync("pdftotext", [join(dir, "s.pdf"), "-"]).toString().replace(/\s+/g, " ");
    expect(text).toContain(`Sheet ${kind}`);
    expect(text).toContain("registered professional engineer");
  });
});

describe("access to every calculation route", () => {
  interface Case {
    name: string;
    needs: Action | "signedIn";
    api?: boolean;
    send: (c: Client, ids: { calc: string }) => Promise<Response>;
  }
  let calc: string;
  beforeAll(async () => {
    calc = (await save("vacuum", "Access matrix", example("vacuum"))).id;
  });
  const json = (body: unknown) => ({ method: "POST", headers: { "content-type": "application/json" }, body: JSON.stringify(body) });
  const CASES: Case[] = [
    { name: "GET calculations list page", needs: "calculations.run", send: (c) => c.get(`/projects/${projectId()}/calculations`) },
    { name: "GET new calculation page", needs: "calculations.run", send: (c) => c.get(`/projects/${projectId()}/calculations/new/balance`) },
    { name: "POST save from the new page", needs: "calculations.save", send: (c) => c.post(`/projects/${projectId()}/calculations/new/vacuum`, { intent: "save", title: "", inputs: "{}" }) },
    { name: "GET saved calculation page", needs: "calculations.run", send: (c, i) => c.get(`/projects/${projectId()}/calculations/${i.calc}`) },
    { name: "POST save from the saved page", needs: "calculations.save", send: (c, i) => c.post(`/projects/${projectId()}/calculations/${i.calc}`, { intent: "save", title: "", inputs: "{}" }) },
    { name: "GET compare page", needs: "calculations.run", send: (c, i) => c.get(`/projects/${projectId()}/calculations/compare?a=${i.calc}&b=${i.calc}`) },
    { name: "GET sheet PDF", needs: "calculations.run", send: (c, i) => c.get(`/projects/${projectId()}/calculations/${i.calc}/sheet.pdf`) },
    { name: "POST /api/calculations/:kind", needs: "signedIn", api: true, send: (c) => c.request("/api/calculations/vacuum", json(example("vacuum"))) },
    { name: "GET /api/projects/:id/calculations", needs: "calculations.run", api: true, send: (c) => c.get(`/api/projects/${projectId()}/calculations`) },
    { name: "POST /api/projects/:id/calculations", needs: "calculations.save", api: true, send: (c) => c.request(`/api/projects/${projectId()}/calculations`, json({ kind: "vacuum", title: "Matrix", inputs: example("vacuum") })) },
    { name: "GET /api/projects/:id/calculations/:id", needs: "calculations.run", api: true, send: (c, i) => c.get(`/api/projects/${projectId()}/calculations/${i.calc}`) },
  ];
  const CALLERS: Caller[] = [...ROLES, "outsider", "signed_out"];
  const expected = (c: Case, caller: Caller) => {
    if (caller === "signed_out") return "sign-in";
    if (c.needs === "signedIn") return "ok";
    if (caller === "outsider") return "forbidden";
    return can(caller, c.needs) ? "ok" : "forbidden";
  };
  const outcome = (c: Case, res: Response) => {
    if (res.status === 403) return "forbidden";
    if (c.api && res.status === 401) return "sign-in";
    if (res.status === 302 && res.headers.get("location")?.startsWith("/sign-in")) return "sign-in";
    if ([200, 201, 302, 400, 422].includes(res.status)) return "ok";
    return `status ${res.status}`;
  };
  describe.each(CASES.map((c) => [c.name, c] as const))("%s", (_name, c) => {
    it.each(CALLERS)("as %s", async (caller) => {
      const res = await c.send(as.get(caller)!, { calc });
      expect(outcome(c, res)).toBe(expected(c, caller));
    });
  });
});
