#!/usr/bin/env node
// Builds the `diodeloom` command into dist/cli: the TypeScript of src/cli,
// src/render and src/core bundled by rolldown into plain JavaScript, split so
// that each subcommand is its own chunk, loaded only when it runs (`--version`
// and `--help` load main.mjs alone). The runtime dependencies (valibot, highs
// with its WebAssembly, svgdom, svg.js) stay in node_modules, where the
// installed package has them.
//
// Run by `npm ci` (the `prepare` script), by the tests before they start
// (tests/support/buildCliOnce.ts), and by `npm run bench`.
import { mkdtempSync, renameSync, rmSync, existsSync, mkdirSync } from "node:fs";
import { dirname, join, resolve } from "node:path";
import { fileURLToPath } from "node:url";
import { build } from "rolldown";

const ROOT = resolve(dirname(fileURLToPath(import.meta.url)), "..");
/** Where the built command lives; bin/diodeloom.mjs imports main.mjs from here. */
export const CLI_DIR = join(ROOT, "dist", "cli");
/** The entry file of the built command. */
export const CLI_ENTRY = join(CLI_DIR, "main.mjs");

/**
 * Builds the command. The new files are written beside the old ones and
 * swapped in with two renames, so a command started meanwhile never finds
 * half a build.
 *
 * @returns the build time, milliseconds
 */
export async function buildCli() {
  const t0 = performance.now();
  mkdirSync(dirname(CLI_DIR), { recursive: true });
  const fresh = mkdtempSync(`${CLI_DIR}.new-`);
  try {
    await build({
      input: { main: join(ROOT, "src", "cli", "main.ts") },
      platform: "node",
      // Bare specifiers are the runtime dependencies and node's own modules.
      external: (id) => !id.startsWith(".") && !id.startsWith("/") && !id.startsWith("\0"),
      logLevel: "warn",
      output: {
        dir: fresh,
        format: "esm",
        entryFileNames: "[name].mjs",
        chunkFileNames: "[name]-[hash].mjs",
        sourcemap: true,
      },
    });
    const old = `${CLI_DIR}.old-${process.pid}`;
    if (existsSync(CLI_DIR)) renameSync(CLI_DIR, old);
    renameSync(fresh, CLI_DIR);
    rmSync(old, { recursive: true, force: true });
  } finally {
    rmSync(fresh, { recursive: true, force: true });
  }
  return performance.now() - t0;
}

if (process.argv[1] && resolve(process.argv[1]) === fileURLToPath(import.meta.url)) {
  const ms = await buildCli();
  if (!process.argv.includes("--quiet")) process.stdout.write(`diodeloom command built in ${ms.toFixed(0)} ms: ${CLI_ENTRY}\n`);
}
