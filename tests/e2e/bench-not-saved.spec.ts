import { expect, test } from "@playwright/test";
import { typeTag, waitForServiceWorker, waitForSynced } from "./support/bench-pad";
import { signIn } from "./support/demo-users";
import { openStep, typeIn } from "./support/review-bench";

// Work the tablet could not save is said at once, in workshop words, and nothing already typed is
// lost: the tablet's storage refusing writes (a full disk: IndexedDB's QuotaExceededError, made
// here by the browser's own IndexedDB refusing adds and puts to the outbox and photo stores)
// shows "Not saved" with what to do; the reading stays typed and is saved once there is room.
// Demo job #1074 (tag GSW-1074), step 2, as the double-tap test; this one leaves one correction.

const PNG = Buffer.from("iVBORw0KGgoAAAANSUhEUgAAAAEAAAABCAYAAAAfFcSJAAAADUlEQVR42mP8z8BQDwAEhQGAhKmMIQAAAABJRU5ErkJggg==", "base64");

test("a save the tablet's full storage refuses says so, keeps what was typed, and saves once there is room", async ({ page }) => {
  await page.addInitScript(() => {
    const w = window as unknown as { __storeFull: boolean; __persistAsked: boolean };
    w.__storeFull = false;
    w.__persistAsked = false;
    for (const method of ["add", "put"] as const) {
      const real = IDBObjectStore.prototype[method];
      IDBObjectStore.prototype[method] = function (this: IDBObjectStore, ...args: Parameters<typeof real>) {
        if (w.__storeFull && (this.name === "outbox" || this.name === "photos")) {
          throw new DOMException("The quota has been exceeded.", "QuotaExceededError");
        }
        return real.apply(this, args);
      };
    }
    const persist = navigator.storage?.persist?.bind(navigator.storage);
    if (persist)
      navigator.storage.persist = () => {
        w.__persistAsked = true;
        return persist();
      };
  });
  await signIn(page, "mechanic");
  await waitForServiceWorker(page);
  await waitForSynced(page);
  // the bench asks the browser to keep its store under storage pressure
  expect(await page.evaluate(() => (window as unknown as { __persistAsked: boolean }).__persistAsked)).toBe(true);

  await typeTag(page, "GSW-1074");
  await page.getByRole("button", { name: "Open this bike's job" }).click();
  await expect(page.getByRole("heading", { name: "Oxmoor Vane 650" })).toBeVisible();
  await openStep(page, 2);
  const section = page.getByRole("region", { name: /^Measure / }).first();
  // its first reading (read already by the double-tap test, so this one is a correction)
  await section.getByTestId("reading-slot").first().click();
  await typeIn(section, "0.062");

  await page.evaluate(() => ((window as unknown as { __storeFull: boolean }).__storeFull = true));
  await section.getByRole("button", { name: "Save reading" }).click();
  const notice = page.getByTestId("not-saved");
  await expect(notice).toContainText("Not saved: this tablet's storage is full.");
  await expect(notice).not.toContainText(/quota|exceeded|DOMException/i);
  await expect(section.getByRole("status").filter({ hasText: "saved" })).toHaveCount(0);
  await expect(page.getByTestId("waiting-count")).toHaveText("Nothing waiting to send");
  // what was typed is still on the keypad
  await expect(section.getByTestId("keypad-display")).toHaveText("0.062");

  // a photo refused the same way says so under the photo button
  await page.getByTestId("photo-input").setInputFiles({ name: "crown.png", mimeType: "image/png", buffer: PNG });
  await expect(page.getByRole("region", { name: "Photos" }).getByRole("alert")).toContainText("Not saved: this tablet's storage is full.");
  await expect(page.getByAltText("Step photo")).toHaveCount(0);

  // room again: the same reading saves
  await page.evaluate(() => ((window as unknown as { __storeFull: boolean }).__storeFull = false));
  await notice.getByRole("button", { name: "Read it" }).click();
  await expect(notice).toHaveCount(0);
  await page.waitForTimeout(700);
  await section.getByRole("button", { name: "Save reading" }).click();
  await expect(section.getByRole("status").filter({ hasText: "saved" })).toContainText("0.062 mm saved");
  await waitForSynced(page);
});
