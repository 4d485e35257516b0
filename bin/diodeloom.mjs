#!/usr/bin/env node
// Entry point of the installed `diodeloom` command. It runs the built
// JavaScript in dist/cli (made by `npm ci` through the `prepare` script, or by
// `npm run build:cli`), so a start transpiles nothing and loads only the
// subcommand it runs.
let main;
try {
  ({ main } = await import("../dist/cli/main.mjs"));
} catch (e) {
  if (e?.code !== "ERR_MODULE_NOT_FOUND" || !String(e.message).includes("dist/cli/main.mjs")) throw e;
  process.stderr.write("diodeloom is not built yet: run `npm run build:cli` (npm ci does it) in the diodeloom folder\n");
  process.exit(70);
}
process.exitCode = await main(process.argv.slice(2));
