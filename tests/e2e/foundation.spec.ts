// The foundation as people use it in Chromium: sign up, start a project, invite a colleague by e-mail, who
// accepts by creating an account; find members as you type; reset a forgotten password from the e-mail.
import { linkIn, waitForMail } from "../support/mail";
import { expect, signIn, test, uniqueEmail } from "./fixtures";

const PASSWORD = "a long enough password";

test("a manager starts a project and an invited engineer joins it", async ({ page, browser }) => {
  const managerEmail = uniqueEmail("manager");
  await page.goto("/sign-up");
  await page.getByLabel("Full name").fill("Lindiwe Testmanager");
  await page.getByLabel("E-mail address").fill(managerEmail);
  await page.getByLabel("Password").fill(PASSWORD);
  await page.getByLabel("Profession").selectOption("manager");
  await page.getByRole("button", { name: "Create account" }).click();
  await expect(page.getByRole("heading", { name: "My projects" })).toBeVisible();
  await expect(page.getByText("No projects yet")).toBeVisible();

  await page.getByRole("link", { name: "New project" }).click();
  await page.getByRole("button", { name: "Create project" }).click();
  await expect(page.getByText("Name the project.")).toBeVisible();
  await page.getByLabel("Project name").fill("Seabreeze Mews");
  await page.getByLabel("Site address").fill("3 Test Crescent, Testdale");
  await page.getByRole("button", { name: "Create project" }).click();
  await expect(page.getByRole("heading", { name: "Seabreeze Mews" })).toBeVisible();
  await expect(page.getByText("Project manager").first()).toBeVisible();

  await page.getByRole("navigation", { name: "Project" }).getByRole("link", { name: "Members" }).click();
  const engineerEmail = uniqueEmail("engineer");
  await page.getByLabel("E-mail address").fill(engineerEmail);
  await page.getByLabel("Role on this project").selectOption("engineer");
  await page.getByRole("button", { name: "Send invitation" }).click();
  await expect(page.getByText(`Invitation sent to ${engineerEmail}.`)).toBeVisible();
  await expect(page.getByText(`${engineerEmail} · Engineer`)).toBeVisible();

  const link = linkIn(await waitForMail(engineerEmail, /invited you to Seabreeze Mews/), "/invitations/");
  const other = await browser.newContext();
  const engineer = await other.newPage();
  await engineer.goto(link);
  await expect(engineer.getByRole("heading", { name: "Join Seabreeze Mews" })).toBeVisible();
  await engineer.getByRole("link", { name: "Create an account" }).click();
  await engineer.getByLabel("Full name").fill("Jabu Testengineer");
  await engineer.getByLabel("E-mail address").fill(engineerEmail);
  await engineer.getByLabel("Password").fill(PASSWORD);
  await engineer.getByLabel("Profession").selectOption("engineer");
  await engineer.getByRole("button", { name: "Create account" }).click();
  await expect(engineer.getByText("Engineers enter their professional registration number")).toBeVisible();
  await engineer.getByLabel("Password").fill(PASSWORD);
  await engineer.getByLabel("Registration number").fill("TEST-0042");
  await engineer.getByRole("button", { name: "Create account" }).click();
  await engineer.getByRole("button", { name: "Accept and open the project" }).click();
  await expect(engineer.getByRole("heading", { name: "Seabreeze Mews" })).toBeVisible();
  await expect(engineer.getByRole("navigation", { name: "Project" }).getByRole("link", { name: "Settings" })).toHaveCount(0);
  await other.close();

  await page.reload();
  await page.getByLabel("Find a member").fill("jabu");
  const results = page.getByTestId("member-picker-results");
  await expect(results).toContainText("Jabu Testengineer");
  await expect(results).not.toContainText("Lindiwe");
});

test("a forgotten password is reset from the e-mailed link", async ({ page }) => {
  const email = uniqueEmail("forgetful");
  await page.goto("/sign-up");
  await page.getByLabel("Full name").fill("Pat Forgetful");
  await page.getByLabel("E-mail address").fill(email);
  await page.getByLabel("Password").fill(PASSWORD);
  await page.getByLabel("Profession").selectOption("plumber");
  await page.getByRole("button", { name: "Create account" }).click();
  await page.getByRole("button", { name: "Sign out" }).click();
  await expect(page.getByRole("heading", { name: "Sign in" })).toBeVisible();

  await page.getByRole("link", { name: "Forgot your password?" }).click();
  // The sign-in page has an e-mail field too: wait for the reset page before typing.
  await expect(page.getByRole("heading", { name: "Reset your password" })).toBeVisible();
  await page.getByLabel("E-mail address").fill(email);
  await page.getByRole("button", { name: "Send reset link" }).click();
  await expect(page.getByText("If an account exists for that address")).toBeVisible();
  const link = linkIn(await waitForMail(email, /Reset your Countersign password/), "/reset-password/");
  await page.goto(link);
  await page.getByLabel("New password", { exact: true }).fill("my new long password");
  await page.getByLabel("New password again").fill("my new long password");
  await page.getByRole("button", { name: "Save new password" }).click();
  await expect(page.getByText("Your password was changed")).toBeVisible();
  await signIn(page, email, "my new long password");
  await expect(page.getByRole("heading", { name: "My projects" })).toBeVisible();

  await page.goto(link);
  await expect(page.getByText("already been used")).toBeVisible();
});

test("wrong password says so beside the form and keeps the e-mail", async ({ page }) => {
  await page.goto("/sign-in");
  await page.getByLabel("E-mail address").fill("nobody-here@e2e.example");
  await page.getByLabel("Password").fill("wrong password");
  await page.getByRole("button", { name: "Sign in" }).click();
  await expect(page.getByRole("alert")).toContainText("do not match an account");
  await expect(page.getByLabel("E-mail address")).toHaveValue("nobody-here@e2e.example");
});
