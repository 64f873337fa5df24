// Shared e2e fixture: any unexpected console error or page error fails the test.
import { test as base, expect, type Page } from "@playwright/test";

export const test = base.extend<{ page: Page }>({
  page: async ({ page }, use) => {
    const problems: string[] = [];
    page.on("console", (m) => {
      if (m.type() === "error" && !/Failed to load resource: the server responded with a status of 4\d\d/.test(m.text())) problems.push(m.text());
    });
    page.on("pageerror", (e) => problems.push(e.message));
    await use(page);
    expect(problems, "console errors during the test").toEqual([]);
  },
});

export { expect };

export async function signIn(page: Page, email: string, password: string) {
  await page.goto("/sign-in");
  await page.getByLabel("E-mail address").fill(email);
  await page.getByLabel("Password").fill(password);
  await page.getByRole("button", { name: "Sign in" }).click();
  await page.waitForURL((u) => !u.pathname.startsWith("/sign-in"));
}

let n = 0;
export const uniqueEmail = (tag: string) => `${tag}-${Date.now().toString(36)}-${n++}@e2e.example`;
