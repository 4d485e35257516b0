/**
 * Coded counters through the installed command, run as a user runs it.
 */
import { execFile } from "node:child_process";
import { mkdtempSync, writeFileSync } from "node:fs";
import { tmpdir } from "node:os";
import { join } from "node:path";
import { describe, expect, it } from "vitest";

const BIN = new URL("../../bin/diodeloom.mjs", import.meta.url).pathname;
const ROOT = new URL("../../", import.meta.url).pathname;

function run(args: string[]): Promise<{ code: number; stdout: string; stderr: string }> {
  return new Promise((resolve) => {
    execFile(process.execPath, [BIN, ...args], { cwd: ROOT, timeout: 120_000 }, (err, stdout, stderr) => {
      resolve({ code: err ? (typeof err.code === "number" ? err.code : 99) : 0, stdout, stderr });
    });
  });
}

function projectFile(counter: Record<string, unknown>, show: string[]): string {
  const dir = mkdtempSync(join(tmpdir(), "diodeloom-coded-"));
  const file = join(dir, "lap.json");
  writeFileSync(file, JSON.stringify({ schema: "diodeloom/project@1", title: "Lap counter", counter, display: {}, show }));
  return file;
}

const BCD = (): string => projectFile({ states: 10, code: "binary" }, [..."0123456789"]);

describe("diodeloom synth on a coded counter", () => {
  it("prints the BCD decoder as diodeloom/matrix@3 JSON: gates, their input diodes, OR diodes and straight literals", async () => {
    const r = await run(["synth", BCD(), "--json"]);
    expect(r.stderr).toBe("");
    expect(r.code).toBe(0);
    const m = JSON.parse(r.stdout);
    expect(m.schema).toBe("diodeloom/matrix@3");
    expect(m.verified).toBe(true);
    expect([m.count, m.gates.length, m.lowerBound, m.optimal]).toEqual([40, 7, 40, true]);
    expect(m.lines).toEqual(["Q0", "nQ0", "Q1", "nQ1", "Q2", "nQ2", "Q3", "nQ3"]);
    expect(m.codes[9]).toBe("1001");
    const gate = m.gates[0];
    expect(gate.ref).toBe("G1");
    // A gate input diode: anode at the gate node, cathode at the stage line.
    expect(m.diodes).toContainEqual({ ref: expect.any(String), from: "G1", to: gate.inputs[0] });
    // An OR diode from the gate to an output, and a stage line straight to an output.
    expect(m.diodes.some((d: { from: string; to: string }) => d.from === "G1" && /^1[a-g]$/.test(d.to))).toBe(true);
    expect(m.diodes.some((d: { from: string; to: string }) => /^n?Q\d$/.test(d.from) && /^1[a-g]$/.test(d.to))).toBe(true);
  });

  it("prints the gates, the two-rank decoder beside it, and what every unused code shows", async () => {
    const r = await run(["synth", BCD()]);
    expect(r.code).toBe(0);
    expect(r.stdout).toMatch(/proven minimum of two-level logic: 40 diodes, 7 gates, the fewest at that count/);
    expect(r.stdout).toMatch(/AND gates/);
    expect(r.stdout).toMatch(/two-rank\s+64\s+10\s+10/);
    expect(r.stdout).toMatch(/Codes the counter never reaches \(power-up or a fault\): 6/);
    for (const code of ["1010", "1011", "1100", "1101", "1110", "1111"])
      expect(r.stdout).toMatch(new RegExp(`code ${code} (shows|lights)`));
  });

  it("compares the two-level and two-rank decoders of a Johnson counter", async () => {
    const file = projectFile({ states: 10, code: "johnson" }, [..."0123456789"]);
    const r = await run(["compare", file, "--json", "--fast"]);
    expect(r.code).toBe(0);
    const doc = JSON.parse(r.stdout);
    const byName = Object.fromEntries(doc.decoders.map((d: { decoder: string }) => [d.decoder, d]));
    expect(byName["two-level"].chosen).toBe(true);
    expect(byName["two-rank"].gates).toBe(10);
    expect(byName["two-rank"].resistors).toBe(10);
    expect(byName["two-level"].diodes).toBeLessThan(byName["two-rank"].diodes);
  });

  it("names the bad field of a coded counter and exits 2", async () => {
    const r = await run(["synth", projectFile({ states: 9, code: "johnson" }, [..."012345678"])]);
    expect(r.code).toBe(2);
    expect(r.stderr).toMatch(/counter\.states: got 9 with "code": "johnson"; .* must be even/);
  });
});

describe("commands that need the electrical model of a coded decoder", () => {
  it.each([["budget"], ["netlist", "--state", "3"], ["export", "--out", "never-written"]])(
    "%s says it does not yet take a coded counter, exit 2",
    async (command, ...rest) => {
      const r = await run([command, BCD(), ...rest]);
      expect(r.code).toBe(2);
      expect(r.stderr).toMatch(/counter\.code is "binary": this command does not yet take a coded counter/);
      expect(r.stdout).toBe("");
    },
  );
});
