import { defineConfig } from "vitest/config";
import path from "node:path";

export default defineConfig({
  resolve: {
    alias: {
      "@": path.resolve(import.meta.dirname),
      // Next aliases "server-only" itself; vitest needs an empty stand-in.
      "server-only": path.resolve(import.meta.dirname, "tests/stubs/empty.ts"),
    },
  },
  test: {
    environment: "node",
    include: ["geo/**/*.test.ts", "lib/**/*.test.ts", "db/**/*.test.ts", "tests/**/*.test.ts"],
    exclude: ["node_modules", "tests/e2e/**"],
    testTimeout: 30_000,
  },
});
