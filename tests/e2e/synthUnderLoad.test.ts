/**
 * Runs that repeat: the same project and settings give the same matrix,
 * bound and gap on an idle machine and on one loaded by two busy processes
 * (the work budgets come from the configured time limit, the clock is only
 * the deadline). The command runs as a user runs it, in a child process.
 */
import { execFile, spawn, type ChildProcess } from "node:child_process";
import { mkdtempSync, writeFileSync } from "node:fs";
import { tmpdir } from "node:os";
import { join } from "node:path";
import { describe, expect, it } from "vitest";

const BIN = new URL("../../bin/diodeloom.mjs", import.meta.url).pathname;
const ROOT = new URL("../../", import.meta.url).pathname;

function synthJson(file: string): Promise<Record<string, unknown>> {
  return new Promise((resolve, reject) => {
    execFile(process.execPath, [BIN, "synth", file, "--json"], { cwd: ROOT, timeout: 120_000 }, (err, stdout, stderr) => {
      if (err) reject(new Error(`synth failed: ${stderr}`));
      else resolve(JSON.parse(stdout) as Record<string, unknown>);
    });
  });
}

/** A process that keeps one core busy until killed. */
function busy(): ChildProcess {
  return spawn(process.execPath, ["-e", "for (;;) {}"], { stdio: "ignore" });
}

describe("synth under load", () => {
  it("gives the same 00-59 matrix, bound and gap with two busy processes running as without", async () => {
    const dir = mkdtempSync(join(tmpdir(), "diodeloom-load-"));
    const file = join(dir, "clock.json");
    const show = Array.from({ length: 60 }, (_, k) => String(k).padStart(2, "0"));
    writeFileSync(
      file,
      JSON.stringify({
        schema: "diodeloom/project@1",
        title: "Minutes 00-59",
        counter: { states: 60 },
        display: { positions: 2, cell: "seg7" },
        show,
        synthesis: { maxDepth: 2, depth: "per-segment", timeLimitMs: 10_000 },
      }),
    );
    const idle = await synthJson(file);
    const load = [busy(), busy()];
    let loaded: Record<string, unknown>;
    try {
      loaded = await synthJson(file);
    } finally {
      for (const p of load) p.kill();
    }
    // The deadline is only a safety net: neither run may have been cut by it.
    expect(idle["deadlineHit"]).toBe(false);
    expect(loaded["deadlineHit"]).toBe(false);
    expect(idle["verified"]).toBe(true);
    expect(typeof idle["lowerBound"]).toBe("number");
    expect(loaded["count"]).toBe(idle["count"]);
    expect(loaded["lowerBound"]).toBe(idle["lowerBound"]);
    expect(loaded).toEqual(idle);
  }, 120_000);
});
