/**
 * The exact stage's bound on the two-position counters, alone: for each case
 * and policy, `synthesize` in exact mode at the case's limit (the issue's
 * target times), with the count, the bound, the gap, the wall time and the
 * process's CPU time (user + system, which other processes' load leaves
 * alone), and whether the clock cut a phase short. A quick look at the
 * bound without the plain MILP of milpBench.ts.
 * Figures, not tests.
 *
 * Run alone: npx tsx -e 'import("./bench/boundBench.ts").then(m=>m.runBoundBench(console.log))'
 * (one case: ...runBoundBench(console.log, ["00-59"]))
 */
import { loadavg } from "node:os";
import type { DepthPolicy } from "../src/core/project/project.ts";
import { compileSpec } from "../src/core/spec/decodeSpec.ts";
import { synthesize, synthSettings } from "../src/core/synth/synthesize.ts";
import { MILP_CASES } from "./milpBench.ts";
import { benchProject } from "./synthBench.ts";

const POLICIES: readonly DepthPolicy[] = ["mixed", "per-segment", "uniform"];

/** Prints one line per case and policy through `log`. */
export async function runBoundBench(log: (line: string) => void, names: readonly string[] = ["00-23", "00-59", "00-99"]): Promise<void> {
  log(`Exact stage on two-position counters, depth limit 2 (load average ${loadavg()[0]?.toFixed(1) ?? "?"} at the start)`);
  log(
    ["case", "policy", "limit s", "count", "bound", "gap%", "proven", "ms", "cpu ms", "clock"]
      .map((c, i) => (i < 2 ? c.padEnd(11) : c.padStart(7)))
      .join(" "),
  );
  for (const c of MILP_CASES.filter((x) => names.includes(x.name))) {
    for (const policy of POLICIES) {
      const project = benchProject({ ...c }, policy);
      const spec = compileSpec(project);
      const cpu0 = process.cpuUsage();
      const t0 = performance.now();
      const r = await synthesize(spec, synthSettings(project));
      const ms = performance.now() - t0;
      const cpu = process.cpuUsage(cpu0);
      if (!r.ok) {
        log(`${c.name} ${policy}: ${r.error.message}`);
        continue;
      }
      const v = r.value;
      const gap = v.lowerBound === null || v.lowerBound === 0 ? "-" : ((100 * (v.count - v.lowerBound)) / v.lowerBound).toFixed(1);
      const cells = [
        c.name,
        policy,
        (c.timeLimitMs / 1000).toFixed(0),
        v.count,
        v.lowerBound ?? "-",
        gap,
        v.optimal ? "yes" : "no",
        ms.toFixed(0),
      ];
      // "hit": the clock, not the work budgets, ended a phase (a busy machine); the figures may then differ run to run.
      cells.push(((cpu.user + cpu.system) / 1000).toFixed(0), v.deadlineHit ? "hit" : "-");
      log(cells.map((x, i) => (i < 2 ? String(x).padEnd(11) : String(x).padStart(7))).join(" "));
    }
  }
  log(`load average ${loadavg()[0]?.toFixed(1) ?? "?"} at the end`);
}
