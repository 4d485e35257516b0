/**
 * The command on the largest project the format allows (256 states on 8
 * positions of a 32-segment custom cell): it ends with a verified matrix and
 * a bound, exit 0, whatever the mode. Times and memory are the bench's.
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
    execFile(process.execPath, [BIN, ...args], { cwd: ROOT, timeout: 120_000, maxBuffer: 64 << 20 }, (err, stdout, stderr) => {
      resolve({ code: err ? (typeof err.code === "number" ? err.code : 99) : 0, stdout, stderr });
    });
  });
}

describe("synth on the largest project", () => {
  const dir = mkdtempSync(join(tmpdir(), "diodeloom-largest-"));
  const file = join(dir, "largest.json");
  writeFileSync(file, JSON.stringify({ schema: "diodeloom/project@1", ...largestCustomFields() }));

  it.each([[[]], [["--fast"]], [["--depth", "mixed", "--max-depth", "3"]]])(
    "exits 0 with a verified matrix (%j)",
    async (extra) => {
      const r = await run(["synth", file, "--json", ...extra]);
      expect(r.stderr).toBe("");
      expect(r.code).toBe(0);
      const m = JSON.parse(r.stdout) as { verified: boolean; count: number; lowerBound: number | null; diodes: unknown[] };
      expect(m.verified).toBe(true);
      expect(m.diodes.length).toBe(m.count);
      if (!extra.includes("--fast")) {
        expect(m.lowerBound).not.toBeNull();
        expect(m.lowerBound ?? Infinity).toBeLessThanOrEqual(m.count);
      }
    },
    120_000,
  );
});
