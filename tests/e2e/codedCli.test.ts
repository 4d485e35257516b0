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

/** The BCD decade as format 2 (the default preset: NPN low-side switches on 5 V). */
const BCD2 = (): string => {
  const dir = mkdtempSync(join(tmpdir(), "diodeloom-coded-"));
  const file = join(dir, "decade.json");
  writeFileSync(
    file,
    JSON.stringify({
      schema: "diodeloom/project@2",
      title: "Decade",
      counter: { states: 10, code: "binary" },
      display: {},
      show: [..."0123456789"],
    }),
  );
  return file;
};

describe("the electrical papers of a coded decoder", () => {
  it("budget --json: every stage line's source and sink, every gate's levels, no ghost and every lit segment on target", async () => {
    const r = await run(["budget", BCD2(), "--json"]);
    expect(r.stderr).toBe("");
    expect(r.code).toBe(0);
    const b = JSON.parse(r.stdout);
    expect(Object.keys(b.counterLines)).toEqual(["Q0", "nQ0", "Q1", "nQ1", "Q2", "nQ2", "Q3", "nQ3"]);
    expect(Object.keys(b.gates)).toHaveLength(7);
    // Pull-ups R29-R35 follow the drivers' 28 resistors (7 series, 7 base, 7 base-emitter, 7 pull-downs).
    expect(Object.values(b.gates).map((g) => (g as { pullUp: { ref: string } }).pullUp.ref)).toEqual([
      "R29",
      "R30",
      "R31",
      "R32",
      "R33",
      "R34",
      "R35",
    ]);
    for (const g of Object.values(b.gates) as { lowMaxV: number; highMinV: number }[]) {
      expect(g.lowMaxV).toBeLessThan(1);
      expect(g.highMinV).toBeGreaterThan(1.5);
    }
    expect(Math.max(...Object.values(b.counterLines).map((c) => (c as { sinkCurrentA: number }).sinkCurrentA))).toBeGreaterThan(1e-3);
    expect(b.warnings.filter((w: { level: string }) => w.level !== "info")).toEqual([]);
    expect(b.corners.meetsTarget).toBe(true);
  });

  it("netlist: the stage lines as sources at the state's code, the gates' pull-ups from the logic supply", async () => {
    const r = await run(["netlist", BCD2(), "--state", "3"]);
    expect(r.stderr).toBe("");
    expect(r.code).toBe(0);
    expect(r.stdout).toMatch(/^\* Code 0011 \(highest stage leftmost\): high stage lines Q0, Q1, nQ2, nQ3\.$/m);
    expect(r.stdout).toMatch(/^VQ0 q0_v 0 DC 5$/m);
    expect(r.stdout).toMatch(/^VnQ0 nq0_v 0 DC 0\.1$/m);
    expect(r.stdout).toMatch(/^RnQ0 nq0_v nq0 20$/m);
    expect(r.stdout).toMatch(/^R29 vlogic g1 4700$/m);
    expect(r.stdout).toMatch(/^D1 g1 nq0 DMTX$/m);
  });

  it("export writes the BOM with the gates' pull-ups, the wiring list and one deck per state", async () => {
    const out = join(mkdtempSync(join(tmpdir(), "diodeloom-coded-out-")), "papers");
    const r = await run(["export", BCD2(), "--out", out]);
    expect(r.code).toBe(0);
    const { readFileSync, readdirSync } = await import("node:fs");
    expect(readFileSync(join(out, "bom.csv"), "utf8")).toMatch(
      /^7,R29-R35,4\.7k,"AND gate pull-up, from the logic supply \(5 V\) to the gate node, 5 %"$/m,
    );
    expect(readdirSync(join(out, "spice")).sort()).toEqual([..."0123456789"].map((k) => `S${k}.cir`).sort());
    expect(
      readFileSync(join(out, "wiring.csv"), "utf8")
        .split("\n")
        .filter((l) => /^\d+,D\d+,/.test(l)),
    ).toHaveLength(40);
  });
});
