// The signed-approval loop in Chromium: a project manager verifies the engineer's registration; the engineer
// signs; the plumber, on a phone-sized screen, downloads the pack and records the installation; an inspector,
// not signed in, checks the approval by its code and by uploading the pack.
import { readFileSync } from "node:fs";
import { Approval } from "../../db/models";
import { decidedRequest } from "../support/approvals";
import { makeProjectTeam, PASSWORD } from "../support/factory";
import { Client } from "../support/http";
import { makePhoto } from "../support/requests";
import { expect, signIn, test } from "./fixtures";

test("verify, sign, retrieve on site, record installation, verify publicly", async ({ page, browser }) => {
  test.setTimeout(120_000);
  const team = await makeProjectTeam();
  await team.users.engineer.update({ registrationNumber: "E2E-5150", registrationBody: "Test board", registrationState: "unverified" });
  const as = { architect: new Client(), site_plumber: new Client(), engineer: new Client() };
  for (const role of ["architect", "site_plumber", "engineer"] as const) await as[role].signIn(team.users[role].email, PASSWORD);
  const request = await decidedRequest(team.project.id, as, "Unit 3 discharge run along the parapet");
  const p = team.project.id;

  // The manager verifies the engineer's registration.
  await signIn(page, team.users.manager.email, PASSWORD);
  await page.goto(`/projects/${p}/members`);
  await page.getByRole("link", { name: "Verify registration" }).click();
  await expect(page.getByRole("heading", { name: /Professional registration of/ })).toBeVisible();
  await page.getByRole("button", { name: "Confirm registration is verified" }).click();
  await expect(page.getByTestId("registration-state")).toContainText("Verified");

  // The engineer signs.
  const engineerContext = await browser.newContext();
  const engineer = await engineerContext.newPage();
  await signIn(engineer, team.users.engineer.email, PASSWORD);
  await engineer.goto(`/projects/${p}/requests/${request.id}/sign`);
  await expect(engineer.getByRole("heading", { name: /Sign approval v1 of DR-/ })).toBeVisible();
  await expect(engineer.getByText("Insulate the exposed run.")).toBeVisible();
  await engineer.getByLabel("Your password").fill(PASSWORD);
  await engineer.getByLabel(/I have reviewed this record/).check();
  await engineer.getByRole("button", { name: "Sign approval" }).click();
  await expect(engineer.getByText("✓ Signed.")).toBeVisible({ timeout: 30_000 });
  await engineerContext.close();
  const approval = (await Approval.findOne({ where: { requestId: request.id } }))!;

  // The plumber, on a phone, downloads the pack and records the installation.
  const phone = await browser.newContext({ viewport: { width: 390, height: 844 }, acceptDownloads: true });
  const plumber = await phone.newPage();
  await signIn(plumber, team.users.site_plumber.email, PASSWORD);
  await plumber.goto(`/projects/${p}/site`);
  await expect(plumber.getByText("Unit 3 discharge run along the parapet")).toBeVisible();
  await expect(plumber.getByText("Label the termination point.")).toBeVisible();
  const [download] = await Promise.all([plumber.waitForEvent("download"), plumber.getByRole("link", { name: "Download signed pack" }).click()]);
  const packPath = await download.path();
  const pack = readFileSync(packPath!);
  expect(pack.subarray(0, 5).toString()).toBe("%PDF-");
  await plumber.getByRole("link", { name: /Details/ }).click();
  await plumber.getByLabel("Photo (optional)").setInputFiles({ name: "installed.jpg", mimeType: "image/jpeg", buffer: Buffer.from(await makePhoto()) });
  await plumber.getByLabel("Note (optional)").fill("Installed as the marked-up sheet shows.");
  await plumber.getByRole("button", { name: "Record installed as approved" }).click();
  await expect(plumber.getByText(/Installed as approved on \d{4}-\d{2}-\d{2}/)).toBeVisible();
  await phone.close();

  // An inspector, not signed in, checks it by code and by upload.
  const inspectorContext = await browser.newContext();
  const inspector = await inspectorContext.newPage();
  await inspector.goto(`/verify/${approval.verifyCode}`);
  await expect(inspector.getByRole("heading", { name: `${approval.reference} · approval v1` })).toBeVisible();
  await expect(inspector.getByText("E2E-5150 · Test board")).toBeVisible();
  await inspector.getByLabel("PDF to check").setInputFiles({ name: "pack.pdf", mimeType: "application/pdf", buffer: pack });
  await inspector.getByRole("button", { name: "Check this file" }).click();
  await expect(inspector.getByRole("status")).toContainText("This is the signed original");
  const altered = Buffer.concat([pack, Buffer.from("\n% added later\n")]);
  await inspector.getByLabel("PDF to check").setInputFiles({ name: "pack.pdf", mimeType: "application/pdf", buffer: altered });
  await inspector.getByRole("button", { name: "Check this file" }).click();
  await expect(inspector.getByRole("status")).toContainText("added to this file after it was signed");
  await inspectorContext.close();
});
