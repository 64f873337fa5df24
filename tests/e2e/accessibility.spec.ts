// Every main screen, opened by the role that uses it, checked with axe against WCAG 2 A and AA: no serious or
// critical violation anywhere. The screens are data, so a failure names the screen and the rule.
import AxeBuilder from "@axe-core/playwright";
import type { Cookie, Page } from "@playwright/test";
import { KINDS } from "../../app/calculations/kinds";
import { PASSWORD } from "../support/factory";
import { Client } from "../support/http";
import { linkIn, waitForMail } from "../support/mail";
import { makeWorld, type World } from "../support/screens";
import { expect, signIn, test } from "./fixtures";

type Who = "manager" | "architect" | "engineer" | "site_plumber" | "nobody";

interface Screen {
  name: string;
  who: Who;
  path: (w: World, extra: { resetLink: string }) => string;
  /** What shows once the screen has finished drawing itself (client-only parts included), or the state to check. */
  ready?: (page: Page) => Promise<void>;
}

const p = (w: World) => `/projects/${w.projectId}`;
const canvasDrawn = async (page: Page) => {
  await expect(page.locator(".react-pdf__Page__canvas").first()).toBeVisible({ timeout: 20_000 });
};

const SCREENS: Screen[] = [
  { name: "sign-in", who: "nobody", path: () => "/sign-in" },
  {
    name: "sign-in, wrong password", who: "nobody", path: () => "/sign-in", ready: async (page) => {
      await page.getByLabel("E-mail address").fill("nobody-here@e2e.example");
      await page.getByLabel("Password").fill("wrong password");
      await page.getByRole("button", { name: "Sign in" }).click();
      await expect(page.getByRole("alert")).toContainText("do not match an account");
    },
  },
  { name: "sign-up", who: "nobody", path: () => "/sign-up" },
  { name: "reset request", who: "nobody", path: () => "/reset-password" },
  { name: "reset from the e-mailed link", who: "nobody", path: (_, x) => x.resetLink },
  { name: "public verification", who: "nobody", path: (w) => `/verify/${w.verifyCode}` },
  { name: "projects list", who: "manager", path: () => "/projects" },
  { name: "new project", who: "manager", path: () => "/projects/new" },
  {
    name: "new project, nothing filled in", who: "manager", path: () => "/projects/new", ready: async (page) => {
      await page.getByRole("button", { name: "Create project" }).click();
      await expect(page.getByText("Name the project.")).toBeVisible();
    },
  },
  { name: "project overview", who: "manager", path: p },
  { name: "members", who: "manager", path: (w) => `${p(w)}/members` },
  { name: "registration verification", who: "manager", path: (w) => `${p(w)}/members/${w.engineerMemberId}/verify` },
  { name: "settings", who: "manager", path: (w) => `${p(w)}/settings` },
  { name: "drawing register", who: "architect", path: (w) => `${p(w)}/drawings` },
  { name: "sheet viewer", who: "architect", path: (w) => `${p(w)}/drawings/${w.drawingId}`, ready: canvasDrawn },
  { name: "compare", who: "architect", path: (w) => `${p(w)}/drawings/${w.drawingId}/compare`, ready: async (page) => { await expect(page.getByTestId("compare-overlay")).toBeVisible({ timeout: 30_000 }); } },
  { name: "transmittals (issuing)", who: "architect", path: (w) => `${p(w)}/transmittals` },
  { name: "transmittal", who: "architect", path: (w) => `${p(w)}/transmittals/${w.transmittalId}` },
  { name: "transmittals (received)", who: "site_plumber", path: (w) => `${p(w)}/transmittals` },
  { name: "requests list (project)", who: "site_plumber", path: (w) => `${p(w)}/requests` },
  { name: "requests list (mine)", who: "engineer", path: () => "/requests" },
  { name: "new request", who: "site_plumber", path: (w) => `${p(w)}/requests/new` },
  { name: "request (plumber's edit form)", who: "site_plumber", path: (w) => `${p(w)}/requests/${w.requests.draft}/edit`, ready: async (page) => { await expect(page.getByTestId("request-editor")).toBeVisible(); } },
  { name: "request (engineer)", who: "engineer", path: (w) => `${p(w)}/requests/${w.requests.inReview}` },
  { name: "review desk", who: "engineer", path: (w) => `${p(w)}/requests/${w.requests.inReview}/review` },
  {
    name: "review desk, decision not yet complete", who: "engineer", path: (w) => `${p(w)}/requests/${w.requests.inReview}/review`, ready: async (page) => {
      await page.getByLabel("Approved with conditions").check();
      await expect(page.getByTestId("decision-problems")).toBeVisible();
    },
  },
  { name: "markup sheet", who: "engineer", path: (w) => `${p(w)}/requests/${w.requests.inReview}/sheet`, ready: async (page) => { await expect(page.getByTestId("markup-item").first()).toBeVisible({ timeout: 20_000 }); } },
  { name: "calculations list", who: "engineer", path: (w) => `${p(w)}/calculations` },
  ...KINDS.map((kind): Screen => ({ name: `calculator: ${kind}`, who: "engineer", path: (w) => `${p(w)}/calculations/new/${kind}` })),
  { name: "saved calculation", who: "engineer", path: (w) => `${p(w)}/calculations/${w.calculationId}` },
  { name: "signing desk", who: "engineer", path: (w) => `${p(w)}/requests/${w.requests.decided}/sign` },
  { name: "approval", who: "site_plumber", path: (w) => `${p(w)}/approvals/${w.approvalId}` },
  { name: "site page", who: "site_plumber", path: (w) => `${p(w)}/site` },
  { name: "notices", who: "site_plumber", path: (w) => `${p(w)}/notices` },
  { name: "profile", who: "engineer", path: () => "/profile" },
];

// One world for the file (rebuilt only if a failure restarts the worker) and one session per role.
let world: World;
let resetLink: string;
const sessions = new Map<Who, Cookie[]>();

test.beforeAll(async ({ browser }) => {
  test.setTimeout(120_000);
  world = await makeWorld();
  // A real reset link, from the mail fake.
  const reset = await new Client().post("/reset-password", { email: world.users.architect.email });
  expect(reset.status).toBeLessThan(400);
  resetLink = linkIn(await waitForMail(world.users.architect.email, /Reset your Countersign password/), "/reset-password/");
  for (const who of ["manager", "architect", "engineer", "site_plumber"] as const) {
    const context = await browser.newContext();
    await signIn(await context.newPage(), world.users[who].email, PASSWORD);
    sessions.set(who, await context.cookies());
    await context.close();
  }
});

for (const screen of SCREENS) {
  test(`${screen.name} (${screen.who === "nobody" ? "signed out" : screen.who})`, async ({ page }) => {
    await page.context().addCookies(sessions.get(screen.who) ?? []);
    const res = await page.goto(screen.path(world, { resetLink }));
    expect(res?.status(), "status").toBeLessThan(400);
    await page.waitForLoadState("networkidle");
    await screen.ready?.(page);
    const results = await new AxeBuilder({ page }).withTags(["wcag2a", "wcag2aa", "wcag21a", "wcag21aa"]).analyze();
    const serious = results.violations.filter((v) => v.impact === "serious" || v.impact === "critical");
    const report = serious.map((v) => `${v.id} (${v.impact}) ${v.help}\n${v.nodes.slice(0, 6).map((n) => `    ${n.target.join(" ")}: ${n.failureSummary?.replace(/\n/g, " ")}`).join("\n")}`);
    expect(report, `${screen.name}: axe violations\n${report.join("\n")}`).toEqual([]);
  });
}
