#!/usr/bin/env node
// Entry point of the installed `diodeloom` command: runs the TypeScript
// sources through tsx, so no build step stands between a clone and a run.
import { register } from "tsx/esm/api";

register();
const { main } = await import("../src/cli/main.ts");
process.exitCode = await main(process.argv.slice(2));
