/**
 * Start-up benchmark: the wall time of the installed command as a script
 * calls it (a fresh `node` process each time), beside a bare `node -e 0`.
 * Targets: `diodeloom --version` within 3x the bare start, and `synth` on the
 * die roller under 0.5 s. Speed targets live here, not in the tests.
 *
 * Run alone: npx tsx -e 'import("./bench/startupBench.ts").then(m=>m.runStartupBench(console.log))'
 */
import { spawnSync } from "node:child_process";
import { fileURLToPath } from "node:url";
import { buildCli } from "../scripts/buildCli.mjs";

const ROOT = fileURLToPath(new URL("..", import.meta.url));
const BIN = fileURLToPath(new URL("../bin/diodeloom.mjs", import.meta.url));

/** `--version` may take at most this many times a bare node start. */
export const VERSION_TARGET_RATIO = 3;
/** `synth` on the die roller, wall time, milliseconds. */
export const DIE_ROLLER_TARGET_MS = 500;

/** Median wall time of `runs` fresh processes, milliseconds; throws when the process fails. */
function medianRunMs(args: readonly string[], runs: number): number {
  const times: number[] = [];
  for (let i = 0; i < runs; i++) {
    const t0 = performance.now();
    const r = spawnSync(process.execPath, args, { cwd: ROOT, encoding: "utf8" });
    times.push(performance.now() - t0);
    if (r.status !== 0) throw new Error(`node ${args.join(" ")} exited ${r.status}: ${r.stderr}`);
  }
  times.sort((a, b) => a - b);
  return times[Math.floor(times.length / 2)] as number;
}

function row(cells: readonly (string | number)[], widths: readonly number[]): string {
  return cells.map((c, i) => String(c).padEnd(widths[i] ?? 8)).join(" ");
}

/**
 * Prints the start-up table through `log`. `bin` is the command's entry
 * (another checkout's, to compare); by default this one's, built first.
 */
export async function runStartupBench(log: (line: string) => void, opts: { bin?: string; runs?: number } = {}): Promise<void> {
  const runs = opts.runs ?? 9;
  const bin = opts.bin ?? BIN;
  if (opts.bin === undefined) log(`Start-up: the command built from these sources in ${(await buildCli()).toFixed(0)} ms (dist/cli)`);
  log(`Start-up: wall time of a fresh process, median of ${runs} runs, ms (${bin})`);
  const widths = [48, 6, 30];
  log(row(["command", "ms", "target"], widths));
  const bare = medianRunMs(["-e", "0"], runs);
  log(row(["node -e 0", bare.toFixed(0), ""], widths));
  const version = medianRunMs([bin, "--version"], runs);
  const ratio = version / bare;
  log(
    row(
      [
        "diodeloom --version",
        version.toFixed(0),
        `<= ${VERSION_TARGET_RATIO}x bare: ${ratio.toFixed(2)}x ${ratio <= VERSION_TARGET_RATIO ? "met" : "MISSED"}`,
      ],
      widths,
    ),
  );
  log(row(["diodeloom --help", medianRunMs([bin, "--help"], runs).toFixed(0), ""], widths));
  log(row(["diodeloom synth --help", medianRunMs([bin, "synth", "--help"], runs).toFixed(0), ""], widths));
  const die = medianRunMs([bin, "synth", "public/examples/die-roller.json"], runs);
  log(
    row(
      [
        "diodeloom synth public/examples/die-roller.json",
        die.toFixed(0),
        `< ${DIE_ROLLER_TARGET_MS}: ${die < DIE_ROLLER_TARGET_MS ? "met" : "MISSED"}`,
      ],
      widths,
    ),
  );
}
