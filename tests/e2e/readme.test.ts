/**
 * The README says what the command and the app do, in their own words: the
 * usage lines and the exit codes exactly as `--help` prints them, every
 * `export` option, the address `npm start` serves on, how to get back to the
 * demo, and the glossary in the sentences the app shows (helpText.ts).
 */
import { execFile } from "node:child_process";
import { readFileSync } from "node:fs";
import { describe, expect, it } from "vitest";
import { HELP, HELP_ORDER } from "../../src/ui/helpText.ts";

const BIN = new URL("../../bin/diodeloom.mjs", import.meta.url).pathname;
const ROOT = new URL("../../", import.meta.url).pathname;
const README = readFileSync(new URL("../../README.md", import.meta.url), "utf8");
const COMMANDS = ["synth", "compare", "export", "budget", "netlist"] as const;

function help(args: string[]): Promise<string> {
  return new Promise((resolve, reject) => {
    execFile(process.execPath, [BIN, ...args], { cwd: ROOT, timeout: 60_000 }, (err, stdout) => (err ? reject(err) : resolve(stdout)));
  });
}

/** The lines of the README's first `text` block after a heading. */
function blockAfter(heading: string): string[] {
  const start = README.indexOf(heading);
  expect(start, heading).toBeGreaterThanOrEqual(0);
  const open = README.indexOf("```text\n", start) + "```text\n".length;
  return README.slice(open, README.indexOf("```", open)).trimEnd().split("\n");
}

/** The README's section under a `## ` heading, up to the next one. */
function section(heading: string): string {
  const start = README.indexOf(`## ${heading}\n`);
  expect(start, heading).toBeGreaterThanOrEqual(0);
  const end = README.indexOf("\n## ", start + 3);
  return README.slice(start, end < 0 ? undefined : end);
}

describe("the README", () => {
  it("gives every command's usage line exactly as `COMMAND --help` prints it", async () => {
    const usage = blockAfter("## Command line");
    for (const c of COMMANDS) {
      const first = (await help([c, "--help"])).split("\n")[0] ?? "";
      expect(first.startsWith("usage: ")).toBe(true);
      expect(usage, c).toContain(first.slice("usage: ".length));
    }
    expect(usage).toHaveLength(COMMANDS.length + 1);
  });

  it("gives the exit codes as `--help` prints them, and explains each one", async () => {
    const line = (await help(["--help"])).split("\n").find((l) => l.startsWith("Exit codes:"));
    expect(line).toBeDefined();
    expect(README).toContain(`\`\`\`text\n${line}\n\`\`\``);
    const codes = [...line!.matchAll(/(\d+) ([a-z ]+?)(?:,|\.$)/g)];
    expect(codes).toHaveLength(line!.split(",").length);
    for (const m of codes) expect(README, `exit code ${m[1]}`).toMatch(new RegExp(`^- ${m[1]} ${m[2]}[;:]`, "m"));
  });

  it("names every option `export --help` lists", async () => {
    const options = [...(await help(["export", "--help"])).matchAll(/^ {2}(--[a-z-]+)/gm)].map((m) => m[1]);
    expect(options.length).toBeGreaterThan(10);
    const cl = section("Command line");
    const exportPart = cl.slice(cl.indexOf("- `export` writes"));
    for (const o of options) expect(exportPart, o).toContain(`\`${o}`);
  });

  it("gives the address `npm start` serves on, which is the one it serves on", async () => {
    const m = /serves it on `http:\/\/([\d.]+):(\d+)`/.exec(README);
    expect(m).not.toBeNull();
    const pkg = JSON.parse(readFileSync(new URL("../../package.json", import.meta.url), "utf8")) as { scripts: Record<string, string> };
    expect(pkg.scripts["start"]).toMatch(/scripts\/serveApp\.mjs/);
    // serveApp's defaults are what `npm start` uses without HOST and PORT.
    const source = readFileSync(new URL("../../scripts/serveApp.mjs", import.meta.url), "utf8");
    expect(source).toContain(`process.env.HOST || "${m![1]}"`);
    expect(source).toContain(`process.env.PORT || "${m![2]}"`);
  });

  it("says how long the test command takes and how to get back to the demo", () => {
    expect(section("Two commands")).toMatch(/`npm test` takes about \d+ minutes/);
    expect(section("Two commands")).toMatch(/back to the demo[^.]*\*\*New\*\* menu/);
  });

  it("carries the glossary in the sentences the app shows", () => {
    const glossary = section("Glossary");
    for (const k of HELP_ORDER) expect(glossary, k).toContain(`- **${HELP[k].term}**: ${HELP[k].text}\n`);
    expect([...glossary.matchAll(/^- \*\*/gm)]).toHaveLength(HELP_ORDER.length);
  });
});
