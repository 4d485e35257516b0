/**
 * The command as it is shipped: bin/diodeloom.mjs runs the built JavaScript
 * in dist/cli (the vitest set-up builds it from these sources first), loads a
 * subcommand only when it runs, and still finds HiGHS and its WebAssembly.
 */
import { execFile } from "node:child_process";
import { copyFileSync, mkdirSync, mkdtempSync, readFileSync, rmSync, writeFileSync } from "node:fs";
import { tmpdir } from "node:os";
import { dirname, join, resolve } from "node:path";
import { fileURLToPath } from "node:url";
import { afterAll, describe, expect, it } from "vitest";
import { CLI_DIR, CLI_ENTRY } from "../../scripts/buildCli.mjs";

const ROOT = fileURLToPath(new URL("../../", import.meta.url));
const BIN = join(ROOT, "bin", "diodeloom.mjs");
const dir = mkdtempSync(join(tmpdir(), "diodeloom-built-"));
afterAll(() => rmSync(dir, { recursive: true, force: true }));

function run(nodeArgs: string[], args: string[]): Promise<{ code: number; stdout: string; stderr: string }> {
  return new Promise((done) => {
    execFile(process.execPath, [...nodeArgs, ...args], { cwd: ROOT, timeout: 120_000 }, (err, stdout, stderr) => {
      done({ code: err ? (typeof err.code === "number" ? err.code : 99) : 0, stdout, stderr });
    });
  });
}

/** The files a built module imports statically (`import ... from "..."`), resolved; bare names as they are. */
function staticImports(file: string): string[] {
  const text = readFileSync(file, "utf8");
  return [...text.matchAll(/^import\s[^;]*?from\s*"([^"]+)";?$|^import\s*"([^"]+)";?$/gm)].map((m) => {
    const spec = (m[1] ?? m[2]) as string;
    return spec.startsWith(".") ? resolve(dirname(file), spec) : spec;
  });
}

/** Everything a start of `file` loads before any dynamic import(). */
function staticClosure(file: string): Set<string> {
  const seen = new Set<string>();
  const todo = [file];
  while (todo.length > 0) {
    const f = todo.pop() as string;
    if (seen.has(f)) continue;
    seen.add(f);
    if (f.startsWith("/")) todo.push(...staticImports(f));
  }
  return seen;
}

describe("the built command", () => {
  it("is what bin/diodeloom.mjs runs: no TypeScript, no tsx at run time", () => {
    const bin = readFileSync(BIN, "utf8");
    expect(bin).toContain("../dist/cli/main.mjs");
    expect(bin).not.toMatch(/tsx|\.ts["']/);
    const pkg = JSON.parse(readFileSync(join(ROOT, "package.json"), "utf8")) as Record<string, Record<string, string>>;
    expect(pkg["dependencies"]).not.toHaveProperty("tsx");
    expect(pkg["scripts"]?.["prepare"]).toMatch(/scripts\/buildCli\.mjs/);
  });

  it("loads no subcommand, schema or drawing library for --version and --help", () => {
    const loaded = [...staticClosure(CLI_ENTRY)];
    const files = loaded.filter((f) => f.startsWith("/")).map((f) => f.slice(CLI_DIR.length + 1));
    // main.mjs and the chunk holding the argument parser and exit codes; node's own modules beside them.
    expect(files.length, files.join(", ")).toBeLessThanOrEqual(2);
    const bare = loaded.filter((f) => !f.startsWith("/"));
    expect(
      bare.every((s) => s.startsWith("node:")),
      bare.join(", "),
    ).toBe(true);
    const main = readFileSync(CLI_ENTRY, "utf8");
    for (const name of ["synth", "compare", "export", "budget", "netlist"]) {
      expect(main, `${name} is not imported on demand`).toMatch(new RegExp(`import\\("\\./${name}-[\\w-]+\\.mjs"\\)`));
    }
  });

  it("loads HiGHS and its WebAssembly from node_modules when the exact optimizer runs", async () => {
    // At depth 3 the per-state search does not apply, so HiGHS solves the model itself.
    const project = join(dir, "counting-0-9.json");
    writeFileSync(
      project,
      JSON.stringify({
        schema: "diodeloom/project@1",
        title: "Counting 0-9",
        counter: { states: 10 },
        display: { positions: 1, cell: "seg7" },
        show: [..."0123456789"],
      }),
    );
    // Notes every .wasm file the process reads, however the loader reads it.
    const watch = [
      'import fs from "node:fs";',
      "const seen = new Set();",
      'for (const [o, k] of [[fs, "readFileSync"], [fs, "readFile"], [fs.promises, "readFile"]]) {',
      "  const f = o[k];",
      '  o[k] = function (p, ...rest) { if (String(p).endsWith(".wasm")) seen.add(String(p)); return f.call(this, p, ...rest); };',
      "}",
      'process.on("exit", () => process.stderr.write(`wasm read: ${[...seen].join(" ")}\\n`));',
    ].join("\n");
    const r = await run(
      ["--import", `data:text/javascript,${encodeURIComponent(watch)}`, BIN],
      ["synth", project, "--json", "--max-depth", "3", "--time-limit", "1000"],
    );
    expect(r.code, r.stderr).toBe(0);
    expect(r.stderr).toMatch(/wasm read: \S*node_modules\/highs\/build\/highs\.wasm/);
    const m = JSON.parse(r.stdout) as { method: string; verified: boolean; depthLimit: number };
    // A HiGHS that failed to load would leave the heuristic's matrix (method "heuristic").
    expect(m.method).toBe("exact");
    expect(m.verified).toBe(true);
    expect(m.depthLimit).toBe(3);
  });

  it("says how to build it when dist/cli is missing", async () => {
    const lone = join(dir, "unbuilt", "bin");
    mkdirSync(lone, { recursive: true });
    copyFileSync(BIN, join(lone, "diodeloom.mjs"));
    const r = await run([join(lone, "diodeloom.mjs")], ["--version"]);
    expect(r.code).toBe(70);
    expect(r.stderr).toMatch(/not built yet: run `npm run build:cli`/);
    expect(r.stdout).toBe("");
  });
});
