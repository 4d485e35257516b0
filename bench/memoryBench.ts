/**
 * Memory benchmark: the peak resident memory of the built command (a fresh
 * process, as a script calls it) on the largest one-position project the
 * format allows: 256 states showing 0-9 A b C d E F in turn. `export` solves
 * every state's circuit several times over (the budget) and writes 256
 * decks; its memory must stay proportional to the answer. Target: export
 * under 500 MB. Speed and memory targets live here, not in the tests.
 *
 * Run alone: npx tsx -e 'import("./bench/memoryBench.ts").then(m=>m.runMemoryBench(console.log))'
 */
import { spawnSync } from "node:child_process";
import { mkdtempSync, readFileSync, rmSync, writeFileSync } from "node:fs";
import { tmpdir } from "node:os";
import { join } from "node:path";
import { fileURLToPath } from "node:url";

const ROOT = fileURLToPath(new URL("..", import.meta.url));
const BIN = fileURLToPath(new URL("../bin/diodeloom.mjs", import.meta.url));

/** Peak resident memory `export` of the 256-state project may take, megabytes. */
export const EXPORT_TARGET_MB = 500;

/** Loaded before the command: writes the process's peak resident memory (kilobytes) to the file the environment names. */
const PEAK_PRELOAD =
  "data:text/javascript," +
  encodeURIComponent(
    'import { writeFileSync } from "node:fs";' +
      'process.on("exit", () => writeFileSync(process.env.DIODELOOM_BENCH_PEAK, String(process.resourceUsage().maxRSS)));',
  );

/** The bench's project: 256 states on one position, 0-9 A b C d E F in turn. */
function longCounterJson(): string {
  const glyphs = [..."0123456789AbCdEF"];
  return JSON.stringify({
    schema: "diodeloom/project@1",
    title: "bench 256 states on one position",
    counter: { states: 256 },
    display: { positions: 1, cell: "seg7" },
    show: Array.from({ length: 256 }, (_, k) => glyphs[k % glyphs.length]),
    synthesis: { timeLimitMs: 20000 },
  });
}

function row(cells: readonly (string | number)[], widths: readonly number[]): string {
  return cells.map((c, i) => String(c).padEnd(widths[i] ?? 8)).join(" ");
}

/** Runs the built command once; its exit code, wall time (ms) and peak resident memory (MB). */
function measure(args: readonly string[], peakFile: string): { status: number | null; ms: number; peakMb: number } {
  const t0 = performance.now();
  const r = spawnSync(process.execPath, ["--import", PEAK_PRELOAD, BIN, ...args], {
    cwd: ROOT,
    encoding: "utf8",
    env: { ...process.env, DIODELOOM_BENCH_PEAK: peakFile },
  });
  const ms = performance.now() - t0;
  return { status: r.status, ms, peakMb: Number(readFileSync(peakFile, "utf8")) / 1024 };
}

/**
 * Prints the memory table through `log`. Runs the command as built in
 * dist/cli (the start-up bench builds it first when the whole bench runs).
 */
export async function runMemoryBench(log: (line: string) => void): Promise<void> {
  const dir = mkdtempSync(join(tmpdir(), "diodeloom-bench-"));
  try {
    const project = join(dir, "long-counter.json");
    writeFileSync(project, longCounterJson());
    const peakFile = join(dir, "peak");
    log("Memory: peak resident memory of a fresh process of the built command, 256 states on one position (0-9 A b C d E F)");
    const widths = [34, 5, 8, 8, 24];
    log(row(["command", "exit", "wall s", "peak MB", "target"], widths));
    const synth = measure(["synth", project], peakFile);
    log(row(["diodeloom synth", synth.status ?? "-", (synth.ms / 1000).toFixed(1), synth.peakMb.toFixed(0), ""], widths));
    const out = join(dir, "export");
    const ex = measure(["export", project, "--out", out], peakFile);
    const met = ex.peakMb < EXPORT_TARGET_MB ? "met" : "MISSED";
    log(
      row(
        ["diodeloom export --out DIR", ex.status ?? "-", (ex.ms / 1000).toFixed(1), ex.peakMb.toFixed(0), `< ${EXPORT_TARGET_MB}: ${met}`],
        widths,
      ),
    );
  } finally {
    rmSync(dir, { recursive: true, force: true });
  }
}
