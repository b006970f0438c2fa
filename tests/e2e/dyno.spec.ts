import { readFile } from "node:fs/promises";
import { expect, test, type Browser, type Page } from "@playwright/test";
import { PDFParse } from "pdf-parse";
import { signIn } from "./support/demo-users";
import { fromOurPage } from "./support/same-origin";

const SHOTS = "test-results/screens";
const HP_PER_KW = 1 / 0.74569987158227; // NIST SP 811 B.8: 1 hp (550 ft·lbf/s) = 745.699 9 W
const LBFFT_PER_NM = 1 / 1.3558179483314; // NIST SP 811 B.8: 1 lbf·ft = 1.355 818 N·m

async function pdfText(path: string) {
  const parser = new PDFParse({ data: new Uint8Array(await readFile(path)) });
  try {
    return (await parser.getText()).text;
  } finally {
    await parser.destroy();
  }
}

async function openDemoTurboJob(page: Page) {
  await page.goto("/dyno");
  await page.getByTestId("dyno-job").filter({ hasText: "GSW-0001" }).click();
  await expect(page.getByRole("heading", { level: 1, name: "Corvid RX1000 Turbo" })).toBeVisible();
}

const firstNumber = async (page: Page, testId: string, row = 0) =>
  Number((await page.getByTestId(testId).nth(row).locator("strong").innerText()).trim());

async function demoJobId(browser: Browser): Promise<string> {
  const ctx = await browser.newContext();
  const page = await ctx.newPage();
  await signIn(page, "office");
  await page.goto("/dyno");
  const href = await page.getByTestId("dyno-job").filter({ hasText: "GSW-0001" }).getAttribute("href");
  await ctx.close();
  const id = /\/jobs\/([0-9a-f-]{36})\/dyno/.exec(href ?? "")?.[1];
  if (!id) throw new Error(`no job id in ${href}`);
  return id;
}

test("office overlays two corrected runs, switches units, exports the plot and downloads the build report", async ({ page }) => {
  await signIn(page, "office");
  await openDemoTurboJob(page);
  await expect(page.getByRole("button", { name: /Baseline 7 psi/ })).toHaveAttribute("aria-pressed", "true");
  await expect(page.getByRole("button", { name: /10 psi after charge-air rework/ })).toHaveAttribute("aria-pressed", "true");
  // two runs × (power + torque) = four curves on the plot
  await expect(page.getByTestId("curve-chart").locator("path.recharts-line-curve")).toHaveCount(4);
  await expect(page.getByTestId("delta-chart")).toBeVisible();
  await expect(page.getByTestId("comparison")).toContainText("against Baseline 7 psi");
  await page.screenshot({ path: `${SHOTS}/dyno-1024x768.png`, fullPage: true });

  const kw = await firstNumber(page, "peak-power", 1);
  const nm = await firstNumber(page, "peak-torque", 1);
  await page.getByRole("button", { name: "hp", exact: true }).click();
  await expect(page.getByRole("columnheader", { name: "Peak power (hp)" })).toBeVisible();
  const hp = await firstNumber(page, "peak-power", 1);
  expect(Math.abs(hp - kw * HP_PER_KW)).toBeLessThan(0.1);
  await page.getByRole("button", { name: "lbf·ft", exact: true }).click();
  await expect(page.getByRole("columnheader", { name: "Peak torque (lbf·ft)" })).toBeVisible();
  const lbft = await firstNumber(page, "peak-torque", 1);
  expect(Math.abs(lbft - nm * LBFFT_PER_NM)).toBeLessThan(0.1);

  // one run off: two curves
  await page.getByRole("button", { name: /Baseline 7 psi/ }).click();
  await expect(page.getByTestId("curve-chart").locator("path.recharts-line-curve")).toHaveCount(2);
  await expect(page.getByTestId("comparison")).toHaveCount(0);
  await page.getByRole("button", { name: /Baseline 7 psi/ }).click();
  await expect(page.getByTestId("curve-chart").locator("path.recharts-line-curve")).toHaveCount(4);

  const [svgDownload] = await Promise.all([page.waitForEvent("download"), page.getByRole("button", { name: "Save plot as SVG" }).click()]);
  const svg = await readFile((await svgDownload.path())!, "utf8");
  expect(svg.startsWith("<svg")).toBe(true);
  expect(svg).toContain("Baseline 7 psi: power");
  expect(svg).toContain("(hp)");
  expect(svg).toContain("recharts-line-curve");
  const [pngDownload] = await Promise.all([page.waitForEvent("download"), page.getByRole("button", { name: "Save plot as PNG" }).click()]);
  const png = await readFile((await pngDownload.path())!);
  expect([...png.subarray(0, 8)]).toEqual([0x89, 0x50, 0x4e, 0x47, 0x0d, 0x0a, 0x1a, 0x0a]);
  expect(png.length).toBeGreaterThan(5000);

  const [report] = await Promise.all([page.waitForEvent("download"), page.getByTestId("download-report").click()]);
  expect(report.suggestedFilename()).toMatch(/^build-report-GSW-0001-1001\.pdf$/);
  const reportPath = (await report.path())!;
  expect((await readFile(reportPath)).subarray(0, 5).toString()).toBe("%PDF-");
  const text = await pdfText(reportPath);
  expect(text).toContain("Corvid RX1000 Turbo");
  expect(text).toContain("Dyno results");
  expect(text).toContain("10 psi after charge-air rework");
});

test("the dyno page reads well on a tablet held upright (768×1024)", async ({ page }) => {
  await page.setViewportSize({ width: 768, height: 1024 });
  await signIn(page, "supervisor");
  await openDemoTurboJob(page);
  await expect(page.getByTestId("curve-chart").locator("path.recharts-line-curve")).toHaveCount(4);
  const overflow = await page.evaluate(() => document.documentElement.scrollWidth - document.documentElement.clientWidth);
  expect(overflow).toBeLessThanOrEqual(0);
  await page.screenshot({ path: `${SHOTS}/dyno-768x1024.png`, fullPage: true });
});

test("the build report route: the owner gets it, another customer and a mechanic get no data", async ({ browser }) => {
  const id = await demoJobId(browser);
  const url = `/api/jobs/${id}/build-report`;

  const owner = await browser.newContext();
  const ownerPage = await owner.newPage();
  await signIn(ownerPage, "customer"); // Felix Amadi owns GSW-0001
  await expect(ownerPage.getByTestId("my-build-report").first()).toBeVisible();
  const mine = await ownerPage.request.get(url);
  expect(mine.status()).toBe(200);
  expect(mine.headers()["content-type"]).toBe("application/pdf");
  expect((await mine.body()).subarray(0, 5).toString()).toBe("%PDF-");
  await owner.close();

  const other = await browser.newContext();
  const otherPage = await other.newPage();
  await signIn(otherPage, "customer2");
  const refused = await otherPage.request.get(url);
  expect(refused.status()).toBe(404);
  const body = await refused.text();
  expect(body).not.toContain("%PDF");
  expect(body).not.toContain("Corvid");
  expect((await otherPage.request.get("/api/jobs/not-a-uuid/build-report")).status()).toBe(404);
  await otherPage.goto("/dyno");
  await expect(otherPage).toHaveURL(/\/my-bikes\?refused=dyno/);
  await other.close();

  const mech = await browser.newContext();
  const mechPage = await mech.newPage();
  await signIn(mechPage, "mechanic");
  expect((await mechPage.request.get(url)).status()).toBe(403);
  await mechPage.goto(`/jobs/${id}/dyno`);
  await expect(mechPage.getByRole("heading", { level: 1, name: "Corvid RX1000 Turbo" })).toBeVisible();
  await expect(mechPage.getByTestId("download-report")).toHaveCount(0);
  await mech.close();

  const anon = await browser.newContext();
  expect((await anon.request.get(url)).status()).toBe(401);
  expect((await anon.request.post(`/api/jobs/${id}/dyno-runs`, { data: {}, headers: fromOurPage })).status()).toBe(401);
  await anon.close();
});

test("a mechanic uploads a bad CSV, sees line-and-column errors and nothing saved, then a good one", async ({ page }) => {
  await signIn(page, "mechanic");
  await openDemoTurboJob(page);
  // Mechanics record runs; withdrawing one is for the supervisor or the office.
  await expect(page.getByTestId("withdraw-run")).toHaveCount(0);
  const jobId = /\/jobs\/([0-9a-f-]{36})\/dyno/.exec(page.url())![1];
  const { runs } = (await (await page.request.get(`/api/jobs/${jobId}/dyno-runs`)).json()) as { runs: Array<{ id: string }> };
  const refused = await page.request.post(`/api/jobs/${jobId}/dyno-runs/${runs[0].id}/withdraw`, {
    data: { reason: "Mechanic trying to withdraw" },
    headers: fromOurPage,
  });
  expect(refused.status()).toBe(403);
  expect(JSON.stringify(await refused.json())).not.toContain(runs[0].id);
  const runButtons = page.getByRole("button", { name: /psi/ }).filter({ has: page.locator("span") });
  const before = await runButtons.count();
  await page.getByLabel("Run name").fill("11 psi, baffle out");
  await page.getByLabel("Boost target").fill("11");
  await page.getByLabel("Air pressure (kPa)").fill("100.1");
  await page.getByLabel("Air temperature (°C)").fill("21");
  await page.getByLabel("Humidity (%)").fill("50");
  await page
    .getByLabel(/^Columns:/)
    .setInputFiles({ name: "bad.csv", mimeType: "text/csv", buffer: Buffer.from("rpm,torque_nm\n4000,100\n4500,lots\n3900,110\n") });
  await page.getByRole("button", { name: "Save run" }).click();
  const errors = page.getByTestId("curve-errors");
  await expect(errors).toContainText("Line 3, torque_nm: Torque must be a number");
  await expect(errors).toContainText("Line 4, rpm: Engine speed must rise");
  await expect(page.getByTestId("form-message")).toContainText("Nothing was saved");
  await page.reload();
  await expect(runButtons).toHaveCount(before);

  await page.getByLabel("Run name").fill("11 psi, baffle out");
  await page.getByLabel("Boost target").fill("11");
  await page.getByLabel("Air pressure (kPa)").fill("abc");
  await page.getByLabel("Air temperature (°C)").fill("21");
  await page.getByLabel("Humidity (%)").fill("50");
  await page.getByLabel(/^Columns:/).setInputFiles({
    name: "good.csv",
    mimeType: "text/csv",
    buffer: Buffer.from("rpm,torque_nm\n4000,100\n6000,130\n8000,128\n10000,110\n"),
  });
  await page.getByRole("button", { name: "Save run" }).click();
  await expect(page.getByTestId("error-pressureKpa")).toContainText("Air pressure must be a number");
  await page.getByLabel("Air pressure (kPa)").fill("100.1");
  await page.getByRole("button", { name: "Save run" }).click();
  await expect(page.getByTestId("form-message")).toContainText("saved");
  await expect(page.getByRole("button", { name: /11 psi, baffle out/ })).toHaveAttribute("aria-pressed", "true");
  await expect(page.getByTestId("curve-chart").locator("path.recharts-line-curve")).toHaveCount(6);
  await expect(page.getByRole("row", { name: /^11 psi, baffle out/ })).toBeVisible();
  await page.screenshot({ path: `${SHOTS}/dyno-after-upload.png`, fullPage: true });
});

test("a supervisor types a curve into the table; a bad cell is named by row and column", async ({ page }) => {
  await signIn(page, "supervisor");
  await openDemoTurboJob(page);
  await page.getByRole("button", { name: "Typed in" }).click();
  await page.getByLabel("Run name").fill("Typed check");
  await page.getByLabel("Boost target").fill("0");
  await page.getByLabel("Air pressure (kPa)").fill("101");
  await page.getByLabel("Air temperature (°C)").fill("20");
  await page.getByLabel("Humidity (%)").fill("40");
  const rows = [
    ["5000", "90"],
    ["7000", "1OO"], // letter O typed for zero
    ["9000", "95"],
  ];
  for (const [i, [rpm, torque]] of rows.entries()) {
    await page.getByLabel(`Row ${i + 1} engine speed`).fill(rpm);
    await page.getByLabel(`Row ${i + 1} torque`).fill(torque);
  }
  await page.getByRole("button", { name: "Save run" }).click();
  await expect(page.getByTestId("curve-errors")).toContainText('Row 2, Torque (N·m): Torque must be a number; got "1OO"');
  await expect(page.getByLabel("Row 2 torque")).toHaveAttribute("aria-invalid", "true");
  await page.getByLabel("Row 2 torque").fill("100");
  await page.getByRole("button", { name: "Save run" }).click();
  await expect(page.getByTestId("form-message")).toContainText("Typed check");
  // (anchored: the comparison table's header row names the runs too)
  const row = page.getByRole("row", { name: /^Typed check/ });
  // 100 N·m at 7000 rpm, corrected with SAE J1349 at 101 kPa, 20 °C, 40 % RH; no tune file on this job
  await expect(row.getByTestId("run-tune")).toContainText("Tune: none named");
  await expect(row.getByTestId("peak-torque")).toContainText("at 7000");

  // Typed on the wrong job after all: the supervisor withdraws it with a reason. It leaves the plot
  // and the figures, and stays on record below with who and why.
  const curves = await page.getByTestId("curve-chart").locator("path.recharts-line-curve").count();
  const withdraw = page.getByTestId("withdraw-run");
  await withdraw.getByText("Withdraw a run recorded by mistake").click();
  const runSelect = withdraw.getByLabel("Run", { exact: true });
  await runSelect.selectOption((await runSelect.locator("option", { hasText: "Typed check" }).getAttribute("value"))!);
  await withdraw.getByRole("button", { name: "Withdraw this run" }).click();
  await expect(withdraw.getByTestId("error-reason")).toHaveText("✖ Say why the run is withdrawn (at least 5 characters).");
  // The route checks the reason the same way: a 400 naming the field, and nothing withdrawn.
  const jobId = /\/jobs\/([0-9a-f-]{36})\/dyno/.exec(page.url())![1];
  const typedId = (await runSelect.inputValue())!;
  const short = await page.request.post(`/api/jobs/${jobId}/dyno-runs/${typedId}/withdraw`, {
    data: { reason: "no" },
    headers: fromOurPage,
  });
  expect(short.status()).toBe(400);
  expect((await short.json()).issues).toEqual([{ path: "reason", message: "Say why the run is withdrawn (at least 5 characters)." }]);
  await withdraw.getByLabel("Why it is withdrawn").fill("Typed on the wrong job card");
  await withdraw.getByRole("button", { name: "Withdraw this run" }).click();
  await expect(withdraw.getByTestId("form-ok")).toContainText("“Typed check” withdrawn");
  await expect(page.getByRole("row", { name: /^Typed check/ })).toHaveCount(0);
  await expect(page.getByRole("button", { name: /Typed check/ })).toHaveCount(0);
  await expect(page.getByTestId("curve-chart").locator("path.recharts-line-curve")).toHaveCount(curves - 2);
  await expect(page.getByTestId("withdrawn-run").filter({ hasText: "Typed check" })).toContainText(
    "by Dana Kowal: “Typed on the wrong job card”",
  );
  await page.screenshot({ path: `${SHOTS}/dyno-withdrawn.png`, fullPage: true });
});
