#!/usr/bin/env node
// Runs Prettier over the sources: `--check` for CI, `--write` to fix.
import { spawnSync } from "node:child_process";

const mode = process.argv[2] === "--write" ? "--write" : "--check";
const globs = ["src/**/*.{ts,tsx,css}", "tests/**/*.ts", "bench/**/*.ts", "scripts/**/*.mjs", "bin/**/*.mjs", "*.ts", "index.html"];
const r = spawnSync("npx", ["prettier", mode, "--log-level", "warn", "--no-error-on-unmatched-pattern", ...globs], { stdio: "inherit" });
process.exit(r.status ?? 1);
