import { expect, test } from "@playwright/test";
import { DEMO_PASSWORD } from "@/db/seed/demo-people";
import { demoUser, signIn } from "./support/demo-users";

// Anyone signed in changes their own password from the header's "Password" link: the current
// password is checked, the new one works at once, and the same person's other sign-ins (another
// browser here) are signed out. The test changes it back, so the demo password stays.

const NEW = "priya-new-pass-2026";

test("a mechanic changes her password: a wrong current one is refused beside its field, the new one signs in, her other browser is signed out", async ({
  page,
  browser,
}) => {
  const priya = demoUser("mechanic2");
  const other = await browser.newContext();
  const elsewhere = await other.newPage();
  await signIn(elsewhere, "mechanic2");

  await signIn(page, "mechanic2");
  await page.getByRole("link", { name: "Password" }).click();
  await expect(page.getByRole("heading", { name: "Change your password" })).toBeVisible();
  const form = page.getByTestId("change-password-form");
  await form.getByLabel("Current password").fill("not-my-password");
  await form.getByLabel("New password", { exact: true }).fill(NEW);
  await form.getByLabel("New password again").fill(NEW);
  await form.getByRole("button", { name: "Change my password" }).click();
  await expect(form.getByText("Your current password is not right: nothing was changed.").first()).toBeVisible();

  await form.getByLabel("Current password").fill(DEMO_PASSWORD);
  await form.getByRole("button", { name: "Change my password" }).click();
  await expect(form.getByText(/Your password is changed\. One other sign-in was signed out\.$/)).toBeVisible();

  // still signed in here; the other browser is not
  await page.reload();
  await expect(page.getByTestId("whoami")).toContainText(priya.name);
  await elsewhere.goto("/account/password");
  await expect(elsewhere).toHaveURL(/\/signin/);
  // the old password no longer signs in; the new one does
  await elsewhere.getByLabel("E-mail").fill(priya.email);
  await elsewhere.getByLabel("Password").fill(DEMO_PASSWORD);
  await elsewhere.getByRole("button", { name: "Sign in" }).click();
  await expect(elsewhere.getByRole("alert").filter({ hasText: "do not match" })).toBeVisible();
  await signIn(elsewhere, "mechanic2", NEW);
  await other.close();

  // back to the demo password
  await form.getByLabel("Current password").fill(NEW);
  await form.getByLabel("New password", { exact: true }).fill(DEMO_PASSWORD);
  await form.getByLabel("New password again").fill(DEMO_PASSWORD);
  await form.getByRole("button", { name: "Change my password" }).click();
  await expect(form.getByText(/Your password is changed\./)).toBeVisible();
});
