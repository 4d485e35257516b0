/**
 * The budget of the largest project the format allows (256 states on 8
 * positions of a 32-segment custom cell): the command ends with a budget,
 * exit 0, the states its time limit's work covers checked and the rest named
 * as unchecked. How long it takes is the bench's (bench/budgetBench.ts).
 */
import { execFile } from "node:child_process";
import { mkdtempSync, writeFileSync } from "node:fs";
import { tmpdir } from "node:os";
import { join } from "node:path";
import { describe, expect, it } from "vitest";
import { largestCustomFields } from "../support/largestProject.ts";

const BIN = new URL("../../bin/diodeloom.mjs", import.meta.url).pathname;
const ROOT = new URL("../../", import.meta.url).pathname;

function run(args: string[]): Promise<{ code: number; stdout: string; stderr: string }> {
  return new Promise((resolve) => {
    execFile(process.execPath, [BIN, ...args], { cwd: ROOT, timeout: 150_000, maxBuffer: 64 << 20 }, (err, stdout, stderr) => {
      resolve({ code: err ? (typeof err.code === "number" ? err.code : 99) : 0, stdout, stderr });
    });
  });
}

describe("budget on the largest project", () => {
  const dir = mkdtempSync(join(tmpdir(), "diodeloom-largest-budget-"));
  const file = join(dir, "largest.json");
  writeFileSync(file, JSON.stringify({ schema: "diodeloom/project@1", ...largestCustomFields() }));

  it("prints a budget of the states its time limit covers, and names the rest", async () => {
    const r = await run(["budget", file, "--json"]);
    expect(r.stderr).toBe("");
    expect(r.code).toBe(0);
    const b = JSON.parse(r.stdout) as {
      states: { state: string }[];
      coverage?: { checked: number; states: number; timeLimitMs: number };
      warnings: { code: string; message: string; checked?: number }[];
      outputs: Record<string, { maxA: number }>;
    };
    const checked = b.coverage?.checked ?? 0;
    expect(b.coverage).toEqual({ checked, states: 256, timeLimitMs: 20_000 });
    expect(checked).toBeGreaterThanOrEqual(1);
    expect(b.states.map((s) => s.state)).toEqual(Array.from({ length: checked }, (_, k) => `S${k}`));
    const w = b.warnings.find((x) => x.code === "states-unchecked");
    expect(w?.message).toMatch(
      new RegExp(`of the 256 states (is|are) checked, as many as the 20 s time limit's work covers; S${checked}-S255 are not`),
    );
    // Every output of the checked states has its figures: a lit one carries current.
    expect(Object.values(b.outputs).some((o) => o.maxA > 50e-6)).toBe(true);
  }, 150_000);
});
