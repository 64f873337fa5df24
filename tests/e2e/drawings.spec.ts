// The drawing register in a real browser: upload with a visible progress bar, background processing to the
// end, the viewer drawing the page with selectable text, and the compare page showing what changed.
import { PDFDocument } from "pdf-lib";
import { makeSheet, A1_LANDSCAPE } from "../support/drawings";
import { makeProjectTeam, PASSWORD } from "../support/factory";
import { expect, signIn, test } from "./fixtures";

async function withPayload(bytes: Uint8Array, payloadBytes: number) {
  // An attachment of incompressible bytes makes the upload last long enough to watch.
  const doc = await PDFDocument.load(bytes);
  const payload = new Uint8Array(payloadBytes);
  for (let i = 0; i < payload.length; i++) payload[i] = (i * 2654435761) >>> 24;
  await doc.attach(payload, "site-photos.bin", { mimeType: "application/octet-stream" });
  return Buffer.from(await doc.save());
}

test("upload, process, view and compare a sheet", async ({ page }) => {
  const { project, users } = await makeProjectTeam();
  await signIn(page, users.architect.email, PASSWORD);
  await page.goto(`/projects/${project.id}/drawings`);
  await expect(page.getByRole("heading", { name: "Register" })).toBeVisible();

  const first = await withPayload(await makeSheet({ size: A1_LANDSCAPE, lines: ["Hot water supply DN22 to geyser"], boxes: [{ x: 300, y: 300, w: 400, h: 200 }] }), 3 * 1024 * 1024);
  await page.getByTestId("upload-input").setInputFiles({ name: "E2E-1.pdf", mimeType: "application/pdf", buffer: first });
  const item = page.getByTestId("upload-item");
  await item.getByLabel("Title (new sheets)").fill("Riser layout");
  // Slow the upload to about 1 MB/s so its progress can be seen.
  const cdp = await page.context().newCDPSession(page);
  await cdp.send("Network.enable");
  await cdp.send("Network.emulateNetworkConditions", { offline: false, latency: 0, downloadThroughput: -1, uploadThroughput: 1024 * 1024 });
  await page.getByRole("button", { name: "Upload", exact: true }).click();
  await expect(page.getByRole("progressbar", { name: "Upload of E2E-1.pdf" })).toBeVisible();
  await expect(item.getByText("Stored as revision P1 of sheet E2E-1.")).toBeVisible({ timeout: 30_000 });
  await cdp.send("Network.emulateNetworkConditions", { offline: false, latency: 0, downloadThroughput: -1, uploadThroughput: -1 });

  const row = page.getByTestId("sheet-E2E-1");
  await expect(row).toContainText("Riser layout");
  await expect(row.locator("[data-processing]")).toHaveCount(0, { timeout: 30_000 });

  // A second revision with a known change, then the viewer and the compare page.
  const second = Buffer.from(await makeSheet({ size: A1_LANDSCAPE, lines: ["Hot water supply DN28 insulated to geyser"], boxes: [{ x: 300, y: 300, w: 400, h: 200 }, { x: 1500, y: 900, w: 300, h: 150 }] }));
  await page.getByTestId("upload-input").setInputFiles({ name: "E2E-1.pdf", mimeType: "application/pdf", buffer: second });
  await page.getByRole("button", { name: "Upload", exact: true }).click();
  await expect(page.getByText("Stored as revision P2 of sheet E2E-1.")).toBeVisible({ timeout: 30_000 });
  await expect(row.locator("[data-processing]")).toHaveCount(0, { timeout: 30_000 });

  await row.getByRole("link", { name: "E2E-1" }).click();
  const viewer = page.getByTestId("viewer");
  await expect(viewer.locator(".react-pdf__Page__canvas").first()).toBeVisible({ timeout: 20_000 });
  await expect(viewer.locator(".react-pdf__Page__textContent").first()).toContainText("DN28", { timeout: 20_000 });
  await expect(viewer.getByTestId("viewer-page")).toHaveText("Page 1 of 1");
  await page.keyboard.press("+");
  await expect(viewer.getByTestId("viewer-zoom")).toHaveText("125%");
  await expect(page).toHaveURL(/zoom=1\.25/);

  await page.getByRole("link", { name: "Compare" }).click();
  await expect(page.getByRole("heading", { name: /Drawing: P1 → P2/ })).toBeVisible({ timeout: 30_000 });
  await expect(page.getByTestId("compare-overlay")).toBeVisible();
  await expect(page.getByTestId("compare-regions")).toContainText("Added");
  await expect(page.getByTestId("compare-text").locator("ins")).toContainText(["DN28"]);
  await expect(page.getByTestId("compare-text").locator("del")).toContainText(["DN22"]);
});
