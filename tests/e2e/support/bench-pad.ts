import { expect, type Page } from "@playwright/test";

/** Types a tag on the bench's on-screen keypad (no system keyboard). */
export async function typeTag(page: Page, code: string) {
  await page.getByRole("button", { name: "Clear the tag code" }).click();
  for (const ch of code) await page.getByRole("button", { name: `Key ${ch}`, exact: true }).click();
  await expect(page.getByTestId("tag-display")).toHaveText(code);
}

/** Types a number on the measurement or wrench keypad. */
export async function typeNumber(page: Page, value: string) {
  for (const ch of value) {
    const name = ch === "." ? "Decimal point" : ch === "-" ? "Minus" : `Digit ${ch}`;
    await page.getByRole("button", { name, exact: true }).click();
  }
}

/** Waits until the service worker is active and controls the page, then reloads once so the
 * bench page itself is fetched through it (and kept for offline use). */
export async function waitForServiceWorker(page: Page) {
  const controlled = () =>
    page.waitForFunction(
      async () => {
        await navigator.serviceWorker.ready;
        return Boolean(navigator.serviceWorker.controller);
      },
      undefined,
      { timeout: 45_000, polling: 250 },
    );
  await controlled();
  await page.reload();
  await controlled();
}

export async function waitForSynced(page: Page) {
  await expect(page.getByTestId("net-state")).toHaveText(/Online/);
  await page
    .getByRole("button", { name: "Sync now" })
    .click()
    .catch(() => undefined);
  await expect(page.getByTestId("waiting-count")).toHaveText("Nothing waiting to send", { timeout: 30_000 });
}

/** Types the bike's tag on the keypad and opens its job (the heading names the bike). */
export async function openJobByTag(page: Page, tag: string, bike: string) {
  await typeTag(page, tag);
  await page.getByRole("button", { name: "Open this bike's job" }).click();
  await expect(page.getByRole("heading", { name: bike })).toBeVisible();
}

/** The states of the entries in the tablet's outbox for this user, read straight from IndexedDB. */
export async function outboxStates(page: Page, userId: string): Promise<string[]> {
  return page.evaluate(
    (name) =>
      new Promise<string[]>((resolve, reject) => {
        const req = indexedDB.open(name);
        req.onerror = () => reject(req.error);
        req.onsuccess = () => {
          const db = req.result;
          const all = db.transaction("outbox").objectStore("outbox").getAll();
          all.onsuccess = () => {
            resolve((all.result as Array<{ state: string }>).map((e) => e.state).sort());
            db.close();
          };
          all.onerror = () => reject(all.error);
        };
      }),
    `benchtag-bench-${userId}`,
  );
}
