// Vitest runs apart from the React Router Vite plugin: unit tests (*.test.ts beside the code) and
// integration specs (tests/**/*.spec.ts, real PostgreSQL/S3/mail fakes). Playwright owns tests/e2e.
import { defineConfig } from "vitest/config";
import { fileURLToPath } from "node:url";

export default defineConfig({
  resolve: { alias: { "~": fileURLToPath(new URL("./app", import.meta.url)) } },
  test: {
    include: ["app/**/*.test.ts", "app/**/*.test.tsx", "db/**/*.test.ts", "tests/integration/**/*.spec.ts"],
    exclude: ["tests/e2e/**", "node_modules/**"],
    environment: "node",
    fileParallelism: false,
    testTimeout: 20_000,
    hookTimeout: 60_000,
  },
});
