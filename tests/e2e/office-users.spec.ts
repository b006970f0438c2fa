import { expect, test } from "@playwright/test";
import { signIn } from "./support/demo-users";
import { fromOurPage } from "./support/same-origin";
import { goByHeader } from "./support/nav";

// Sam Okafor is a demo customer without a sign-in (bikes GSW-0004, GSW-0005, GSW-0006).
test("the office gives a customer a sign-in; the customer sees only their bikes; turned off, it no longer signs in", async ({
  browser,
}) => {
  const office = await (await browser.newContext()).newPage();
  await signIn(office, "office");
  await goByHeader(office, "Sign-ins");
  await expect(office.getByRole("heading", { level: 1, name: "Sign-ins" })).toBeVisible();

  // bad input is answered beside the fields
  await office.getByLabel("Role").selectOption("customer");
  await office.getByRole("button", { name: "Make the sign-in" }).click();
  await expect(office.getByTestId("error-customerId")).toContainText("needs the customer");
  // a customer's sign-in may be made without a password (an invitation e-mail goes instead); a short one is refused
  await expect(office.getByTestId("error-password")).toHaveCount(0);
  await office.getByLabel("First password").fill("short");
  await office.getByRole("button", { name: "Make the sign-in" }).click();
  await expect(office.getByTestId("error-password")).toContainText("at least 10 characters");

  await office.getByLabel("Name").fill("Sam Okafor");
  await office.getByLabel("E-mail").fill("sam.okafor@example.test");
  await office.getByLabel("Customer").selectOption({ label: "Sam Okafor" });
  await office.getByLabel("First password").fill("sam-first-pass-1");
  await office.getByRole("button", { name: "Make the sign-in" }).click();
  await expect(office.getByText("Sign-in made for sam.okafor@example.test.")).toBeVisible();
  await expect(office.getByTestId("user-row").filter({ hasText: "sam.okafor@example.test" })).toContainText("Customer (Sam Okafor)");

  // the same e-mail twice is refused with the reason
  await office.getByLabel("Role").selectOption("mechanic");
  await office.getByLabel("Name").fill("Someone Else");
  await office.getByLabel("E-mail").fill("sam.okafor@example.test");
  await office.getByLabel("First password").fill("another-pass-22");
  await office.getByRole("button", { name: "Make the sign-in" }).click();
  await expect(office.getByTestId("error-email")).toContainText("already has a sign-in");

  const sam = await (await browser.newContext()).newPage();
  await sam.goto("/signin");
  await sam.getByLabel("E-mail").fill("sam.okafor@example.test");
  await sam.getByLabel("Password").fill("sam-first-pass-1");
  await sam.getByRole("button", { name: "Sign in" }).click();
  await expect(sam).toHaveURL(/\/my-bikes$/);
  const tags = await sam.getByTestId("my-bike").locator("p.font-mono").allTextContents();
  expect(tags.sort()).toEqual(["Tag GSW-0004", "Tag GSW-0005", "Tag GSW-0006"]);

  await office.getByRole("button", { name: "Turn off the sign-in of Sam Okafor" }).click();
  await expect(office.getByTestId("user-row").filter({ hasText: "sam.okafor@example.test" })).toContainText("Turned off");
  // an open session stops working at once (the user is re-read on every request)
  await sam.reload();
  await expect(sam).toHaveURL(/\/signin/);
  await sam.getByLabel("E-mail").fill("sam.okafor@example.test");
  await sam.getByLabel("Password").fill("sam-first-pass-1");
  await sam.getByRole("button", { name: "Sign in" }).click();
  await expect(sam.getByTestId("form-error")).toContainText("do not match an active account");
});

test("only the office manages sign-ins", async ({ page }) => {
  await signIn(page, "supervisor");
  expect((await page.request.get("/api/office/users")).status()).toBe(403);
  const res = await page.request.post("/api/office/users", {
    data: { name: "X Y", email: "x@y.test", role: "office", password: "0123456789", customerId: null },
    headers: fromOurPage,
  });
  expect(res.status()).toBe(403);
  await page.goto("/office/users");
  await expect(page).toHaveURL(/\/review\?refused=users/);
});
