// Marking up a sheet in Chromium: the engineer draws a revision cloud, a text callout and a measurement after
// calibrating the scale; a reload shows them from the server; the plumber sees the same markups read-only.
import { DeviationRequest } from "../../db/models";
import { makeSheet, upload } from "../support/drawings";
import { makeProjectTeam, PASSWORD } from "../support/factory";
import { Client } from "../support/http";
import { api, CONTENT } from "../support/requests";
import { expect, signIn, test } from "./fixtures";
import type { Page } from "@playwright/test";

async function drag(page: Page, from: [number, number], to: [number, number]) {
  const box = (await page.getByTestId("markup-stage").locator("canvas").first().boundingBox())!;
  await page.mouse.move(box.x + from[0], box.y + from[1]);
  await page.mouse.down();
  await page.mouse.move(box.x + (from[0] + to[0]) / 2, box.y + (from[1] + to[1]) / 2, { steps: 4 });
  await page.mouse.move(box.x + to[0], box.y + to[1], { steps: 4 });
  await page.mouse.up();
}

test("an engineer marks up the sheet and the plumber sees it read-only", async ({ page, browser }) => {
  const team = await makeProjectTeam();
  const as = { architect: new Client(), site_plumber: new Client(), engineer: new Client() };
  for (const who of Object.keys(as) as (keyof typeof as)[]) await as[who].signIn(team.users[who].email, PASSWORD);
  const up = await upload(as.architect, team.project.id, await makeSheet({ tag: "e2e markups" }), { sheetNumber: "P-101", title: "Roof plumbing", scaleText: "1:50" });
  expect(up.status).toBe(201);
  const created = await api(as.site_plumber, "POST", `/api/projects/${team.project.id}/requests`, CONTENT);
  const id = created.body.request.id as string;
  for (const [who, action] of [["site_plumber", "submit"], ["engineer", "start_review"]] as const) {
    const current = (await DeviationRequest.findByPk(id))!;
    expect((await api(as[who], "POST", `/api/projects/${team.project.id}/requests/${id}/transitions`, { action, lockVersion: current.lockVersion })).status).toBe(200);
  }

  await signIn(page, team.users.engineer.email, PASSWORD);
  await page.goto(`/projects/${team.project.id}/requests/${id}`);
  await page.getByRole("link", { name: "Mark up the sheet" }).click();
  await expect(page.getByTestId("markup-canvas")).toBeVisible();
  await expect(page.getByTestId("scale-source")).toContainText("stated scale 1:50");
  const items = page.getByTestId("markup-item");

  await page.getByRole("button", { name: /Revision cloud/ }).click();
  await drag(page, [100, 100], [260, 180]);
  await expect(items).toHaveCount(1);

  await page.keyboard.press("t");
  await drag(page, [300, 150], [420, 90]);
  await page.getByLabel("Callout text").fill("Reroute along the parapet");
  await page.getByRole("button", { name: "Add" }).click();
  await expect(items).toHaveCount(2);

  await page.getByRole("button", { name: "Calibrate scale" }).click();
  await drag(page, [100, 300], [250, 300]);
  await page.getByLabel("Known distance (m)").fill("4");
  await page.getByRole("button", { name: "Set scale" }).click();
  await expect(page.getByTestId("scale-source")).toContainText("calibrated");
  await page.keyboard.press("m");
  await drag(page, [100, 350], [175, 350]);
  await expect(items).toHaveCount(3);
  await expect(items.nth(2)).toContainText("2.00 m");
  await expect(page.getByText("saving…")).toHaveCount(0);

  await page.reload();
  await expect(items).toHaveCount(3);
  await expect(page.getByTestId("markup-list")).toContainText("Revision cloud");
  await expect(page.getByTestId("markup-list")).toContainText("Reroute along the parapet");
  await expect(page.getByTestId("markup-list")).toContainText("2.00 m");
  await items.nth(2).click();
  await expect(page.getByRole("link", { name: /Send 2.00 m to the calculator/ })).toHaveAttribute("href", /calculations\/new\/segment\?lengthM=2$/);

  const other = await browser.newContext();
  const plumber = await other.newPage();
  const problems: string[] = [];
  plumber.on("pageerror", (e) => problems.push(e.message));
  await signIn(plumber, team.users.site_plumber.email, PASSWORD);
  await plumber.goto(`/projects/${team.project.id}/requests/${id}/sheet`);
  await expect(plumber.getByTestId("markup-item")).toHaveCount(3);
  await expect(plumber.getByText("Read-only: markups are drawn by the engineer.")).toBeVisible();
  await expect(plumber.getByRole("toolbar", { name: "Markup tools" })).toHaveCount(0);
  await other.close();
  expect(problems).toEqual([]);
});
