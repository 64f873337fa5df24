// The balance calculator in a real browser: results live as the engineer edits the network, a failing mixing
// point fixed by applying the engine's suggestion, then save, reopen and the printable sheet.
import { execFileSync } from "node:child_process";
import { readFileSync } from "node:fs";
import { makeProjectTeam, PASSWORD } from "../support/factory";
import { expect, signIn, test } from "./fixtures";

test("edit a network, fix a failing mixing point from the suggestion, save, reopen, download the sheet", async ({ page }) => {
  const { project, users } = await makeProjectTeam();
  await signIn(page, users.engineer.email, PASSWORD);
  await page.goto(`/projects/${project.id}`);
  await page.getByRole("navigation", { name: "Project" }).getByRole("link", { name: "Calculations" }).click();
  await page.getByRole("link", { name: /Pressure balance/ }).click();

  const shower = page.getByTestId("mixing-shower");
  await expect(shower.locator("[data-verdict]")).toHaveAttribute("data-verdict", "pass");
  await expect(shower.locator(".recharts-line")).toHaveCount(2);
  await expect(page.getByTestId("caution")).toContainText("registered professional engineer");

  // A long, small hot run: the shower's hot side falls too far below its cold side.
  await page.getByLabel("hot-run pipe").selectOption("cu-c0-15");
  await page.getByLabel("hot-run length").fill("40");
  await expect(shower.locator("[data-verdict]")).toHaveAttribute("data-verdict", "fail");
  await expect(page.getByTestId("findings")).toContainText("differ by");

  // A typing slip is named beside its row and loses nothing.
  await page.getByLabel("cold-run length").fill("-5");
  await expect(page.getByTestId("segment-cold-run").locator("input[aria-invalid=true]")).toHaveCount(1);
  await expect(page.getByTestId("segments-table")).toContainText("Length cannot be negative");
  await page.getByLabel("cold-run length").fill("5");
  await expect(shower.locator("[data-verdict]")).toHaveAttribute("data-verdict", "fail");

  await page.getByTestId("suggestion").getByRole("button", { name: "Apply pipe changes" }).click();
  await expect(page.getByLabel("hot-run pipe")).toHaveValue("cu-c0-22");
  await expect(shower.locator("[data-verdict]")).toHaveAttribute("data-verdict", "pass");
  await expect(page.getByTestId("suggestion")).toHaveCount(0);

  await page.getByLabel("Title").fill("Shower balance, upsized hot run");
  await page.getByRole("button", { name: "Save calculation" }).click();
  await page.waitForURL(/\/calculations\/[0-9a-f-]{36}/);
  await expect(page.getByRole("status")).toContainText("Saved");
  await expect(page.getByRole("heading", { name: /Shower balance, upsized hot run/ })).toContainText("Passed");

  // Reopen from the list: the edited network comes back as saved.
  await page.getByRole("link", { name: "All calculations" }).click();
  await page.getByTestId("saved-calculations").getByRole("link", { name: "Shower balance, upsized hot run" }).click();
  await expect(page.getByLabel("hot-run pipe")).toHaveValue("cu-c0-22");
  await expect(page.getByLabel("hot-run length")).toHaveValue("40");
  await expect(page.getByTestId("mixing-shower").locator("[data-verdict]")).toHaveAttribute("data-verdict", "pass");

  const download = page.waitForEvent("download");
  await page.getByRole("link", { name: "Download sheet (PDF)" }).click();
  const file = await (await download).path();
  expect(readFileSync(file).subarray(0, 5).toString()).toBe("%PDF-");
  const text = execFileSync("pdftotext", [file, "-"]).toString();
  expect(text).toContain("Shower balance, upsized hot run");
  expect(text).toContain("registered professional engineer");
});
