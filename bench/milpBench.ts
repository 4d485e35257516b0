/**
 * diodeloom against a plain MILP, side by side in one run, on the
 * two-position counters and one long single-position counter.
 *
 * The plain MILP is the covering model of model.ts over every useful bus
 * shape (the full candidate family), on the states as they are (no merging
 * of identical states), solved by HiGHS alone: no heuristic, no warm start,
 * no bound of our own, stopped by HiGHS's own time limit at the case's
 * limit. Under uniform its model is the all-bus matrix, so its count and
 * bound are taken against the direct count as the exact stage does.
 * diodeloom is `synthesize` in exact mode with the same limit. The ratio is
 * the MILP's time over diodeloom's (above 1: diodeloom is faster); when
 * neither proves an optimum, compare the gaps. Figures, not tests.
 *
 * Run alone: npx tsx -e 'import("./bench/milpBench.ts").then(m=>m.runMilpBench(console.log))'
 */
import highsLoader from "highs";
import type { DepthPolicy } from "../src/core/project/project.ts";
import { compileSpec } from "../src/core/spec/decodeSpec.ts";
import { candidateFamily } from "../src/core/synth/candidates.ts";
import { buildSharingModel } from "../src/core/synth/model.ts";
import { litCount, sharingProblem, type SharingRules } from "../src/core/synth/plan.ts";
import { synthesize, synthSettings } from "../src/core/synth/synthesize.ts";
import { benchProject } from "./synthBench.ts";

const pad2 = (k: number): string => String(k).padStart(2, "0");

interface MilpCase {
  readonly name: string;
  readonly positions: number;
  readonly show: readonly string[];
  /** The limit for both, milliseconds: the target time for the case. */
  readonly timeLimitMs: number;
}

export const MILP_CASES: readonly MilpCase[] = [
  { name: "00-23", positions: 2, show: Array.from({ length: 24 }, (_, k) => pad2(k)), timeLimitMs: 10_000 },
  { name: "00-59", positions: 2, show: Array.from({ length: 60 }, (_, k) => pad2(k)), timeLimitMs: 30_000 },
  { name: "00-99", positions: 2, show: Array.from({ length: 100 }, (_, k) => pad2(k)), timeLimitMs: 60_000 },
  { name: "0-9 x 256", positions: 1, show: Array.from({ length: 256 }, (_, k) => String(k % 10)), timeLimitMs: 10_000 },
];

const POLICIES: readonly DepthPolicy[] = ["mixed", "per-segment", "uniform"];

interface HighsRun {
  readonly status: "optimal" | "limit" | "failed";
  readonly count: number | null;
  readonly bound: number | null;
  readonly ms: number;
}

/** HiGHS alone on the full model of the unmerged problem. */
async function plainMilp(c: MilpCase, policy: DepthPolicy): Promise<HighsRun> {
  const t0 = performance.now();
  const project = benchProject({ ...c }, policy);
  const p = sharingProblem(compileSpec(project));
  const rules: SharingRules = { depthLimit: 2, policy, buses: true, links: true };
  const family = candidateFamily(p, policy === "mixed" ? 2 : 1, { maxBuses: 1e7, maxInputs: 1e8 });
  const model = buildSharingModel(p, rules, family);
  const highs = (await (highsLoader as unknown as () => Promise<unknown>)()) as {
    createModel(src: { format: "lp"; data: string }): {
      options: { set(v: Record<string, unknown>): void };
      run(): void;
      getModelStatus(): number;
      info: { get(name: string): number | bigint };
      dispose(): void;
    };
  };
  const lit = litCount(p);
  let m: ReturnType<typeof highs.createModel> | undefined;
  try {
    m = highs.createModel({ format: "lp", data: model.text });
    const left = Math.max(0.5, (c.timeLimitMs - (performance.now() - t0)) / 1000);
    m.options.set({ output_flag: false, time_limit: left, mip_rel_gap: 0, mip_abs_gap: 1e-6, random_seed: 1 });
    m.run();
    const status = m.getModelStatus() === 7 ? "optimal" : "limit";
    const primal = Number(m.info.get("primal_solution_status")) === 2;
    const obj = primal ? Math.round(Number(m.info.get("objective_function_value"))) : null;
    const dual = Number(m.info.get("mip_dual_bound"));
    const bound = Number.isFinite(dual) ? Math.ceil(dual - 1e-6) : null;
    const uni = (x: number | null): number | null => (policy === "uniform" ? (x === null ? lit : Math.min(lit, x)) : x);
    return { status, count: uni(obj), bound: uni(bound), ms: performance.now() - t0 };
  } catch {
    return { status: "failed", count: null, bound: null, ms: performance.now() - t0 };
  } finally {
    try {
      m?.dispose();
    } catch {
      // an aborted module frees nothing
    }
  }
}

function row(cells: readonly (string | number)[], widths: readonly number[]): string {
  return cells.map((c, i) => (i === 0 ? String(c).padEnd(widths[i] ?? 8) : String(c).padStart(widths[i] ?? 8))).join(" ");
}

/** Prints the side-by-side table through `log`. */
export async function runMilpBench(log: (line: string) => void, cases: readonly MilpCase[] = MILP_CASES): Promise<void> {
  log("diodeloom against a plain MILP (HiGHS alone on the full covering model, states not merged, no warm start), depth limit 2");
  log(
    "Same limit for both: 00-23 10 s, 00-59 30 s, 00-99 60 s, 0-9 x 256 10 s. ratio = MILP time / diodeloom time; gap = (count - bound) / bound",
  );
  const w = [10, 11, 8, 6, 6, 8, 6, 6, 5, 6, 8, 6];
  log(row(["case", "policy", "MILP", "count", "bound", "ms", "dl", "bound", "gap%", "proven", "ms", "ratio"], w));
  for (const c of cases) {
    for (const policy of POLICIES) {
      const milp = await plainMilp(c, policy);
      const project = benchProject({ ...c }, policy);
      const spec = compileSpec(project);
      const t0 = performance.now();
      const r = await synthesize(spec, synthSettings(project));
      const ms = performance.now() - t0;
      if (!r.ok) {
        log(`${c.name} ${policy}: ${r.error.message}`);
        continue;
      }
      const v = r.value;
      const gap = v.lowerBound === null || v.lowerBound === 0 ? "-" : ((100 * (v.count - v.lowerBound)) / v.lowerBound).toFixed(1);
      log(
        row(
          [
            c.name,
            policy,
            milp.status,
            milp.count ?? "-",
            milp.bound ?? "-",
            milp.ms.toFixed(0),
            v.count,
            v.lowerBound ?? "-",
            gap,
            v.optimal ? "yes" : "no",
            ms.toFixed(0),
            (milp.ms / Math.max(1, ms)).toFixed(1),
          ],
          w,
        ),
      );
    }
  }
}
