/**
 * Synthesis benchmark: direct, heuristic and exact counts and times for the
 * standard counting displays under every depth policy, and how time grows
 * with the number of states. Speed targets live here, not in the tests.
 *
 * Run alone: npx tsx -e 'import("./bench/synthBench.ts").then(m=>m.runSynthBench(console.log))'
 */
import { compileSpec, litCellCount } from "../src/core/spec/decodeSpec.ts";
import type { DepthPolicy, Project } from "../src/core/project/project.ts";
import { parseProject } from "../src/core/project/projectSchema.ts";
import { heuristicPlan } from "../src/core/synth/heuristic.ts";
import { planCount, sharingProblem } from "../src/core/synth/plan.ts";
import { synthesize, synthSettings } from "../src/core/synth/synthesize.ts";
import { largestCustomProject, largestHexProject } from "../tests/support/largestProject.ts";

/** A seven-segment project showing `show`, validated like a file. */
function showingProject(show: readonly string[], positions: number): Project {
  const r = parseProject(
    JSON.stringify({
      schema: "diodeloom/project@1",
      title: "bench",
      counter: { states: show.length },
      display: { positions, cell: "seg7" },
      show,
    }),
  );
  if (!r.ok) throw new Error(`bench project is invalid: ${JSON.stringify(r.error)}`);
  return r.value;
}

interface BenchCase {
  readonly name: string;
  readonly positions: number;
  readonly show: readonly string[];
  /** Exact-optimizer time limit, milliseconds. */
  readonly timeLimitMs: number;
}

const HEX = "0123456789AbCdEF";
const pad2 = (k: number): string => String(k).padStart(2, "0");

/** The cases the issue names. */
export const BENCH_CASES: readonly BenchCase[] = [
  // The small cases get the project default limit (20 s); the big ones 10 s.
  { name: "0-5", positions: 1, show: [..."012345"], timeLimitMs: 20_000 },
  { name: "0-9", positions: 1, show: [..."0123456789"], timeLimitMs: 20_000 },
  { name: "0-F", positions: 1, show: [...HEX], timeLimitMs: 20_000 },
  { name: "1-12", positions: 2, show: Array.from({ length: 12 }, (_, k) => String(k + 1).padStart(2, " ")), timeLimitMs: 20_000 },
  { name: "00-23", positions: 2, show: Array.from({ length: 24 }, (_, k) => pad2(k)), timeLimitMs: 10_000 },
  { name: "00-59", positions: 2, show: Array.from({ length: 60 }, (_, k) => pad2(k)), timeLimitMs: 10_000 },
  { name: "00-99", positions: 2, show: Array.from({ length: 100 }, (_, k) => pad2(k)), timeLimitMs: 10_000 },
];

const POLICIES: readonly DepthPolicy[] = ["mixed", "per-segment", "uniform"];

/**
 * Best counts known where the exact stage proves none (docs/sources.md,
 * "Best known counts and bounds of the two-position counters"): mixed,
 * per-segment, uniform. The bench takes the least of these, the exact
 * stage's count and the heuristic's; where the exact stage proves its
 * count optimal, that count.
 */
const BEST_KNOWN: Readonly<Record<string, readonly [number, number, number]>> = {
  "00-23": [85, 89, 91],
  "00-59": [195, 195, 195],
  "00-99": [298, 298, 298],
};

/** How far the heuristic's count is above the best known, and whether within 3 %. */
function versusBest(heur: number, best: number): string {
  const over = (100 * (heur - best)) / best;
  return `${over.toFixed(1)}% ${heur <= best * 1.03 ? "ok" : "OVER"}`;
}

/** A bench project, validated like a file. */
export function benchProject(c: BenchCase, depth: DepthPolicy, maxDepth = 2): Project {
  const r = parseProject(
    JSON.stringify({
      schema: "diodeloom/project@1",
      title: `bench ${c.name}`,
      counter: { states: c.show.length },
      display: { positions: c.positions, cell: "seg7" },
      show: c.show,
      synthesis: { maxDepth, depth, timeLimitMs: c.timeLimitMs },
    }),
  );
  if (!r.ok) throw new Error(`bench project ${c.name} is invalid: ${JSON.stringify(r.error)}`);
  return r.value;
}

function row(cells: readonly (string | number)[], widths: readonly number[]): string {
  return cells.map((c, i) => String(c).padStart(widths[i] ?? 8)).join(" ");
}

/** Median of `runs` timings of `f` in CPU milliseconds (other processes' load left out), after one run to warm up. */
function timeMs(f: () => void, runs: number): number {
  f();
  const ts: number[] = [];
  for (let i = 0; i < runs; i++) {
    const t0 = process.cpuUsage();
    f();
    const d = process.cpuUsage(t0);
    ts.push((d.user + d.system) / 1000);
  }
  ts.sort((a, b) => a - b);
  return ts[Math.floor(ts.length / 2)] ?? 0;
}

/** Prints the synthesis bench tables through `log`, one line per call. */
export async function runSynthBench(log: (line: string) => void): Promise<void> {
  const widths = [6, 4, 12, 7, 6, 8, 6, 6, 5, 6, 9, 5, 11];
  log(
    "Synthesis: depth limit 2; heuristic time is the median CPU time of 5 runs, after a pass over every case to warm up (targets: 50 ms for N <= 24, 300 ms for N <= 100)",
  );
  log(
    "exact = heuristic, then the per-state branch-and-bound (up to 10 outputs), HiGHS, or the Lagrangian bound where the bus family is too big, each stopped by a work budget",
  );
  log("Exact time limit: 20 s for 0-5, 0-9, 0-F and 1-12, 10 s for the others; times in ms on a shared machine");
  log(
    "best: the proven optimum, else the least count known (docs/sources.md) or found here; heur vs best: the heuristic above it, and within 3 %?",
  );
  log(
    row(
      ["case", "N", "policy", "direct", "heur", "heur ms", "exact", "bound", "gap", "proven", "exact ms", "best", "heur vs best"],
      widths,
    ),
  );
  // One untimed pass over every case first, so that the first case's times do not include compiling the code.
  for (const c of BENCH_CASES) {
    for (const depth of POLICIES) {
      const project = benchProject(c, depth);
      const settings = synthSettings(project);
      heuristicPlan(sharingProblem(compileSpec(project)), {
        depthLimit: settings.depthLimit,
        policy: depth,
        buses: settings.buses,
        links: settings.links,
      });
    }
  }
  for (const c of BENCH_CASES) {
    for (const depth of POLICIES) {
      const project = benchProject(c, depth);
      const spec = compileSpec(project);
      const settings = synthSettings(project);
      const p = sharingProblem(spec);
      const rules = { depthLimit: settings.depthLimit, policy: depth, buses: settings.buses, links: settings.links };
      let heur = 0;
      const heurMs = timeMs(() => void (heur = planCount(heuristicPlan(p, rules))), 5);
      const t0 = performance.now();
      const r = await synthesize(spec, settings);
      const exactMs = performance.now() - t0;
      if (!r.ok) {
        log(`${c.name} ${depth}: ${r.error.message}`);
        continue;
      }
      const m = r.value;
      const gap = m.lowerBound === null ? "-" : m.count - m.lowerBound;
      const known = BEST_KNOWN[c.name]?.[POLICIES.indexOf(depth)] ?? Infinity;
      const best = m.optimal ? m.count : Math.min(known, m.count, heur);
      log(
        row(
          [
            c.name,
            spec.states.length,
            depth,
            litCellCount(spec),
            heur,
            heurMs.toFixed(1),
            m.count,
            m.lowerBound ?? "-",
            gap,
            m.optimal ? "yes" : "no",
            exactMs.toFixed(0),
            best,
            versusBest(heur, best),
          ],
          widths,
        ),
      );
    }
  }

  log("");
  log("Largest sizes: 20 s limit, per-segment, depth 2; the limit is kept when the time stays under it (peak RSS is the process's so far)");
  const lw = [34, 7, 7, 7, 9, 9, 10];
  log(row(["project", "direct", "count", "bound", "time ms", "deadline", "peak MiB"], lw));
  const stride = Array.from({ length: 100 }, (_, k) => Array.from({ length: 8 }, (_, i) => String((k * i) % 10)).join(""));
  const largest: [string, Project][] = [
    [
      "256 x 1, hex digits repeated",
      showingProject(
        [...Array(256).keys()].map((k) => "0123456789AbCdEF"[k % 16] as string),
        1,
      ),
    ],
    ["100 x 8, position i shows k*i mod 10", showingProject(stride, 8)],
    ["256 x 8, random hex digits", largestHexProject()],
    ["256 x 8 of a 32-segment custom cell", largestCustomProject()],
  ];
  for (const [name, project] of largest) {
    const spec = compileSpec(project);
    const t0 = performance.now();
    const r = await synthesize(spec, synthSettings(project));
    const ms = performance.now() - t0;
    if (!r.ok) {
      log(`${name}: ${r.error.message}`);
      continue;
    }
    const peak = process.resourceUsage().maxRSS / 1024;
    log(
      row(
        [
          name,
          litCellCount(spec),
          r.value.count,
          r.value.lowerBound ?? "-",
          ms.toFixed(0),
          r.value.deadlineHit ? "hit" : "no",
          peak.toFixed(0),
        ],
        lw,
      ),
    );
  }

  log("");
  log("Heuristic time growth with N (states 00..N-1 on two positions, per-segment, depth 2; median CPU time of 5 runs after a warm-up)");
  const gw = [5, 7, 7, 9];
  log(row(["N", "direct", "heur", "heur ms"], gw));
  for (const n of [6, 12, 24, 36, 48, 60, 80, 100]) {
    const c: BenchCase = { name: `00-${n - 1}`, positions: 2, show: Array.from({ length: n }, (_, k) => pad2(k)), timeLimitMs: 1000 };
    const spec = compileSpec(benchProject(c, "per-segment"));
    const p = sharingProblem(spec);
    let heur = 0;
    const ms = timeMs(
      () => void (heur = planCount(heuristicPlan(p, { depthLimit: 2, policy: "per-segment", buses: true, links: true }))),
      5,
    );
    log(row([n, litCellCount(spec), heur, ms.toFixed(1)], gw));
  }
}
