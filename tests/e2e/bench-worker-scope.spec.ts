import fs from "node:fs";
import { expect, test, type Page } from "@playwright/test";
// @ts-expect-error -- build-time helper in plain JavaScript, no type declarations
import { benchChunkSet } from "../../sw/bench-precache.mjs";
import { waitForServiceWorker, waitForSynced } from "./support/bench-pad";
import { signIn } from "./support/demo-users";

// The service worker belongs to the bench: a signed-out visitor gets none and downloads no
// precache; the mechanic's bench registers it (scope: the whole site) and reopens offline.

const workerState = (page: Page) =>
  page.evaluate(async () => ({
    registrations: (await navigator.serviceWorker.getRegistrations()).map((r) => new URL(r.scope).pathname),
    caches: await caches.keys(),
  }));

test("a signed-out visitor to the sign-in page gets no service worker and no cached files; the bench registers it and reopens offline", async ({
  browser,
}) => {
  const context = await browser.newContext();
  const page = await context.newPage();
  const workerRequests: string[] = [];
  context.on("request", (r) => {
    if (/\/sw\.js$|\/swe-worker-/.test(new URL(r.url()).pathname) || r.serviceWorker()) workerRequests.push(r.url());
  });

  await page.goto("/signin");
  // Hydrated: the form answers typing (the old root layout registered the worker at this point).
  await page.getByLabel("E-mail").fill("nobody@example.invalid");
  await expect(page.getByLabel("E-mail")).toHaveValue("nobody@example.invalid");
  await page.waitForLoadState("networkidle");
  expect(await workerState(page)).toEqual({ registrations: [], caches: [] });
  expect(workerRequests).toEqual([]);

  await signIn(page, "mechanic");
  await expect(page).toHaveURL(/\/bench$/);
  await waitForServiceWorker(page);
  const registered = await workerState(page);
  expect(registered.registrations).toEqual(["/"]);
  expect(registered.caches.some((name) => name.includes("precache"))).toBe(true);
  expect(workerRequests.some((u) => new URL(u).pathname === "/sw.js")).toBe(true);

  // The precache holds the bench's own chunks and no other page's (office, review, charts).
  const precachedUrls = await page.evaluate(async () => {
    const names = (await caches.keys()).filter((n) => n.includes("precache"));
    const urls = (
      await Promise.all(names.map(async (n) => (await (await caches.open(n)).keys()).map((r) => new URL(r.url).pathname)))
    ).flat();
    return urls.sort();
  });
  // the app icons are not precached: installing the app fetches them, and the worker keeps them at run time
  expect(precachedUrls.filter((u) => u.startsWith("/icons/"))).toEqual([]);
  expect(precachedUrls).toContain("/offline");
  const precachedChunks = precachedUrls.filter((u) => u.startsWith("/_next/static/chunks/"));
  const benchChunks = [...(benchChunkSet(".next") as Set<string>)].map((f) => `/_next/${f}`).sort();
  expect(precachedChunks).toEqual(benchChunks);
  const everyChunk = fs.readdirSync(".next/static/chunks").filter((f) => /\.(js|css)$/.test(f));
  expect(everyChunk.length).toBeGreaterThan(benchChunks.length); // other pages' chunks exist and are left out

  await waitForSynced(page);
  await context.setOffline(true);
  await page.reload();
  await expect(page.getByTestId("net-state")).toHaveText(/Offline/);
  await expect(page.getByText("Vireo Nine Fifty").first()).toBeVisible();
  await context.close();
});
