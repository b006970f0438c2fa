import { expect, test, type Locator, type Page } from "@playwright/test";
import { query } from "./support/e2e-db";
import { openJobByTag, waitForSynced } from "./support/bench-pad";
import { signIn } from "./support/demo-users";
import { acknowledgeCautions, openStep } from "./support/review-bench";

// An unlikely value is questioned before it is saved, an impossible one refused with the reason in
// workshop words. Demo job #1022 (tag GSW-0022, Tern Seven Twenty, bottom end, assigned to Tomas
// Reyes) is kept fresh for this file. Step 1 reads cylinder 1's bore (75.995–76.015 mm, six
// spots); step 5 torques the two rod bolts (pass 1: 10 N·m).

async function openJob(page: Page) {
  page.on("pageerror", (e) => console.log(`[page error] ${e.message}\n${e.stack}`));
  await signIn(page, "mechanic");
  await waitForSynced(page);
  await openJobByTag(page, "GSW-0022", "Tern Seven Twenty");
}

/** Clears the keypad in `scope`, then types `value` on it. */
async function retype(scope: Locator, value: string) {
  const display = scope.getByTestId("keypad-display");
  const backspace = scope.getByRole("button", { name: "Delete last digit" });
  // The display shows a grey "0" when empty; deleting past empty changes nothing.
  for (let i = 0; i < 14; i++) await backspace.click();
  for (const ch of value) {
    const name = ch === "." ? "Decimal point" : ch === "-" ? "Minus" : `Digit ${ch}`;
    await scope.getByRole("button", { name, exact: true }).click();
  }
  await expect(display).toHaveText(value.replace("-", "−"));
}

/** The question's two answers are on screen without scrolling, clear of the torque bar held at the bottom. */
async function expectAnswersOnScreen(page: Page, prompt: Locator) {
  const bar = page.getByTestId("torque-bar");
  const answers = [prompt.getByRole("button", { name: "No, type it again" }), prompt.getByRole("button", { name: /^Yes, it is right/ })];
  const clear = async () => {
    const floor = (await bar.count()) ? (await bar.boundingBox())!.y : page.viewportSize()!.height;
    for (const answer of answers) {
      const box = (await answer.boundingBox())!;
      if (box.y < 0 || box.y + box.height > floor) return `${await answer.textContent()}: ${box.y}–${box.y + box.height}, floor ${floor}`;
    }
    return "on screen";
  };
  await expect.poll(clear).toBe("on screen");
}

const boreRows = () =>
  query<{ value: string; reading_index: number }>(
    `SELECT m.value::text, m.reading_index FROM measurements m JOIN measurement_specs s ON s.id = m.spec_id
     JOIN work_orders w ON w.id = m.work_order_id WHERE w.number = 1022 AND s.key = 'bore-1' ORDER BY m.received_at`,
  );

const rodBoltRows = () =>
  query<{ bolt: number; pass_index: number; wrench: string | null; wrench_unit: string | null }>(
    `SELECT t.bolt, t.pass_index, t.wrench_reading::text AS wrench, t.wrench_unit FROM torque_records t JOIN template_steps s ON s.id = t.step_id
     JOIN work_orders w ON w.id = t.work_order_id WHERE w.number = 1022 AND s.key = 'rod-bolts' ORDER BY t.received_at`,
  );

test("a bore reading of zero or below zero is questioned: “type it again” saves nothing, “it is right” saves the text as typed; a size beyond any engine is refused", async ({
  page,
}) => {
  await openJob(page);
  await openStep(page, 1);
  await expect(page.getByTestId("step-title")).toHaveText("Bore gauge cylinder 1");
  await acknowledgeCautions(page);
  const section = page.getByRole("region", { name: "Measure Cylinder 1 bore" });
  const prompt = section.getByTestId("plausibility-prompt");
  const topThrust = section.getByTestId("reading-slot").first();
  await expect(topThrust).toHaveAttribute("aria-pressed", "true");

  // Zero: did the instrument read at all? Typed again: nothing saved.
  await retype(section, "0");
  await section.getByRole("button", { name: "Save reading" }).click();
  await expect(prompt).toContainText("Check this value: 0 mm");
  await expect(prompt).toContainText("A reading of zero: did the instrument read at all? The spec is 75.995 to 76.015 mm.");
  await expectAnswersOnScreen(page, prompt);
  await page.screenshot({ path: test.info().outputPath("zero-bore-question.png") });
  await section.getByRole("button", { name: "No, type it again" }).click();
  await expect(prompt).toHaveCount(0);
  await expect(topThrust).toContainText("not read");
  await expect(page.getByTestId("waiting-count")).toHaveText("Nothing waiting to send");

  // Beyond anything on an engine: refused with the reason, nothing saved, no question offered.
  await retype(section, "5000");
  await section.getByRole("button", { name: "Save reading" }).click();
  await expect(section.getByRole("alert")).toHaveText(
    "✖ Not saved: Value: 5000 mm is beyond anything on an engine (the most is 2000 mm); check the instrument and type it again.",
  );
  await expect(prompt).toHaveCount(0);
  await expect(topThrust).toContainText("not read");
  await page.screenshot({ path: test.info().outputPath("absurd-bore-refused.png") });

  // Below zero, and the mechanic says it is right: saved exactly as typed, trailing zeros included.
  await retype(section, "-76.000");
  await section.getByRole("button", { name: "Save reading" }).click();
  await expect(prompt).toContainText("Check this value: -76.000 mm");
  await expect(prompt).toContainText("-76.000 mm is below zero: a bore, a gap or a clearance cannot be negative.");
  await expectAnswersOnScreen(page, prompt);
  await section.getByRole("button", { name: "Yes, it is right: save -76.000 mm" }).click();
  await expect(section.getByRole("status").filter({ hasText: "saved" })).toContainText("Top thrust: -76.000 mm saved");
  await expect(topThrust.getByTestId("reading-value")).toHaveText("-76.000 mm");
  await waitForSynced(page);
  expect(await boreRows()).toEqual([{ value: "-76.000", reading_index: 0 }]);
});

test("a wrench reading far above the pass's target is questioned; 99999 N·m is refused with the reason; a confirmed one is saved as typed", async ({
  page,
}) => {
  await openJob(page);
  await openStep(page, 5);
  await expect(page.getByTestId("step-title")).toHaveText("Torque connecting-rod bolts");
  await acknowledgeCautions(page);
  await expect(page.getByTestId("torque-next")).toContainText("Pass 1 of 3: bolt 1");
  await expect(page.getByTestId("torque-target")).toHaveText("10 N·m (7.376 lbf·ft)");
  await page.getByRole("button", { name: "Record the wrench reading instead" }).click();
  const spec = page.getByTestId("torque-spec");
  const prompt = spec.getByTestId("plausibility-prompt");
  const save = spec.getByRole("button", { name: "Save N·m reading for bolt 1" });

  // Three times the target: asked; "type it again" saves nothing.
  await retype(spec, "30");
  await save.click();
  await expect(prompt).toContainText("Check this value: 30 N·m for bolt 1, pass 1");
  await expect(prompt).toContainText(
    "30 N·m is far above this pass's target of 10 N·m: was the bolt over-tightened, or the reading mistyped?",
  );
  await page.screenshot({ path: test.info().outputPath("wrench-far-above-question.png") });
  await spec.getByRole("button", { name: "No, type it again" }).click();
  await expect(prompt).toHaveCount(0);
  await expect(page.getByTestId("waiting-count")).toHaveText("Nothing waiting to send");

  // 99999 N·m: refused, the reason in workshop words, no question, nothing saved.
  await retype(spec, "99999");
  await save.click();
  await expect(spec.getByRole("alert")).toHaveText(
    "✖ Not saved: Wrench reading: 99999 N·m is beyond any fastener on an engine (the most is 2000 N·m); check the wrench and type it again.",
  );
  await expect(prompt).toHaveCount(0);
  await expect(page.getByTestId("waiting-count")).toHaveText("Nothing waiting to send");
  await expect(page.getByTestId("torque-next")).toContainText("Pass 1 of 3: bolt 1");
  await page.screenshot({ path: test.info().outputPath("wrench-absurd-refused.png") });

  // Confirmed: saved with the reading as typed, and the sequence moves on.
  await retype(spec, "31.50");
  await save.click();
  await expect(prompt).toContainText("31.50 N·m is far above this pass's target of 10 N·m");
  await spec.getByRole("button", { name: /^Yes, it is right: save 31\.50 N·m for bolt 1, pass 1$/ }).click();
  await expect(page.getByTestId("torque-next")).toContainText("Pass 1 of 3: bolt 2");
  await waitForSynced(page);
  expect(await rodBoltRows()).toEqual([{ bolt: 1, pass_index: 1, wrench: "31.50", wrench_unit: "N·m" }]);
});
