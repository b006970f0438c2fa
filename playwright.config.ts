import path from "node:path";
import { defineConfig, devices } from "@playwright/test";

const port = Number(process.env.E2E_PORT ?? 3100);
const chromiumArgs = [
  "--no-sandbox",
  "--disable-gpu",
  "--disable-background-networking",
  "--disable-component-update",
  "--disable-sync",
  "--no-first-run",
];
// Written by tests/e2e/global-setup.ts before any browser starts.
const fakeCamera = path.resolve(import.meta.dirname, "tests/e2e/.generated/tag-camera.y4m");

// Debian's Chromium (installed by db/scripts/install-deps.sh --test); Playwright never downloads one.
export default defineConfig({
  testDir: "tests/e2e",
  globalSetup: "./tests/e2e/global-setup.ts",
  fullyParallel: false,
  workers: 1,
  // One retry in CI on this 2-core machine; a test that needs it is reported as flaky in the output.
  retries: process.env.CI ? 1 : 0,
  timeout: 90_000,
  expect: { timeout: 15_000 },
  reporter: [["list"]],
  outputDir: "test-results",
  use: {
    baseURL: `http://localhost:${port}`,
    viewport: { width: 1024, height: 768 },
    trace: "off",
    screenshot: "only-on-failure",
  },
  projects: [
    {
      name: "tablet-chromium",
      testIgnore: /camera\.spec\.ts/,
      use: {
        ...devices["Desktop Chrome"],
        viewport: { width: 1024, height: 768 },
        launchOptions: { executablePath: "/usr/bin/chromium", args: chromiumArgs },
      },
    },
    {
      // Chromium's fake camera plays a QR tag; only the scan tests run here.
      name: "tablet-camera",
      testMatch: /camera\.spec\.ts/,
      use: {
        ...devices["Desktop Chrome"],
        viewport: { width: 1024, height: 768 },
        permissions: ["camera"],
        launchOptions: {
          executablePath: "/usr/bin/chromium",
          args: [
            ...chromiumArgs,
            "--use-fake-ui-for-media-stream",
            "--use-fake-device-for-media-stream",
            `--use-file-for-fake-video-capture=${fakeCamera}`,
          ],
        },
      },
    },
  ],
  webServer: {
    command: "bash tests/e2e/serve.sh",
    url: `http://localhost:${port}/signin`,
    timeout: 180_000,
    reuseExistingServer: false,
    stdout: "pipe",
    stderr: "pipe",
  },
});
