// A deviation request as people handle it in Chromium: the site plumber files it from a phone with a photo,
// the engineer asks for more information, the plumber answers and resubmits, and the engineer records the
// principles and an approval with conditions. Every step's e-mail is read back from the mail fake.
import sharp from "sharp";
import { DrawingRevision } from "../../db/models";
import { makeSheet, until, upload } from "../support/drawings";
import { makeProjectTeam, PASSWORD } from "../support/factory";
import { Client } from "../support/http";
import { linkIn, waitForMail } from "../support/mail";
import { PRINCIPLES } from "../../app/review/principles";
import { expect, signIn, test } from "./fixtures";

test("a plumber files a request from a phone and the engineer approves it with conditions", async ({ page, browser }) => {
  const team = await makeProjectTeam();
  // A processed sheet in the register to pin the request to.
  const architect = new Client();
  await architect.signIn(team.users.architect.email, PASSWORD);
  const sheet = await upload(architect, team.project.id, await makeSheet({ tag: "pin-sheet" }), { sheetNumber: "P-PIN", title: "Roof plumbing" });
  const revisionId = sheet.body.stored[0].revisionId as string;
  await until(async () => (await DrawingRevision.findByPk(revisionId))?.processing === "done", 30_000, "the sheet to be processed");
  const photo = await sharp({ create: { width: 800, height: 600, channels: 3, background: "#8a6a4a" } }).jpeg().toBuffer();

  // The plumber, on a phone.
  const phone = await browser.newContext({ viewport: { width: 390, height: 844 }, isMobile: true, hasTouch: true });
  const plumber = await phone.newPage();
  const problems: string[] = [];
  plumber.on("console", (m) => { if (m.type() === "error" && !/status of 4\d\d/.test(m.text())) problems.push(m.text()); });
  plumber.on("pageerror", (e) => problems.push(e.message));
  await signIn(plumber, team.users.site_plumber.email, PASSWORD);
  await plumber.goto(`/projects/${team.project.id}/requests`);
  await plumber.getByRole("link", { name: "New request" }).click();
  await plumber.getByLabel("Title").fill("Unit 5 discharge run on the flat roof");
  await plumber.getByLabel("Provision that cannot be applied").selectOption("discharge");
  await plumber.getByRole("button", { name: "Start the request" }).click();
  await expect(plumber.getByTestId("request-editor")).toBeVisible();
  await plumber.getByLabel("Site constraint").fill("Flat concrete roof; the only harmless outlet is the gutter, 7 m away.");
  await plumber.getByLabel("Proposal").fill("Run a 22 mm discharge pipe 7 m along the parapet with two 45° bends.");
  await plumber.getByRole("button", { name: "Add a measurement" }).click();
  const row = plumber.getByTestId("measurement-row").first();
  await row.getByLabel("Name").fill("Discharge run");
  await row.getByLabel("Value (m)").fill("7");
  await expect(plumber.getByTestId("save-status")).toContainText("Saved");
  await plumber.getByTestId("camera-input").setInputFiles({ name: "roof.jpg", mimeType: "image/jpeg", buffer: photo });
  await expect(plumber.getByText("Attached roof.jpg.")).toBeVisible();
  await expect(plumber.getByRole("img", { name: "roof.jpg" })).toBeVisible();
  await plumber.getByTestId("file-input").setInputFiles({ name: "notes.txt", mimeType: "text/plain", buffer: Buffer.from("not a photo") });
  await expect(plumber.getByText("is not a photo or a PDF")).toBeVisible();
  // A pin on the sheet where the discharge run is.
  const editUrl = plumber.url();
  await plumber.getByRole("link", { name: "Place pins on the sheet" }).click();
  await expect(plumber.getByText("Click the sheet to place a numbered pin.")).toBeVisible();
  await plumber.locator(".konvajs-content").first().click({ position: { x: 120, y: 90 } });
  await expect(plumber.getByText("Pin 1 placed.")).toBeVisible();
  await expect(plumber.getByTestId("pin-list")).toContainText("1");
  await plumber.goto(editUrl);
  await plumber.getByRole("button", { name: "Submit to the engineer" }).click();
  await expect(plumber.getByText("Sent to the engineer.")).toBeVisible();
  await expect(plumber.getByText("Submitted", { exact: true })).toBeVisible();

  // The engineer, at a desk.
  await signIn(page, team.users.engineer.email, PASSWORD);
  const submitted = await waitForMail(team.users.engineer.email, /submitted for your review/);
  await page.goto(linkIn(submitted, "/projects/"));
  await page.getByRole("button", { name: "Start review" }).click();
  await expect(page.getByText("In review", { exact: true })).toBeVisible();
  await page.getByLabel("What information do you need?").fill("The run is over 4 m: what size will the pipe be from the valve outlet?");
  await page.getByRole("button", { name: "Ask for more information" }).click();
  await expect(page.getByText("More information needed", { exact: true })).toBeVisible();

  // The plumber answers.
  const asked = await waitForMail(team.users.site_plumber.email, /more information needed/);
  expect(asked.text).toContain("what size will the pipe be");
  await plumber.goto(linkIn(asked, "/projects/"));
  await plumber.getByRole("link", { name: "Answer and resubmit" }).click();
  await plumber.getByLabel("Proposal").fill("Run a 28 mm discharge pipe, enlarged at the valve outlet, 7 m along the parapet with two 45° bends.");
  await expect(plumber.getByTestId("save-status")).toContainText("Saved");
  await plumber.getByRole("button", { name: "Resubmit to the engineer" }).click();
  await expect(plumber.getByText("Resubmitted", { exact: true })).toBeVisible();

  // The engineer decides.
  const resubmitted = await waitForMail(team.users.engineer.email, /resubmitted/);
  await page.goto(linkIn(resubmitted, "/projects/"));
  await page.getByRole("button", { name: "Start review" }).click();
  await page.getByRole("link", { name: "Open the review desk" }).click();
  await expect(page.getByText("What changed from version 1 to 2")).toBeVisible();
  await expect(page.getByText("supports the registered engineer's professional judgement")).toBeVisible();
  for (const p of PRINCIPLES) {
    const box = page.getByTestId(`principle-${p.id}`);
    if (p.id === "safe_discharge") {
      await box.getByLabel("Maintained").check();
    } else {
      await box.getByLabel("Not affected").check();
    }
  }
  await page.getByLabel("Approved with conditions").check();
  await expect(page.getByTestId("decision-problems")).toContainText("“Safe discharge” is maintained: say how");
  await page.getByTestId("principle-safe_discharge").getByLabel("Reasoning for Safe discharge").fill("28 mm from the valve outlet keeps a 7 m run within the limit for that size.");
  await page.getByLabel("Condition 1").fill("Terminate the discharge visibly over the gutter outlet.");
  await expect(page.getByText("Ready to record.")).toBeVisible();
  await page.getByRole("button", { name: "Record decision" }).click();
  await expect(page.getByTestId("decision")).toContainText("Approved with conditions");
  await expect(page.getByTestId("decision")).toContainText("Terminate the discharge visibly over the gutter outlet.");

  const decided = await waitForMail(team.users.site_plumber.email, /decided/);
  expect(decided.subject).toMatch(/^DR-\d{3} decided/);
  await phone.close();
  expect(problems, "console errors on the phone").toEqual([]);
});
