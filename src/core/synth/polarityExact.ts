/**
 * The exact stage of `either`: the covering model of model.ts over both
 * polarities of every output (polarityProblem.ts `bothProblem`), with one
 * choice variable per output that says which of its two columns is covered
 * and charges a dark-decoded output its input network's diodes. HiGHS solves
 * it from the heuristic's plan, on the problem with identical rows merged
 * (reduce.ts), stopped by the same work budget as the lit decoder's exact
 * stage.
 *
 * The dual bound is a proven lower bound on the objective where the model
 * holds every possible decoder: depth limit 2 and a complete candidate
 * family. Elsewhere (depth 3, or a family too big for the model) no bound
 * is claimed beyond the trivial one (every output needs a diode).
 */
import type { DecodeSpec } from "../spec/decodeSpec.ts";
import { candidateFamily, DEFAULT_FAMILY_LIMITS } from "./candidates.ts";
import type { HighsLoader, HighsModelLike } from "./exact.ts";
import { buildSharingModel } from "./model.ts";
import { planCount, type SharingPlan, type SharingRules } from "./plan.ts";
import { bothOfPlan, bothProblem, planOfBoth } from "./polarityProblem.ts";
import type { ChosenPlan } from "./polarity.ts";
import { contractPlan, expandPlan, reduceRows } from "./reduce.ts";
import { breakTies } from "./tieBreak.ts";
import type { WorkBudget } from "./workBudget.ts";
import { WorkMeter } from "./workMeter.ts";

export interface EitherExactOptions {
  readonly timeLimitMs: number;
  readonly deadlineMs: number;
  readonly budget: WorkBudget;
  readonly seed: number;
  readonly loadHighs: HighsLoader;
}

export interface EitherOutcome {
  readonly best: ChosenPlan;
  /** Proven lower bound on the objective (matrix diodes plus input-network diodes), or null. */
  readonly lowerBound: number | null;
  readonly status: "optimal" | "time-limit" | "solver-failed";
  readonly deadlineHit: boolean;
  /** Model columns, for the bench; 0 when no model was run. */
  readonly columns: number;
}

const MIP_INTERRUPT = 6;
const STATUS_OPTIMAL = 7;
const STATUS_TIME_LIMIT = 13;
const PRIMAL_FEASIBLE = 2;
/** As exact.ts: a model whose rows x columns exceed this many times the HiGHS work budget is not started. */
const HIGHS_ROOT_SHARE = 4;

/**
 * Solves `either` exactly where the model fits; never returns worse than `warm`.
 *
 * @param per diodes of one dark-decoded output's input network
 */
export async function eitherExact(
  spec: DecodeSpec,
  rules: SharingRules,
  per: number,
  warm: ChosenPlan,
  opts: EitherExactOptions,
): Promise<EitherOutcome> {
  const m = spec.outputs.length;
  const cost = (c: ChosenPlan): number => planCount(c.plan) + per * c.choice.filter((x) => x === "dark").length;
  const warmCost = cost(warm);
  const floor = Math.min(warmCost, m);
  const both = bothProblem(spec);
  const reduction = reduceRows(both);
  const p = reduction.problem;
  const warmBoth = contractPlan(reduction, bothOfPlan(m, warm.plan, warm.choice));
  const minOutputs = rules.policy === "mixed" ? 2 : 1;
  const familyMeter = new WorkMeter(opts.budget.familyWork, opts.deadlineMs);
  const warmShapes = warmBoth.buses.filter((b) => b.states.length >= 2).map((b) => b.outputs);
  const family = candidateFamily(p, minOutputs, DEFAULT_FAMILY_LIMITS, warmShapes, familyMeter, rules.depthLimit <= 2 ? "stop" : "best");
  let deadlineHit = familyMeter.deadlineHit;
  if (!family.complete && rules.depthLimit <= 2) return { best: warm, lowerBound: floor, status: "time-limit", deadlineHit, columns: 0 };

  // Pairs in the reduced problem's columns (reduceRows keeps every column, in order).
  const at = new Map(reduction.outputs.map((o, i) => [o, i]));
  const pairs = spec.outputs.map((_, o) => [at.get(o) ?? o, at.get(m + o) ?? m + o] as const);
  const model = buildSharingModel(p, rules, family, { pairs, secondCost: per });
  const boundIsGlobal = family.complete && rules.depthLimit <= 2;
  if (model.rows * model.columns.length > opts.budget.highsWork * HIGHS_ROOT_SHARE) {
    return { best: warm, lowerBound: floor, status: "time-limit", deadlineHit, columns: model.columns.length };
  }
  let highsModel: HighsModelLike | undefined;
  try {
    const highs = await opts.loadHighs();
    highsModel = highs.createModel({ format: "lp", data: model.text });
    highsModel.options.set({
      output_flag: false,
      time_limit: Math.max(0.01, (opts.deadlineMs - Date.now()) / 1000),
      random_seed: opts.seed,
      mip_rel_gap: 0,
      mip_abs_gap: 1e-6,
      mip_allow_restart: false,
      mip_max_nodes: opts.budget.highsNodes,
    });
    const numCols = highsModel.getDimensions().numCols;
    const index = new Map<string, number>();
    for (const name of model.columns) index.set(name, highsModel.getColByName(name));
    const start = model.warmStart(warmBoth);
    if (start) {
      const colValue = new Float64Array(numCols);
      for (const [name, v] of start) {
        const i = index.get(name);
        if (i !== undefined && i >= 0) colValue[i] = v;
      }
      highsModel.setSolution({ colValue });
    }
    const cols = Math.max(1, numCols);
    const highsWork = opts.budget.highsWork;
    highsModel.run({
      [MIP_INTERRUPT]: (event) => {
        if (Number(event.data.mip_total_lp_iterations ?? 0) * cols > highsWork) event.interrupt();
      },
    });
    const status = highsModel.getModelStatus();
    deadlineHit ||= status === STATUS_TIME_LIMIT;
    const dual = Number(highsModel.info.get("mip_dual_bound"));
    let best = warm;
    if (Number(highsModel.info.get("primal_solution_status")) === PRIMAL_FEASIBLE) {
      const x = highsModel.getSolution().colValue;
      const reduced: SharingPlan = breakTies(
        p,
        rules,
        model.decode((name) => x[index.get(name) ?? -1] ?? 0),
      );
      const found = planOfBoth(m, expandPlan(reduction, reduced));
      if (cost(found) < warmCost) best = found;
    }
    let lowerBound = floor;
    if (boundIsGlobal && Number.isFinite(dual)) {
      const milp = Math.ceil(dual - 1e-6);
      // Uniform: the model is the all-bus decoder; the all-direct one (each output on its cheaper side) is the other choice.
      lowerBound = Math.max(floor, rules.policy === "uniform" ? Math.min(allDirect(spec, per), milp) : milp);
    }
    lowerBound = Math.min(lowerBound, cost(best));
    return { best, lowerBound, status: status === STATUS_OPTIMAL ? "optimal" : "time-limit", deadlineHit, columns: model.columns.length };
  } catch {
    return { best: warm, lowerBound: floor, status: "solver-failed", deadlineHit, columns: model.columns.length };
  } finally {
    try {
      highsModel?.dispose();
    } catch {
      // A module that aborted cannot free its memory; it is dropped with the instance.
    }
  }
}

/** The all-direct decoder's objective, each output on its cheaper side. */
function allDirect(spec: DecodeSpec, per: number): number {
  const n = spec.lit.length;
  let total = 0;
  spec.outputs.forEach((_, o) => {
    const lit = spec.lit.filter((r) => r[o]).length;
    total += Math.min(lit, n - lit + per);
  });
  return total;
}
