/**
 * `diodeloom budget` and `diodeloom netlist`, run as a user runs them, and
 * the exported netlist run unchanged through ngspice.
 */
import { execFile, execFileSync } from "node:child_process";
import { mkdtempSync, readdirSync, readFileSync, rmSync, writeFileSync } from "node:fs";
import { tmpdir } from "node:os";
import { join } from "node:path";
import { afterAll, describe, expect, it } from "vitest";
import { EXAMPLES } from "../support/projects.ts";

const BIN = new URL("../../bin/diodeloom.mjs", import.meta.url).pathname;
const ROOT = new URL("../../", import.meta.url).pathname;
const dir = mkdtempSync(join(tmpdir(), "diodeloom-budget-cli-"));
afterAll(() => rmSync(dir, { recursive: true, force: true }));

function run(args: string[]): Promise<{ code: number; stdout: string; stderr: string }> {
  return new Promise((resolve) => {
    execFile(process.execPath, [BIN, ...args], { cwd: ROOT, timeout: 120_000, maxBuffer: 64 * 1024 * 1024 }, (err, stdout, stderr) => {
      const code = err ? (typeof err.code === "number" ? err.code : 99) : 0;
      resolve({ code, stdout, stderr });
    });
  });
}

/** An example written to a temporary file with its `electrical` section replaced. */
function exampleWith(name: string, electrical: Record<string, unknown>): string {
  const doc = JSON.parse(readFileSync(join(ROOT, "public/examples", `${name}.json`), "utf8")) as Record<string, unknown>;
  const file = join(dir, `${name}-${String(electrical["preset"])}.json`);
  writeFileSync(file, JSON.stringify({ ...doc, electrical }));
  return file;
}

describe("diodeloom budget", () => {
  it.each(EXAMPLES)("prints diodeloom/budget@3 JSON for %s, at a safe low voltage: no danger", async (name) => {
    const r = await run(["budget", `public/examples/${name}.json`, "--json", "--direct"]);
    expect(r.stderr).toBe("");
    expect(r.code).toBe(0);
    const b = JSON.parse(r.stdout) as Record<string, unknown>;
    expect(b["schema"]).toBe("diodeloom/budget@3");
    for (const k of ["kind", "states", "outputs", "diodes", "supply", "logic", "warnings", "trim", "corners", "drivers", "counterLines"])
      expect(b).toHaveProperty(k);
    const warnings = b["warnings"] as { level: string; code: string; message: string }[];
    expect(warnings.filter((w) => w.level === "danger")).toEqual([]);
    expect(warnings.every((w) => w.message.length > 0)).toBe(true);
    const states = b["states"] as { state: string; outputs: Record<string, { segmentA: number }> }[];
    expect(states.map((s) => s.state)).toEqual(states.map((_, k) => `S${k}`));
  });

  // Every file the New menu offers, the instrument too: a demo shows a design that meets its own target, the first thing its budget says.
  const shipped = readdirSync(join(ROOT, "public/examples"))
    .filter((f) => f.endsWith(".json"))
    .sort();
  it.each(shipped)("shows a design that meets its own target at both corners: %s, as a user runs its budget", async (file) => {
    expect(shipped.length).toBeGreaterThanOrEqual(6);
    const r = await run(["budget", `public/examples/${file}`, "--json"]);
    expect(r.stderr).toBe("");
    expect(r.code).toBe(0);
    type Corners = {
      targetA: number;
      corners: { windowPct: number; meetsTarget: boolean; shortOf: string[]; low: { minCurrentA: number }; high: { maxCurrentA: number } };
    };
    const b = JSON.parse(r.stdout) as Corners & { decoders?: Record<string, Corners> };
    const budgets = b.decoders === undefined ? [b] : Object.values(b.decoders);
    expect(budgets.length).toBeGreaterThan(0);
    for (const d of budgets) {
      expect(d.corners.shortOf, file).toEqual([]);
      expect(d.corners.meetsTarget).toBe(true);
      // The verdict's own figures: the weakest segment at the low corner and the strongest at the high one inside target ± window.
      const w = d.corners.windowPct / 100;
      expect(d.corners.low.minCurrentA).toBeGreaterThanOrEqual(d.targetA * (1 - w));
      expect(d.corners.high.maxCurrentA).toBeLessThanOrEqual(d.targetA * (1 + w));
    }
  });

  it("budgets the quiz scoreboard's PNP high-side switches on its active-low lines: every lit segment in the window, every unlit one dark, each nS line within its rating", async () => {
    const r = await run(["budget", "public/examples/quiz-scoreboard.json", "--json", "--fast"]);
    expect(r.stderr).toBe("");
    expect(r.code).toBe(0);
    const b = JSON.parse(r.stdout) as {
      kind: string;
      targetA: number;
      corners: { meetsTarget: boolean };
      outputs: Record<string, { offMaxA: number }>;
      counterLines: Record<string, { sinkCurrentA: number; ratedA: number }>;
      warnings: { level: string }[];
    };
    expect(b.kind).toBe("high-side-switch");
    expect(b.corners.meetsTarget).toBe(true);
    expect(Math.max(...Object.values(b.outputs).map((o) => o.offMaxA))).toBeLessThan(0.01 * b.targetA);
    expect(Object.keys(b.counterLines)).toEqual(Array.from({ length: 10 }, (_, k) => `nS${k}`));
    expect(Object.values(b.counterLines).every((l) => l.sinkCurrentA > 0 && l.sinkCurrentA <= l.ratedA)).toBe(true);
    expect(b.warnings.filter((w) => w.level !== "info")).toEqual([]);
    const text = await run(["budget", "public/examples/quiz-scoreboard.json", "--fast"]);
    expect(text.stdout).toContain("PNP high-side switches");
    expect(text.stdout).toMatch(/^Active-low lines \(each low in its own state/m);
  });

  it("carries the hazardous-voltage and mains cautions with the high-voltage preset", async () => {
    const r = await run(["budget", exampleWith("die-roller", { preset: "string-hv-sink" }), "--json", "--direct"]);
    expect(r.code).toBe(0);
    const warnings = (JSON.parse(r.stdout) as { warnings: { level: string; code: string }[] }).warnings;
    expect(warnings.filter((w) => w.level === "danger").map((w) => w.code)).toEqual(["hazardous-voltage", "mains-supply"]);
  });

  it("prints a readable report with every section, and takes --series E96", async () => {
    const r = await run(["budget", "public/examples/turntable-position.json", "--direct", "--series", "E96"]);
    expect(r.code).toBe(0);
    for (const s of [
      "Warnings",
      "NPN constant-current sinks",
      "Segment current per state",
      "Outputs",
      "Diodes",
      "Counter lines",
      "Drivers",
      "Segment supply:",
      "Logic supply",
      "Tolerance corners",
      "E96",
    ]) {
      expect(r.stdout).toContain(s);
    }
    const hv = await run(["budget", exampleWith("die-roller", { preset: "string-hv-sink" }), "--direct"]);
    expect(hv.stdout).toContain("DANGER hazardous-voltage");
    // Direct drive has no drivers to list and no segment supply.
    const direct = await run(["budget", "public/examples/die-roller.json", "--direct"]);
    expect(direct.stdout).toContain("direct drive from the counter lines");
    expect(direct.stdout).not.toContain("Segment supply:");
  });

  it("refuses an unknown series", async () => {
    const r = await run(["budget", "public/examples/die-roller.json", "--series", "E12"]);
    expect(r.code).toBe(2);
    expect(r.stderr).toBe(`--series: got "E12"; must be E24 or E96\n`);
  });
});

describe("diodeloom netlist", () => {
  it("prints a standard SPICE deck that ngspice runs unchanged", async () => {
    const r = await run(["netlist", "public/examples/relay-hex-monitor.json", "--state", "8", "--direct"]);
    expect(r.code).toBe(0);
    expect(r.stdout).toMatch(/^\.model DMTX D /m);
    expect(r.stdout).toMatch(/^\.op$/m);
    expect(r.stdout.trimEnd().endsWith(".end")).toBe(true);
    const file = join(dir, "hex-8.cir");
    writeFileSync(file, r.stdout);
    // ngspice is installed in CI (Debian package); a missing one fails here on purpose.
    const out = execFileSync("ngspice", ["-b", file], { encoding: "utf8" });
    // State 8 lights all seven switches: the active line sags under their base currents, 1a sits a diode drop below it.
    expect(out).toMatch(/^\s*o1a\s+2\.\d+e\+00$/m);
  });

  it("accepts S-names and refuses a state outside the counter", async () => {
    const ok = await run(["netlist", "public/examples/die-roller.json", "--state", "S5", "--direct"]);
    expect(ok.code).toBe(0);
    expect(ok.stdout.split("\n")[0]).toMatch(/state S5 active/);
    const bad = await run(["netlist", "public/examples/die-roller.json", "--state", "6"]);
    expect(bad.code).toBe(2);
    expect(bad.stderr).toMatch(/from 0 to 5/);
    const none = await run(["netlist", "public/examples/die-roller.json"]);
    expect(none.code).toBe(2);
    expect(none.stderr).toMatch(/--state is required/);
  });
});
