import { defineConfig } from "@playwright/test";

const PORT = Number(process.env.E2E_PORT ?? 3100);
const BASE = `http://127.0.0.1:${PORT}`;

export default defineConfig({
  testDir: "./tests/e2e",
  testMatch: /.*\.spec\.ts/,
  workers: 1,
  timeout: 60_000,
  reporter: [["list"], ["json", { outputFile: ".test-report/e2e.json" }]],
  use: {
    baseURL: BASE,
    trace: "retain-on-failure",
    launchOptions: {
      executablePath: process.env.CHROMIUM_PATH ?? "/usr/bin/chromium",
      args: [
        "--no-sandbox",
        "--disable-gpu",
        "--disable-quic",
        "--no-first-run",
        "--disable-background-networking",
        "--disable-component-update",
        "--disable-sync",
      ],
    },
  },
  webServer: {
    // Built by the test command beforehand; a fresh database seeded with the demo farm.
    command: `node lib/server/http/serve.mjs -p ${PORT}`,
    url: `${BASE}/api/health`,
    reuseExistingServer: false,
    timeout: 120_000,
    stdout: "pipe",
    env: {
      PLOTPROOF_DEMO: "1",
      OPEN_SIGNUP: "1",
      AUTH_SIGNIN_PER_MINUTE: "1000",
      PGLITE_DIR: "data/e2e/db",
      BETTER_AUTH_URL: BASE,
    },
  },
});
