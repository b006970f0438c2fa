import { expect, test } from "@playwright/test";
import { DEMO_PASSWORD } from "@/db/seed/demo-people";
import { demoUser, signIn } from "./support/demo-users";

const landings = [
  { key: "mechanic", path: "/bench", heading: "Bench" },
  { key: "supervisor", path: "/review", heading: "Review" },
  { key: "office", path: "/office", heading: "Work orders" },
  { key: "customer", path: "/my-bikes", heading: "My bikes" },
];

for (const l of landings) {
  test(`${l.key} signs in, lands on ${l.path}, signs out`, async ({ page }) => {
    await signIn(page, l.key);
    await expect(page).toHaveURL(new RegExp(`${l.path}$`));
    await expect(page.getByRole("heading", { level: 1, name: l.heading })).toBeVisible();
    await page.getByRole("button", { name: "Sign out" }).click();
    await expect(page).toHaveURL(/\/signin/);
    // signed out: the area sends us back to sign-in
    await page.goto(l.path);
    await expect(page).toHaveURL(/\/signin/);
  });
}

test("a wrong password is refused with a clear message", async ({ page }) => {
  await page.goto("/signin");
  await page.getByLabel("E-mail").fill(demoUser("office").email);
  await page.getByLabel("Password").fill("not-the-password");
  await page.getByRole("button", { name: "Sign in" }).click();
  await expect(page.getByTestId("form-error")).toContainText("do not match");
});

test("bad input at sign-in gets a specific message, not a server error", async ({ page }) => {
  await page.goto("/signin");
  await page.getByLabel("E-mail").fill("not an address");
  await page.getByLabel("Password").fill("x");
  await page.getByRole("button", { name: "Sign in" }).click();
  await expect(page.getByTestId("form-error")).toContainText("e-mail address");
});

test("repeated failures for one e-mail from one place are made to wait, never locked", async ({ page }) => {
  const email = `nobody-${Date.now()}@gannet-street.test`;
  await page.goto("/signin");
  const answers: string[] = [];
  // three wrong passwords are checked; then each try must wait longer (2 s, 4 s, …) after the last
  for (let i = 0; i < 8 && !answers.some((a) => a.includes("Too many")); i++) {
    await page.getByLabel("E-mail").fill(email);
    await page.getByLabel("Password").fill(`wrong-${i}`);
    await Promise.all([
      page.waitForResponse((r) => r.url().includes("/api/auth/callback/credentials")),
      page.getByRole("button", { name: "Sign in" }).click(),
    ]);
    await expect(page.getByRole("button", { name: "Sign in" })).toBeEnabled();
    answers.push((await page.getByTestId("form-error").textContent()) ?? "");
  }
  expect(answers.slice(0, 3).every((a) => a.includes("do not match"))).toBe(true);
  expect(answers.at(-1)).toMatch(/Too many wrong passwords from here\. Wait \d+ seconds?, then try again\./);
});

test("a mechanic cannot reach office or review pages or their route handlers", async ({ page }) => {
  await signIn(page, "mechanic");
  for (const path of ["/office", "/review", "/my-bikes"]) {
    await page.goto(path);
    await expect(page).toHaveURL(/\/bench\?refused=/);
  }
  const office = await page.request.get("/api/office/work-orders");
  expect(office.status()).toBe(403);
  const body = await office.json();
  expect(body).toEqual({ error: expect.stringContaining("mechanic"), issues: [] });
  expect(JSON.stringify(body)).not.toContain("GSW-");
  expect((await page.request.get("/api/my-bikes")).status()).toBe(403);
});

test("a customer sees only their own bikes", async ({ page }) => {
  await signIn(page, "customer"); // Felix Amadi owns GSW-0001 and GSW-0002 in the demo
  const cards = page.getByTestId("my-bike");
  await expect(cards).toHaveCount(2);
  await expect(page.getByText("GSW-0001")).toBeVisible();
  await expect(page.getByText("GSW-0003")).toHaveCount(0);
  const api = await page.request.get("/api/my-bikes");
  expect(api.status()).toBe(200);
  const tags = (await api.json()).bikes.map((b: { tagCode: string }) => b.tagCode).sort();
  expect(tags).toEqual(["GSW-0001", "GSW-0002"]);
  expect((await page.request.get("/api/office/work-orders")).status()).toBe(403);
  await page.goto("/bench");
  await expect(page).toHaveURL(/\/my-bikes\?refused=/);
});

test("signed-out requests to route handlers get 401 and no data", async ({ request }) => {
  for (const path of ["/api/office/work-orders", "/api/my-bikes", "/api/me"]) {
    const res = await request.get(path);
    expect(res.status()).toBe(401);
  }
});

test("the second customer does not see the first customer's bikes", async ({ page }) => {
  await signIn(page, "customer2", DEMO_PASSWORD);
  await expect(page.getByTestId("my-bike")).toHaveCount(1);
  await expect(page.getByText("GSW-0003")).toBeVisible();
  await expect(page.getByText("GSW-0001")).toHaveCount(0);
});
