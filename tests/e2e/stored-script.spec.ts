// Stored script never runs: every field a person types that other people later read holds script in one of its
// usual disguises; every page that shows it, opened as each role who reads it, must show the text literally,
// run nothing, and make the Content-Security-Policy catch nothing (a caught attempt would still mean our own
// markup tried). The sheet viewer must still draw under that policy.
import type { Page } from "@playwright/test";
import { ProjectMember, User } from "../../db/models";
import { PASSWORD } from "../support/factory";
import { waitForMail } from "../support/mail";
import { makeWorld, TYPED_FIELDS, type TypedField, type World } from "../support/screens";
import { expect, signIn, test, uniqueEmail } from "./fixtures";

const PAYLOADS = [
  `<script>window.__hostile=1</script>`,
  `<img src=x onerror="window.__hostile=2">`,
  `"><svg onload=window.__hostile=3>`,
  `<a href="javascript:window.__hostile=5">open</a>`,
];
// Fields with room for it carry every payload at once; short ones take turns, so each payload is in several.
const ROOMY = new Set<TypedField>(["infoRequest", "noticeProperty", "noticeFinding", "noticeRule", "siteAddress", "projectDescription", "drawingDescription", "transmittalReason", "siteConstraint", "proposal", "comment", "callout", "reasoning", "condition", "installationNote", "calculationTitle"]);
const hostile = (f: TypedField) => `${ROOMY.has(f) ? PAYLOADS.join(" ") : PAYLOADS[TYPED_FIELDS.indexOf(f) % PAYLOADS.length]} ${f}`;

type Who = "manager" | "architect" | "engineer" | "site_plumber" | "nobody";
interface Reading {
  who: Who;
  path: (w: World) => string;
  /** Fields whose text this page shows to this reader. */
  shows: TypedField[];
  ready?: (page: Page) => Promise<void>;
}

const p = (w: World) => `/projects/${w.projectId}`;
const names: TypedField[] = ["managerName", "architectName", "engineerName", "plumberName"];
const request: TypedField[] = ["requestTitle", "clauseRef", "siteConstraint", "proposal", "measurementName"];

const READINGS: Reading[] = [
  { who: "manager", path: () => "/projects", shows: ["projectName", "siteAddress"] },
  { who: "manager", path: p, shows: ["projectName", "siteAddress"] },
  { who: "manager", path: (w) => `${p(w)}/members`, shows: ["projectName", ...names] },
  { who: "manager", path: (w) => `${p(w)}/members/${w.engineerMemberId}/verify`, shows: ["engineerName"] },
  { who: "manager", path: (w) => `${p(w)}/requests`, shows: ["requestTitle"] },
  { who: "architect", path: (w) => `${p(w)}/drawings`, shows: ["drawingTitle"] },
  { who: "architect", path: (w) => `${p(w)}/drawings/${w.drawingId}`, shows: ["drawingTitle"], ready: viewerDraws },
  { who: "architect", path: (w) => `${p(w)}/drawings/${w.drawingId}/compare`, shows: ["sheetText"], ready: async (page) => { await expect(page.getByTestId("compare-overlay")).toBeVisible({ timeout: 30_000 }); } },
  { who: "architect", path: (w) => `${p(w)}/transmittals`, shows: ["transmittalReason"] },
  { who: "site_plumber", path: (w) => `${p(w)}/transmittals`, shows: ["transmittalReason"] },
  { who: "site_plumber", path: (w) => `${p(w)}/transmittals/${w.transmittalId}`, shows: ["transmittalReason", "drawingTitle", "architectName"] },
  { who: "engineer", path: () => "/requests", shows: ["requestTitle", "projectName"] },
  { who: "engineer", path: (w) => `${p(w)}/requests/${w.requests.inReview}`, shows: [...request, "comment", "plumberName"] },
  { who: "site_plumber", path: (w) => `${p(w)}/requests/${w.requests.inReview}`, shows: [...request, "comment"] },
  { who: "engineer", path: (w) => `${p(w)}/requests/${w.requests.inReview}/review`, shows: [...request] },
  { who: "site_plumber", path: (w) => `${p(w)}/requests/${w.requests.inReview}/sheet`, shows: ["engineerName"], ready: async (page) => {
    // The list shows a callout's first 40 characters; the canvas draws the rest.
    await expect(page.getByTestId("markup-list")).toContainText(hostile("callout").slice(0, 40), { timeout: 20_000 });
  } },
  { who: "site_plumber", path: (w) => `${p(w)}/requests/${w.requests.decided}`, shows: [...request, "comment"] },
  { who: "site_plumber", path: (w) => `${p(w)}/requests/${w.requests.decided}/review`, shows: ["requestTitle", "reasoning", "condition"] },
  { who: "engineer", path: (w) => `${p(w)}/requests/${w.requests.decided}/sign`, shows: ["requestTitle", "siteConstraint", "proposal", "reasoning", "condition"] },
  { who: "site_plumber", path: (w) => `${p(w)}/approvals/${w.approvalId}`, shows: ["requestTitle", "condition", "installationNote"] },
  { who: "site_plumber", path: (w) => `${p(w)}/site`, shows: ["requestTitle", "condition"] },
  { who: "manager", path: (w) => `${p(w)}/site`, shows: ["requestTitle", "condition"] },
  { who: "manager", path: (w) => `${p(w)}/notices`, shows: ["noticeOwner", "noticeProperty"] },
  { who: "engineer", path: (w) => `${p(w)}/calculations`, shows: ["calculationTitle"] },
  { who: "engineer", path: (w) => `${p(w)}/calculations/${w.calculationId}`, shows: ["calculationTitle"] },
  { who: "nobody", path: (w) => `/verify/${w.verifyCode}`, shows: ["engineerName", "registrationBody"] },
];

async function viewerDraws(page: Page) {
  const canvas = page.getByTestId("viewer").locator(".react-pdf__Page__canvas").first();
  await expect(canvas).toBeVisible({ timeout: 20_000 });
  // Drawn, not merely placed: some pixel of the sheet's ink is dark.
  await expect.poll(() => canvas.evaluate((c: HTMLCanvasElement) => {
    const d = c.getContext("2d")!.getImageData(0, 0, c.width, c.height).data;
    for (let i = 0; i < d.length; i += 4) if (d[i]! < 100 && d[i + 3]! > 0) return true;
    return false;
  }), { timeout: 20_000 }).toBe(true);
  await expect(page.getByTestId("viewer").locator(".react-pdf__Page__textContent").first()).toContainText(hostile("sheetText"), { timeout: 20_000 });
}

/** Each new document reports what the policy blocked into window.__csp, before any of the page's own script. */
async function watchPolicy(page: Page) {
  const caught: string[] = [];
  page.on("console", (m) => { if (/Content Security Policy|Refused to/i.test(m.text())) caught.push(m.text()); });
  await page.addInitScript(() => {
    (window as unknown as { __csp: string[] }).__csp = [];
    document.addEventListener("securitypolicyviolation", (e) => (window as unknown as { __csp: string[] }).__csp.push(`${e.violatedDirective} ${e.blockedURI} ${e.sample} at ${e.sourceFile}:${e.lineNumber}:${e.columnNumber}`));
  });
  return caught;
}

async function expectNothingRan(page: Page, where: string) {
  // Give a handler that slipped through a moment to fire.
  await page.waitForTimeout(200);
  const seen = await page.evaluate(() => ({
    hostile: (window as unknown as { __hostile?: unknown }).__hostile,
    csp: (window as unknown as { __csp?: string[] }).__csp ?? [],
    elements: [
      ...[...document.querySelectorAll("img[src='x'], svg[onload], [onerror], [onload], a[href^='javascript:' i]")].map((e) => e.outerHTML.slice(0, 120)),
      ...[...document.scripts].filter((s) => s.text.trim().startsWith("window.__hostile")).map((s) => s.outerHTML),
    ],
  }));
  expect(seen.hostile, `${where}: window.__hostile`).toBeUndefined();
  expect(seen.elements, `${where}: elements made from typed text`).toEqual([]);
  expect(seen.csp, `${where}: CSP violations`).toEqual([]);
}

test("typed script is shown as text and never runs, on every page that shows it", async ({ page, browser }) => {
  test.setTimeout(420_000);
  const caughtOnSignUp = await watchPolicy(page);
  // A person signs up with script for a name, through the form; later they join the project.
  const email = uniqueEmail("hostile");
  const signedUpName = `${PAYLOADS[1]} signed up`;
  await page.goto("/sign-up");
  await page.getByLabel("Full name").fill(signedUpName);
  await page.getByLabel("E-mail address").fill(email);
  await page.getByLabel("Password").fill(PASSWORD);
  await page.getByLabel("Profession").selectOption("plumber");
  await page.getByRole("button", { name: "Create account" }).click();
  await expect(page.getByRole("heading", { name: "My projects" })).toBeVisible();
  await expect(page.getByRole("navigation", { name: "Main" }).getByText(signedUpName)).toBeAttached();
  await expectNothingRan(page, "after sign-up");
  await page.goto("/profile");
  await expect(page.getByLabel("Full name")).toHaveValue(signedUpName);
  await expectNothingRan(page, "profile");
  expect(caughtOnSignUp).toEqual([]);

  const world = await makeWorld(hostile);
  const joined = (await User.findOne({ where: { email } }))!;
  await ProjectMember.create({ projectId: world.projectId, userId: joined.id, role: "site_plumber" });
  // The engineer's question reaches the plumber only by e-mail: its HTML part carries it escaped.
  const asked = await waitForMail(world.users.site_plumber.email, /more information needed/);
  expect(asked.text).toContain(hostile("infoRequest"));
  expect(asked.html).not.toContain("<script>window.__hostile");
  expect(asked.html).toContain("&lt;script&gt;window.__hostile=1&lt;/script&gt;");
  // One browser per reader, each watched for console errors and for what the policy caught.
  const readers = new Map<Who, { page: Page; problems: string[]; caught: string[] }>();
  for (const reading of READINGS) {
    if (!readers.has(reading.who)) {
      const context = await browser.newContext();
      const readerPage = await context.newPage();
      const problems: string[] = [];
      readerPage.on("console", (m) => { if (m.type() === "error" && !/status of 4\d\d/.test(m.text())) problems.push(m.text()); });
      readerPage.on("pageerror", (e) => problems.push(e.message));
      const caught = await watchPolicy(readerPage);
      if (reading.who !== "nobody") await signIn(readerPage, world.users[reading.who].email, PASSWORD);
      readers.set(reading.who, { page: readerPage, problems, caught });
    }
    const { page: reader, problems, caught } = readers.get(reading.who)!;
    const path = reading.path(world);
    const where = `${path} as ${reading.who}`;
    const res = await reader.goto(path);
    expect(res?.status(), where).toBe(200);
    await reader.waitForLoadState("networkidle");
    await reading.ready?.(reader);
    for (const field of reading.shows) await expect.soft(reader.getByText(hostile(field)).filter({ visible: true }).first(), `${where}: ${field} shown literally`).toBeVisible({ timeout: 3_000 });
    await expectNothingRan(reader, where);
    expect(caught, `${where}: CSP messages`).toEqual([]);
    expect(problems, `${where}: console errors`).toEqual([]);
  }

  // Mentioning someone offers member names as typed, as text.
  const engineer = readers.get("engineer")!.page;
  await engineer.goto(`/projects/${world.projectId}/requests/${world.requests.inReview}`);
  await engineer.getByLabel("Add a message").pressSequentially(`@${hostile("engineerName").slice(0, 5)}`);
  await expect(engineer.getByRole("listbox", { name: "Mention a member" })).toContainText(hostile("engineerName"));
  await expectNothingRan(engineer, "mention suggestions");
  // The member who signed up through the form, on the manager's members page.
  const manager = readers.get("manager")!.page;
  await manager.goto(`/projects/${world.projectId}/members`);
  await expect(manager.getByText(signedUpName).filter({ visible: true }).first()).toBeVisible();
  await expectNothingRan(manager, "members, with the signed-up member");
  for (const reader of readers.values()) await reader.page.context().close();
});
