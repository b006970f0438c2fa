import { expect, type Page } from "@playwright/test";
import { DEMO_PASSWORD, DEMO_USERS } from "@/db/seed/demo-people";

export function demoUser(key: string) {
  const u = DEMO_USERS.find((x) => x.key === key);
  if (!u) throw new Error(`no demo user ${key}`);
  return u;
}

export async function signIn(page: Page, key: string, password = DEMO_PASSWORD) {
  const u = demoUser(key);
  await page.goto("/signin");
  await page.getByLabel("E-mail").fill(u.email);
  await page.getByLabel("Password").fill(password);
  await page.getByRole("button", { name: "Sign in" }).click();
  await expect(page.getByTestId("whoami")).toContainText(u.name);
  return u;
}
