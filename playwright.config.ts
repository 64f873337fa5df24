// End-to-end tests in Debian's Chromium against the built app that storage/stack.sh started for the test profile.
import { defineConfig } from "@playwright/test";

export default defineConfig({
  testDir: "tests/e2e",
  fullyParallel: false,
  workers: 1,
  retries: process.env.CI ? 1 : 0,
  timeout: 60_000,
  expect: { timeout: 10_000 },
  reporter: process.env.CI ? [["list"]] : [["list"]],
  // Per test stack, so two stacks running Playwright side by side never clean up each other's traces.
  outputDir: `test-results/${process.env.COUNTERSIGN_RUN ?? "test"}`,
  use: {
    baseURL: process.env.APP_URL ?? "http://127.0.0.1:3100",
    trace: "retain-on-failure",
    screenshot: "only-on-failure",
    launchOptions: {
      executablePath: "/usr/bin/chromium",
      args: ["--no-sandbox", "--disable-gpu", "--disable-background-networking", "--disable-component-update", "--disable-sync", "--no-first-run"],
    },
  },
  projects: [
    { name: "desktop", use: { viewport: { width: 1280, height: 860 } } },
  ],
});
