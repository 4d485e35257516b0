/**
 * The exact optimizer: the MILP of model.ts solved by HiGHS (WebAssembly),
 * warm-started from the heuristic. At depth limit 2 with few outputs the
 * branch-and-bound of search.ts runs first and usually proves the optimum
 * on its own; HiGHS takes over where it does not apply or runs out of work.
 * Where the candidate family is too big for the model (depth 2), the LP
 * bound of bounds.ts bounds the heuristic's matrix.
 *
 * Every phase stops on a work budget computed from the configured time limit
 * (`workBudget`), so the same settings give the same plan and bound on any
 * machine; the clock is only a deadline, and a run it cuts says so.
 *
 * HiGHS is reached only through a loader function, so src/core imports no
 * solver at load time: Node passes the npm package, the web app's Web Worker
 * passes its own (with `locateFile` for the .wasm). A fresh solver instance
 * is loaded for every solve, because the WebAssembly module cannot be trusted
 * after it has aborted once. A solver that throws or aborts is a typed
 * outcome: the caller keeps the heuristic's matrix.
 */
import { candidateFamily, DEFAULT_FAMILY_LIMITS, type FamilyLimits } from "./candidates.ts";
import { lpLowerBound, trivialLowerBound } from "./bounds.ts";
import { levelBound } from "./levelBound.ts";
import { buildSharingModel } from "./model.ts";
import { searchApplies, searchPlan } from "./search.ts";
import { litCount, planCost, planCount, type SharingPlan, type SharingProblem, type SharingRules } from "./plan.ts";
import { contractPlan, expandPlan, reduceRows } from "./reduce.ts";
import { WorkMeter } from "./workMeter.ts";
import { deadlineMarginMs, workBudget, type WorkBudget } from "./workBudget.ts";
import { betterPlan, breakTies } from "./tieBreak.ts";
import { runHighs } from "./highsRun.ts";

/** The part of a HiGHS model the driver uses (the npm `highs` persistent API). */
export interface HighsModelLike {
  readonly options: { set(values: Readonly<Record<string, number | boolean | string>>): unknown };
  readonly info: { get(name: string): number | bigint };
  getDimensions(): { readonly numCols: number };
  getColByName(name: string): number;
  setSolution(solution: { readonly colValue: Float64Array }): unknown;
  /** Runs the solve; `callbacks` by channel (6 = the MIP interrupt checkpoint). */
  run(callbacks?: Readonly<Record<number, (event: HighsInterruptEvent) => void>>): unknown;
  getModelStatus(): number;
  getSolution(): { readonly colValue: Float64Array; readonly rowDual: Float64Array };
  addCol(cost: number, lower: number, upper: number, entries: { readonly indices: Int32Array; readonly values: Float64Array }): unknown;
  dispose(): void;
}

/** A HiGHS MIP interrupt checkpoint (the npm `highs` callback event, the part used here). */
export interface HighsInterruptEvent {
  readonly data: { readonly mip_total_lp_iterations?: bigint | number };
  interrupt(): void;
}

/** The part of the loaded HiGHS runtime the driver uses. */
export interface HighsLike {
  createModel(source: { readonly format: "lp"; readonly data: string }): HighsModelLike;
}

/** Loads a fresh HiGHS runtime. */
export type HighsLoader = () => Promise<HighsLike>;

/** The npm package, imported lazily (works in Node; bundlers resolve it too). */
export const defaultHighsLoader: HighsLoader = async () => {
  const mod = (await import("highs")) as unknown as { default: () => Promise<HighsLike> };
  return mod.default();
};

export interface ExactOptions {
  /**
   * The configured time limit, milliseconds. The work budgets come from it
   * (see `workBudget`), never from the time left on the clock, so the same
   * settings give the same result on an idle or a busy machine.
   */
  readonly timeLimitMs: number;
  /**
   * Safety net only: a `Date.now()` value past which every phase stops as if
   * its work budget had run out (then the outcome says `deadlineHit`). By
   * default the time limit from the start of this call, less a little room
   * for decoding and verification.
   */
  readonly deadlineMs?: number;
  readonly seed: number;
  readonly loadHighs: HighsLoader;
  readonly familyLimits?: FamilyLimits;
  /**
   * Try the branch-and-bound of synthSearch.ts before HiGHS where it applies
   * (default true); false sends every instance straight to HiGHS.
   */
  readonly search?: boolean;
  /** Work budgets; by default `workBudget(timeLimitMs)` (workBudget.ts). */
  readonly budget?: WorkBudget;
}

/** Least time limit at which HiGHS runs after a search that was cut short, milliseconds. */
const HIGHS_AFTER_SEARCH_MIN_MS = 5000;
/**
 * A HiGHS model runs only when its rows x columns stay within this many times
 * the HiGHS work budget. Its work at the checkpoint after the root LP was
 * half of rows x columns on 00-23 at depth 3 (6 054 columns, 10 688 rows)
 * and 3.4 times on 0-F (930 columns): a rough guide, meant to keep HiGHS
 * away from the big models it could not finish near the budget.
 */
const HIGHS_ROOT_SHARE = 4;

export type ExactStatus = "optimal" | "time-limit" | "solver-failed";

export interface ExactOutcome {
  readonly plan: SharingPlan;
  /** Proven lower bound on the diode count under these rules. */
  readonly lowerBound: number;
  readonly status: ExactStatus;
  /** Why the solver failed, for `solver-failed`. */
  readonly message?: string;
  /** Model size, for the bench; 0 when the branch-and-bound settled it without a model. */
  readonly columns: number;
  /** True when the candidate family held every useful bus shape. */
  readonly complete: boolean;
  /**
   * True when the clock (the deadline) stopped a phase before its work
   * budget ran out. Only then may another run of the same settings give a
   * different plan or bound; the budgets are set so that this is rare.
   */
  readonly deadlineHit: boolean;
}

/**
 * The bound of the relaxed problem without levels (valid at depth 2): the
 * per-state Lagrangian bound (lagrangeBound.ts; under per-segment branched
 * on the outputs' levels, levelBound.ts) where every row has at most
 * 16 lit outputs, else the column-generation LP bound (bounds.ts). Under
 * uniform the exact stage weighs the all-bus matrix against the direct one,
 * so the bound is the smaller of the all-bus bound and the direct count.
 */
async function relaxedBound(
  p: SharingProblem,
  rules: SharingRules,
  upper: number,
  budget: WorkBudget,
  deadlineMs: number,
  loadHighs: HighsLoader,
): Promise<{ bound: number; deadlineHit: boolean }> {
  const uniform = (b: number): number => (rules.policy === "uniform" ? Math.min(litCount(p), b) : b);
  const lag = levelBound(p, rules, { maxWork: budget.lagrangeWork, deadlineMs, upper }, budget.levelWork);
  if (lag.bound !== null) return { bound: uniform(lag.bound), deadlineHit: lag.deadlineHit };
  try {
    const lpHighs = await loadHighs();
    const lp = lpLowerBound(p, rules, {
      solveLp: (text) => lpHighs.createModel({ format: "lp", data: text }),
      deadlineMs,
      maxWork: budget.lpWork,
    });
    return { bound: lp.bound ?? 0, deadlineHit: lag.deadlineHit || lp.deadlineHit };
  } catch {
    // A failed LP leaves the combinatorial bound.
    return { bound: 0, deadlineHit: lag.deadlineHit };
  }
}

/**
 * Solves for the minimum plan. `warm` must be a valid plan (the heuristic's);
 * the outcome is never worse than it.
 *
 * The lower bound is HiGHS's dual bound only where the model covers every
 * possible matrix: depth limit 2 and a complete candidate family. At depth 3
 * the model leaves out bus-to-bus and output-to-bus chains, so only the
 * combinatorial bound of synthBounds.ts is claimed there.
 */
export async function exactPlan(p: SharingProblem, rules: SharingRules, warm: SharingPlan, opts: ExactOptions): Promise<ExactOutcome> {
  const started = Date.now();
  // The clock is only the safety net; it stops a little early so that decoding,
  // tie-breaks and the verifier still finish inside the caller's limit.
  const deadlineMs = opts.deadlineMs ?? started + opts.timeLimitMs - deadlineMarginMs(opts.timeLimitMs);
  // Identical states merged (exact, see reduce.ts): the engines below see each distinct row once.
  const reduction = reduceRows(p);
  const out = await exactReduced(reduction.problem, rules, contractPlan(reduction, warm), { ...opts, deadlineMs });
  const plan = betterPlan(warm, expandPlan(reduction, out.plan));
  const count = planCount(plan);
  const lowerBound = Math.min(out.lowerBound, count);
  const status = out.status === "solver-failed" ? out.status : lowerBound === count ? "optimal" : "time-limit";
  return { ...out, plan, lowerBound, status };
}

/** `exactPlan` on a reduced problem (rows may stand for several states). */
async function exactReduced(
  p: SharingProblem,
  rules: SharingRules,
  warm: SharingPlan,
  opts: ExactOptions & { readonly deadlineMs: number },
): Promise<ExactOutcome> {
  const deadlineMs = opts.deadlineMs;
  const budget = opts.budget ?? workBudget(opts.timeLimitMs);
  const warmShapes = warm.buses.filter((b) => b.states.length >= 2).map((b) => b.outputs);
  const minOutputs = rules.policy === "mixed" ? 2 : 1;
  const familyMeter = new WorkMeter(budget.familyWork, deadlineMs);
  // At depth 2 a family too big for the model is not used (the LP bound takes over), so its enumeration stops there.
  const whenTooMany = rules.depthLimit <= 2 ? "stop" : "best";
  const family = candidateFamily(p, minOutputs, opts.familyLimits ?? DEFAULT_FAMILY_LIMITS, warmShapes, familyMeter, whenTooMany);
  let deadlineHit = familyMeter.deadlineHit;
  const floor = trivialLowerBound(p);
  const warmCount = planCost(p, warm);

  // Too big for the full model: bound by the LP relaxation (column
  // generation, valid at depth 2) and keep the heuristic's matrix. A MILP
  // over the bus shapes the pricing found is no longer run here: HiGHS
  // reaches its first interrupt checkpoint only after a root of several
  // seconds on these models (00-23: 3.5 s, 00-59: 8 s on a busy machine),
  // so no work budget could stop it before the clock did, and it improved
  // the heuristic's matrix by one diode at most on the bench.
  if (!family.complete && rules.depthLimit <= 2) {
    const plan = warm;
    const relaxed = await relaxedBound(p, rules, warmCount, budget, deadlineMs, opts.loadHighs);
    deadlineHit ||= relaxed.deadlineHit;
    const lowerBound = Math.min(Math.max(floor, relaxed.bound), warmCount);
    return { columns: 0, complete: false, plan, lowerBound, status: lowerBound === warmCount ? "optimal" : "time-limit", deadlineHit };
  }

  // The branch-and-bound first: on small instances it proves the optimum
  // long before HiGHS does. If it runs out of nodes, its best plan becomes
  // HiGHS's warm start and its bound stays.
  let searchBound: number | null = null;
  let incumbent = warm;
  if (opts.search !== false && searchApplies(p, rules, family)) {
    const s = searchPlan(p, rules, family, warmCount, { maxWork: budget.searchWork, deadlineMs });
    deadlineHit ||= s.deadlineHit;
    const found = s.plan === null ? warm : betterPlan(warm, breakTies(p, rules, s.plan), p);
    // Uniform: the search covers all-bus matrices; the all-direct one is the other choice.
    const lb = rules.policy === "uniform" ? Math.min(litCount(p), s.lowerBound) : s.lowerBound;
    searchBound = Math.min(Math.max(floor, lb), planCost(p, found));
    if (s.proven) return { columns: 0, complete: true, plan: found, lowerBound: searchBound, status: "optimal", deadlineHit };
    incumbent = found;
    // A short limit leaves HiGHS no time for its root (measured 1 to 7 s on
    // 0-F), and a root cut short by the clock would make the result depend
    // on the machine: so below this limit the search's result stands.
    if (opts.timeLimitMs < HIGHS_AFTER_SEARCH_MIN_MS)
      return { columns: 0, complete: true, plan: found, lowerBound: searchBound, status: "time-limit", deadlineHit };
  }
  const model = buildSharingModel(p, rules, family);
  const boundIsGlobal = family.complete && rules.depthLimit <= 2;
  const base = { columns: model.columns.length, complete: family.complete };
  // HiGHS looks at its work budget only at checkpoints, the first after its
  // root LP, whose work is about rows x columns: a model whose root alone
  // would overrun the budget is not started (the clock would stop it).
  if (model.rows * model.columns.length > budget.highsWork * HIGHS_ROOT_SHARE) {
    const lowerBound = Math.min(Math.max(floor, searchBound ?? 0), planCost(p, incumbent));
    return { ...base, plan: incumbent, lowerBound, status: "time-limit", deadlineHit };
  }

  const run = await runHighs(model.text, model.columns, model.warmStart(incumbent), {
    loadHighs: opts.loadHighs,
    seed: opts.seed,
    deadlineMs,
    // The deterministic stops; the time limit is the safety net.
    maxNodes: budget.highsNodes,
    maxWork: budget.highsWork,
    // Measured on 0-9 (bench cases): restarts after root presolve cost about 40 % more time.
    allowRestart: false,
  });
  deadlineHit ||= run.deadlineHit;
  if (run.status === "failed") {
    return {
      ...base,
      plan: incumbent,
      lowerBound: Math.min(Math.max(floor, searchBound ?? 0), planCost(p, incumbent)),
      status: "solver-failed",
      message: run.message ?? "HiGHS failed",
      deadlineHit,
    };
  }
  const plan = run.values ? betterPlan(incumbent, breakTies(p, rules, model.decode(run.values)), p) : incumbent;
  const count = planCost(p, plan);
  let lowerBound = floor;
  if (boundIsGlobal && run.dualBound !== null) {
    const milpBound = Math.ceil(run.dualBound - 1e-6);
    // Uniform: the model is the all-bus matrix; the all-direct one is the other choice.
    lowerBound = Math.max(floor, rules.policy === "uniform" ? Math.min(litCount(p), milpBound) : milpBound);
  }
  if (searchBound !== null) lowerBound = Math.max(lowerBound, searchBound);
  lowerBound = Math.min(lowerBound, count);
  return { ...base, plan, lowerBound, status: run.status === "optimal" ? "optimal" : "time-limit", deadlineHit };
}
