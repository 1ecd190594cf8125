import { defineConfig } from "@playwright/test";

/**
 * Browser tests of the server mode: PostgreSQL, two app instances and two job workers started by
 * tests/e2e-server/deployment.ts from the same production build as the embedded tests.
 */
export default defineConfig({
  testDir: "./tests/e2e-server",
  testMatch: /.*\.spec\.ts/,
  workers: 1,
  timeout: 300_000,
  globalSetup: "./tests/e2e-server/deployment.ts",
  reporter: [["list"], ["json", { outputFile: ".test-report/e2e-server.json" }]],
  use: {
    trace: "retain-on-failure",
    launchOptions: {
      executablePath: process.env.CHROMIUM_PATH ?? "/usr/bin/chromium",
      args: ["--no-sandbox", "--disable-gpu", "--disable-quic", "--no-first-run", "--disable-background-networking"],
    },
  },
});
