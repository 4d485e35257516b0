import { defineConfig } from "vitest/config";
import solid from "vite-plugin-solid";

export default defineConfig({
  plugins: [solid()],
  worker: { format: "es" },
  // The web app goes to dist/web (served by `npm start`), beside the command's dist/cli.
  build: { outDir: "dist/web" },
  test: {
    include: ["tests/**/*.test.ts"],
    // The command's e2e tests run the built command: build it from the sources under test first.
    globalSetup: ["tests/support/buildCommand.ts"],
    environment: "node",
    testTimeout: 60_000,
    hookTimeout: 120_000,
    pool: "forks",
  },
});
