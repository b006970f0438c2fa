import { createHash } from "node:crypto";
import { readFile } from "node:fs/promises";
import { expect, test, type Page } from "@playwright/test";
import { PDFParse } from "pdf-parse";
import { signIn } from "./support/demo-users";

// The tuner's journey on the demo turbo conversion (job 1050, GSW-0050, no runs at the start): a tune
// version uploaded, two logged runs imported through the column mapping (recorded under different
// standards), both overlaid corrected to one standard, the tune's hash in the handover PDF, and on the
// job's numbers page a compressor map outline typed in with an operating point warning.
// (tests/e2e/dyno.spec.ts covers the demo turbo job 1001: overlay, units, plot export, bad CSVs, typed curves.)

const SHOTS = "test-results/screens";

async function pdfText(path: string) {
  const parser = new PDFParse({ data: new Uint8Array(await readFile(path)) });
  try {
    return (await parser.getText()).text.replace(/\s+/g, " ");
  } finally {
    await parser.destroy();
  }
}

/** A logged pull in a logger's own column names, semicolon-separated (invented figures). */
function loggedFile(torqueScale: number): string {
  const lines = ["RPM;TQ_NM;MAP_KPA;IAT_IN;IAT_OUT"];
  for (let rpm = 4000; rpm <= 10000; rpm += 1000) {
    const torque = (70 + 8 * Math.sin((rpm - 4000) / 2500)) * torqueScale;
    lines.push(`${rpm};${torque.toFixed(1)};${(40 + rpm / 400).toFixed(1)};${(60 + rpm / 200).toFixed(1)};${(30 + rpm / 1000).toFixed(1)}`);
  }
  return lines.join("\n") + "\n";
}

async function importLoggedRun(page: Page, o: { label: string; standard: string; torqueScale: number }) {
  await page.getByLabel("Run name").fill(o.label);
  await page.getByLabel("Boost target").fill("10");
  await page.getByLabel("Boost unit").selectOption("psi");
  await page.getByLabel("Air pressure (kPa)").fill("99.2");
  await page.getByLabel("Air temperature (°C)").fill("24");
  await page.getByLabel("Humidity (%)").fill("40");
  await page.locator("#standard").selectOption({ label: o.standard });
  await page.getByRole("button", { name: "Logged file, choose columns" }).click();
  await page
    .locator("#logged-file")
    .setInputFiles({ name: `${o.label}.csv`, mimeType: "text/csv", buffer: Buffer.from(loggedFile(o.torqueScale)) });
  const step = page.getByTestId("mapping-step");
  await expect(step).toBeVisible();
  await step.getByLabel("Column RPM holds").selectOption({ label: "Engine speed" });
  await step.getByLabel("Column TQ_NM holds").selectOption({ label: "Torque" });
  await step.getByLabel("Column TQ_NM unit").selectOption("N·m");
  await step.getByLabel("Column MAP_KPA holds").selectOption({ label: "Manifold boost" });
  await step.getByLabel("Column MAP_KPA unit").selectOption("kPa");
  await step.getByLabel("Column IAT_IN holds").selectOption({ label: "Intake air before the intercooler" });
  await step.getByLabel("Column IAT_OUT holds").selectOption({ label: "Intake air after the intercooler" });
  await page.getByRole("button", { name: "Save run" }).click();
  await expect(page.getByTestId("form-message")).toContainText("saved");
  await expect(page.getByRole("button", { name: new RegExp(o.label) })).toBeVisible();
}

test("tune, two mapped logged runs at one standard, the hash in the PDF, and a compressor map warning on the job", async ({ page }) => {
  test.setTimeout(120_000);
  await page.setViewportSize({ width: 1024, height: 768 });
  await signIn(page, "office");
  await page.goto("/dyno");
  await page.getByTestId("dyno-job").filter({ hasText: "GSW-0050" }).click();
  await expect(page.getByRole("heading", { level: 1, name: "Kestrel KR900 Turbo" })).toBeVisible();

  // a tune version: its SHA-256 on the page is the file's own
  const tune = Buffer.from(`invented tune image ${Date.now()}\n`.repeat(40));
  const sha = createHash("sha256").update(tune).digest("hex");
  await page.getByText("Upload a tune version").click();
  await page.getByTestId("tune-file").setInputFiles({ name: "kr900-road.bin", mimeType: "application/octet-stream", buffer: tune });
  await page.getByLabel("Version label").fill("v1 road, 10 psi");
  await page.getByRole("button", { name: "Upload tune" }).click();
  // shown in groups of eight for reading aloud; the same 64 hex digits
  await expect(page.getByTestId("tune-hash").first()).toContainText(sha.slice(0, 8));
  expect((await page.getByTestId("tune-hash").first().innerText()).replace(/\s/g, "")).toContain(sha);
  await page.reload();

  // two logged runs through the column mapping, recorded under different standards
  await importLoggedRun(page, { label: "First pull 10 psi", standard: "SAE J1349 (1990 form)", torqueScale: 1 });
  await importLoggedRun(page, { label: "Second pull 10 psi", standard: "DIN 70020", torqueScale: 1.04 });

  // overlaid, both recomputed to one chosen standard; the difference is the two peaks' difference
  await page.getByTestId("correct-to").selectOption({ label: "ISO 1585 (spark ignition)" });
  await expect(page.getByTestId("compared-at")).toContainText("ISO 1585 (spark ignition)");
  await expect(page.getByTestId("curve-chart").locator("path.recharts-line-curve")).toHaveCount(4);
  const peak = async (row: number) => Number((await page.getByTestId("peak-power").nth(row).locator("strong").innerText()).trim());
  const delta = Number((await page.getByTestId("peak-power-delta").innerText()).replace(/[^\d.+-]/g, ""));
  expect(Math.abs(delta - (await peak(1)) + (await peak(0)))).toBeLessThan(0.15);
  await page.screenshot({ path: `${SHOTS}/turbo-journey-dyno-1024x768.png`, fullPage: true });

  // the handover PDF names the tune and its whole hash
  const [report] = await Promise.all([page.waitForEvent("download"), page.getByTestId("download-report").click()]);
  const text = await pdfText((await report.path())!);
  expect(text).toContain("v1 road, 10 psi");
  expect(text).toContain(sha);
  expect(text).toContain("Build figures");

  // the job's own turbo and fuel figures: 899 cc from the bike, 10 psi from the newest run
  await page.getByRole("link", { name: "This build's numbers" }).click();
  await expect(page.getByRole("heading", { level: 1, name: /Turbo and fuel figures: Kestrel KR900 Turbo/ })).toBeVisible();
  await expect(page.locator("#job-a-displacementCc")).toHaveValue("899");
  await expect(page.locator("#job-a-boostKpa")).toHaveValue("68.9");
  // a bad figure is refused in workshop words, naming the field
  await page.locator("#job-a-volumetricEfficiencyPercent").fill("400");
  await expect(page.getByTestId("ops-error")).toContainText("Volumetric efficiency must be more than 0 and at most 150 %; got 400 %.");
  await page.locator("#job-a-volumetricEfficiencyPercent").fill("95");

  // the outline typed from a (here invented) maker's sheet: a surge line at 10–12 lb/min
  const surge = [
    [10, 1.2],
    [12, 3.0],
  ];
  await page.locator("#job-surge").fill(surge.map((p) => p.join(", ")).join("\n"));
  await page.locator("#job-choke").fill("40, 1.2\n38, 3.0");
  const warnings = page.getByTestId("map-warnings");
  await expect(warnings).toContainText("surge warning");
  await expect(page.getByTestId("compressor-map-chart").getByTestId("surge-line")).toBeVisible();

  // every row's finding agrees with the typed line: left of it (by straight-line reading) is a surge warning
  const rows = page.getByTestId("operating-points").locator("tbody tr");
  const n = await rows.count();
  expect(n).toBe(8);
  let surged = 0;
  for (let i = 0; i < n; i++) {
    const cells = await rows.nth(i).locator("td").allInnerTexts();
    const flow = Number.parseFloat(cells[1]);
    const pr = Number.parseFloat(cells[2]);
    const surgeFlow = surge[0][0] + ((pr - surge[0][1]) / (surge[1][1] - surge[0][1])) * (surge[1][0] - surge[0][0]);
    const left = flow < surgeFlow - 0.05;
    if (left) surged++;
    if (Math.abs(flow - surgeFlow) > 0.05) expect(cells[4], `row ${cells[0]}`).toContain(left ? "▲ Surge warning" : "● Inside the outline");
  }
  expect(surged).toBeGreaterThan(0);
  await expect(warnings.locator("li")).toHaveCount(surged);

  // saved on the job's build sheet, and there after a reload
  await page.locator("#job-t-targetCompressionRatio").fill("9.2");
  await page.getByRole("button", { name: "Save on this job's build sheet" }).click();
  await expect(page.getByTestId("sheet-outcome")).toContainText("Saved on this job's build sheet.");
  await page.reload();
  await expect(page.locator("#job-surge")).toHaveValue("10, 1.2\n12, 3");
  await expect(page.locator("#job-t-targetCompressionRatio")).toHaveValue("9.2");
  await expect(page.getByTestId("build-figures")).toContainText("9.20:1");
  await expect(page.getByTestId("ic-from-run")).toContainText("Second pull 10 psi");
  await page.screenshot({ path: `${SHOTS}/turbo-journey-numbers-1024x768.png`, fullPage: true });
  await page.setViewportSize({ width: 768, height: 1024 });
  await expect(page.getByTestId("map-warnings")).toBeVisible();
  await page.screenshot({ path: `${SHOTS}/turbo-journey-numbers-768x1024.png`, fullPage: true });
});

test("the engine numbers page draws operating points over a typed outline and warns of choke", async ({ page }) => {
  await signIn(page, "mechanic");
  await page.goto("/calculators");
  await page.locator("#tp-surge").fill("3, 1.2\n4, 3.0");
  await page.locator("#tp-choke").fill("12, 1.2\n12, 3.0");
  await expect(page.getByTestId("map-warnings")).toContainText("choke warning");
  await expect(page.getByTestId("operating-points")).toContainText("■ Choke warning");
  // a typed point that is not two numbers is named by its line
  await page.locator("#tp-choke").fill("12, 1.2\n12 lots");
  await expect(page.getByTestId("outline-error")).toContainText(
    "Choke line, line 2: write the corrected air flow, then the pressure ratio, as two numbers",
  );
  await page.setViewportSize({ width: 768, height: 1024 });
  await page.screenshot({ path: `${SHOTS}/calculators-turbo-768x1024.png`, fullPage: true });
});
