import { expect, type Locator, type Page } from "@playwright/test";

// Driving the bench through a stage for the review tests. Tolerant of work already on the job
// (other test files may have read some spots): only spots still "not read" are read.

/** Types a number on the keypad inside `scope` (a step with two specs has two keypads). */
export async function typeIn(scope: Locator, value: string) {
  for (const ch of value) {
    const name = ch === "." ? "Decimal point" : ch === "-" ? "Minus" : `Digit ${ch}`;
    await scope.getByRole("button", { name, exact: true }).click();
  }
}

/** Opens step n (1-based) of the job on screen. */
export async function openStep(page: Page, n: number) {
  const job = new URL(page.url()).hash.match(/job\/([0-9a-f-]{36})/)?.[1];
  if (!job) throw new Error(`not on a job: ${page.url()}`);
  await page.evaluate(([j, i]) => (window.location.hash = `#/job/${j}/step/${i}`), [job, String(n - 1)] as const);
  await expect(page.getByText(new RegExp(`^Step ${n} of \\d+$`))).toBeVisible();
}

export async function acknowledgeCautions(page: Page) {
  const ack = page.getByRole("button", { name: "I have read these cautions" });
  if (await ack.isVisible()) await ack.click();
}

/**
 * Reads every spot of the step that is not read yet; `values` gives the value per spec label,
 * or per "label|slot label" for one spot.
 */
export async function readOpenSpots(page: Page, values: Record<string, string>) {
  const sections = page.getByRole("region", { name: /^Measure / });
  const count = await sections.count();
  for (let s = 0; s < count; s++) {
    const section = sections.nth(s);
    const label = (await section.getAttribute("aria-label"))!.replace(/^Measure /, "");
    const open = section.getByRole("button").filter({ hasText: "not read" });
    while ((await open.count()) > 0) {
      const slot = open.first();
      const slotName = (await slot.locator("span").first().textContent())!.trim();
      await slot.click();
      const value = values[`${label}|${slotName}`] ?? values[label];
      if (!value) throw new Error(`no value for ${label} ${slotName}`);
      await typeIn(section, value);
      await section.getByRole("button", { name: "Save reading" }).click();
      await expect(section.getByRole("status").filter({ hasText: "saved" })).toContainText(`${slotName}: ${value}`);
      // The spot shows its reading before the next count (the status line can come first).
      await expect(
        section
          .getByRole("button")
          .filter({ has: page.getByText(slotName, { exact: true }) })
          .first(),
      ).not.toContainText("not read");
    }
  }
}

/**
 * Replaces every reading out of tolerance shown on the step with `value` (a correction), one spot
 * at a time, waiting for each spot to show the new value. Returns the spots corrected
 * ("spec label slot label").
 */
export async function correctOutOfTolerance(page: Page, value: string): Promise<string[]> {
  const corrected: string[] = [];
  const sections = page.getByRole("region", { name: /^Measure / });
  const count = await sections.count();
  for (let s = 0; s < count; s++) {
    const section = sections.nth(s);
    const label = (await section.getAttribute("aria-label"))!.replace(/^Measure /, "");
    const bad = section.getByRole("button").filter({ hasText: /High|Low/ });
    const slots = await bad.evaluateAll((els) => els.map((el) => el.querySelector("span")?.textContent?.trim() ?? ""));
    for (const slotName of slots) {
      const slot = section.getByRole("button").filter({ has: page.getByText(slotName, { exact: true }) });
      await slot.click();
      await expect(section.getByText(`Reading for: ${slotName}`)).toBeVisible();
      await typeIn(section, value);
      await section.getByRole("button", { name: "Save reading" }).click();
      await expect(section.getByRole("status").filter({ hasText: "saved" })).toContainText(`${slotName}: ${value} mm saved (correction`);
      await expect(slot).toContainText(`${value} mm`);
      await expect(slot).not.toContainText(/High|Low/);
      corrected.push(`${label} ${slotName}`);
    }
  }
  return corrected;
}

export async function finishStep(page: Page) {
  const done = page.getByRole("button", { name: "Step done" });
  if (await done.isVisible()) {
    await expect(done).toBeEnabled();
    await done.click();
  } else {
    await expect(page.getByTestId("step-done")).toBeVisible();
  }
}
