/**
 * The installed command, run as a user runs it: `node bin/diodeloom.mjs`
 * (what `npx diodeloom` starts), in a child process.
 */
import { execFile } from "node:child_process";
import { mkdtempSync, writeFileSync, readdirSync } from "node:fs";
import { tmpdir } from "node:os";
import { join } from "node:path";
import { describe, expect, it } from "vitest";
import { EXAMPLES } from "../support/projects.ts";

const BIN = new URL("../../bin/diodeloom.mjs", import.meta.url).pathname;
const ROOT = new URL("../../", import.meta.url).pathname;

function run(args: string[], cwd = ROOT): Promise<{ code: number; stdout: string; stderr: string }> {
  return new Promise((resolve) => {
    execFile(process.execPath, [BIN, ...args], { cwd, timeout: 120_000 }, (err, stdout, stderr) => {
      const code = err ? (typeof err.code === "number" ? err.code : 99) : 0;
      resolve({ code, stdout, stderr });
    });
  });
}

describe("diodeloom command", () => {
  it("prints its version and help", async () => {
    const v = await run(["--version"]);
    expect(v.code).toBe(0);
    expect(v.stdout.trim()).toMatch(/^\d+\.\d+\.\d+$/);
    const h = await run(["--help"]);
    expect(h.code).toBe(0);
    expect(h.stdout).toMatch(/synth/);
  });

  it.each(EXAMPLES)("gives a verified matrix for %s as diodeloom/matrix@3 JSON", async (name) => {
    const r = await run(["synth", `public/examples/${name}.json`, "--json", "--direct"]);
    expect(r.stderr).toBe("");
    expect(r.code).toBe(0);
    const m = JSON.parse(r.stdout) as Record<string, unknown>;
    expect(m["schema"]).toBe("diodeloom/matrix@3");
    expect(m["verified"]).toBe(true);
    // A ring counter drives the matrix from its state lines, with no gates and no codes.
    expect(m["lines"]).toEqual(m["states"]);
    expect(m["gates"]).toEqual([]);
    expect(m["codes"]).toEqual([]);
    for (const key of [
      "states",
      "outputs",
      "buses",
      "diodes",
      "tiedOn",
      "count",
      "lowerBound",
      "optimal",
      "longestPath",
      "depthLimit",
      "policy",
    ])
      expect(m).toHaveProperty(key);
    const diodes = m["diodes"] as { ref: string; from: string; to: string }[];
    expect(diodes.length).toBe(m["count"]);
    expect(diodes[0]).toEqual({ ref: "D1", from: "S0", to: expect.any(String) });
  });

  it("prints a readable summary with every state and the parts", async () => {
    const r = await run(["synth", "public/examples/relay-hex-monitor.json", "--direct"]);
    expect(r.code).toBe(0);
    expect(r.stdout).toMatch(/S15\s+"F"/);
    expect(r.stdout).toMatch(/Totals: 78 diodes/);
    expect(r.stdout).toMatch(/NPN/);
  });

  it("turns a bad file into one clear message and exit code 2, writing nothing", async () => {
    const dir = mkdtempSync(join(tmpdir(), "diodeloom-cli-"));
    const bad = join(dir, "bad.json");
    writeFileSync(bad, JSON.stringify({ schema: "diodeloom/project@1", counter: { states: 300 }, display: {}, show: [] }));
    const r = await run(["synth", bad], dir);
    expect(r.code).toBe(2);
    expect(r.stderr).toBe(`${bad}: counter.states: got 300; must be a whole number from 2 to 256\n`);
    expect(r.stderr).not.toMatch(/\bat .*\.ts:\d+/);
    expect(r.stdout).toBe("");
    expect(readdirSync(dir)).toEqual(["bad.json"]);
  });

  it("says so when the file is missing, too large, or an option is unknown", async () => {
    const missing = await run(["synth", "nope.json"]);
    expect(missing.code).toBe(2);
    expect(missing.stderr).toMatch(/nope\.json: no such file/);
    const dir = mkdtempSync(join(tmpdir(), "diodeloom-cli-"));
    writeFileSync(join(dir, "big.json"), " ".repeat(1024 * 1024 + 1));
    const big = await run(["synth", join(dir, "big.json")]);
    expect(big.code).toBe(2);
    expect(big.stderr).toMatch(/larger than 1 MiB/);
    const opt = await run(["synth", "public/examples/die-roller.json", "--colour"]);
    expect(opt.code).toBe(2);
    expect(opt.stderr).toMatch(/unknown option --colour/);
  });
});
