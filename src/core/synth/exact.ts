/**
 * The exact optimizer: the MILP of synthModel.ts solved by HiGHS
 * (WebAssembly), warm-started from the heuristic. At depth limit 2 with few
 * outputs the branch-and-bound of synthSearch.ts runs first and usually
 * proves the optimum on its own; HiGHS takes over where it does not apply or
 * runs out of nodes.
 *
 * HiGHS is reached only through a loader function, so src/core imports no
 * solver at load time: Node passes the npm package, the web app's Web Worker
 * passes its own (with `locateFile` for the .wasm). A fresh solver instance
 * is loaded for every solve, because the WebAssembly module cannot be trusted
 * after it has aborted once. A solver that throws or aborts is a typed
 * outcome: the caller keeps the heuristic's matrix.
 */
import { candidateFamily, DEFAULT_FAMILY_LIMITS, familyFromShapes, type FamilyLimits } from "./candidates.ts";
import { lpLowerBound, trivialLowerBound } from "./bounds.ts";
import { buildSharingModel } from "./model.ts";
import { searchApplies, searchPlan } from "./search.ts";
import { litCount, planCount, type SharingPlan, type SharingProblem, type SharingRules } from "./plan.ts";

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

/** HiGHS callback channel of the MIP interrupt checkpoint (`highs.constants.callbackType.mipInterrupt`). */
const MIP_INTERRUPT = 6;

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
  /** Wall-clock limit for the solve, milliseconds. */
  readonly timeLimitMs: number;
  readonly seed: number;
  readonly loadHighs: HighsLoader;
  readonly familyLimits?: FamilyLimits;
  /**
   * Try the branch-and-bound of synthSearch.ts before HiGHS where it applies
   * (default true); false sends every instance straight to HiGHS.
   */
  readonly search?: boolean;
  /** Work budgets; by default `workBudget(timeLimitMs)`. */
  readonly budget?: WorkBudget;
}

/** Deterministic work limits of one exact run (see `workBudget`). */
export interface WorkBudget {
  /** Branch-and-bound work units (synthSearch.ts). */
  readonly searchWork: number;
  /** LP-bound work for big instances (synthBounds.ts). */
  readonly lpWork: number;
  /** HiGHS `mip_max_nodes`. */
  readonly highsNodes: number;
  /**
   * HiGHS LP iterations (over the whole MIP solve) times the model's columns:
   * it tracks time even at the root, where no node is counted. HiGHS stops
   * at the first interrupt checkpoint past it.
   */
  readonly highsWork: number;
}

/** Search work units per millisecond of time limit: a sixth of the rate measured on 0-9 and 0-F (50 000 to 120 000 a millisecond), because a first run (before the JIT has warmed up) on a busy machine is much slower. */
const SEARCH_WORK_PER_MS = 15_000;
/** LP-bound work (nonzeros solved, see synthBounds.ts) per millisecond: about 70 % of the rate measured on 00-59 and 00-99 (345 to 360 a millisecond; 280 while the machine was busier). */
const LP_WORK_PER_MS = 250;
/**
 * HiGHS work (LP iterations times model columns, see `WorkBudget`) per
 * millisecond of time limit. Measured 5 200 to 12 200 a millisecond over
 * whole solves on 0-F, 1-12 and 00-23, but only 3 200 in the first 5 s on
 * 00-23, whose root spends long stretches on other work; so about a third
 * of the slowest.
 */
const HIGHS_WORK_PER_MS = 1000;
/** Least time limit at which HiGHS runs after a search that was cut short, milliseconds. */
const HIGHS_AFTER_SEARCH_MIN_MS = 5000;
/** HiGHS branch-and-bound nodes per millisecond of time limit (measured 10 to 35 ms a node on 0-F, after a root of 1 to 7 s). */
const HIGHS_NODES_PER_MS = 1 / 100;

/**
 * Work budgets derived from the time limit. A run stops on them, not on the
 * clock, so the same configuration gives the same matrix every run; the
 * clock is only a safety net. The rates above leave room for a slower or
 * busier machine (measured on a shared 2-core one), so the budgets normally
 * run out well before the clock does.
 */
export function workBudget(timeLimitMs: number): WorkBudget {
  return {
    // The LP bound gets 70 % of the time limit, as its safety-net clock does.
    lpWork: Math.max(1e4, Math.floor(timeLimitMs * 0.7 * LP_WORK_PER_MS)),
    searchWork: Math.max(1e5, Math.floor(timeLimitMs * SEARCH_WORK_PER_MS)),
    highsNodes: Math.max(20, Math.floor(timeLimitMs * HIGHS_NODES_PER_MS)),
    highsWork: Math.max(1e5, Math.floor(timeLimitMs * HIGHS_WORK_PER_MS)),
  };
}

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
}

/** HiGHS model status codes used here (`highs.constants.modelStatus`). */
const STATUS_OPTIMAL = 7;
/** HiGHS info `primal_solution_status`: 2 = feasible. */
const PRIMAL_FEASIBLE = 2;

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
  const warmShapes = warm.buses.filter((b) => b.states.length >= 2).map((b) => b.outputs);
  const minOutputs = rules.policy === "mixed" ? 2 : 1;
  let family = candidateFamily(p, minOutputs, opts.familyLimits ?? DEFAULT_FAMILY_LIMITS, warmShapes);
  const floor = trivialLowerBound(p);
  const warmCount = planCount(warm);
  const budget = opts.budget ?? workBudget(opts.timeLimitMs);
  // The clock is only the safety net; it stops a little early so that decoding,
  // tie-breaks and the verifier still finish inside the caller's limit.
  const deadlineMs = started + opts.timeLimitMs - Math.min(500, opts.timeLimitMs * 0.05);

  // Too big for the full model: bound by the LP relaxation (column
  // generation, valid at depth 2), then solve the MILP over the bus shapes
  // the pricing found plus the heuristic's ("price and branch").
  let lpBound: number | null = null;
  if (!family.complete && rules.depthLimit <= 2) {
    try {
      const lpHighs = await opts.loadHighs();
      const lp = lpLowerBound(p, rules, {
        solveLp: (text) => lpHighs.createModel({ format: "lp", data: text }),
        timeLimitMs: opts.timeLimitMs * 0.7,
        maxWork: budget.lpWork,
      });
      lpBound = lp.bound;
      family = familyFromShapes(p, [...warmShapes, ...lp.shapes]);
    } catch {
      // A failed LP leaves the truncated family and the combinatorial bound.
    }
  }

  // The branch-and-bound first: on small instances it proves the optimum
  // long before HiGHS does. If it runs out of nodes, its best plan becomes
  // HiGHS's warm start and its bound stays.
  let searchBound: number | null = null;
  let incumbent = warm;
  if (opts.search !== false && searchApplies(p, rules, family)) {
    const s = searchPlan(p, rules, family, warmCount, { maxWork: budget.searchWork, deadlineMs });
    const found = s.plan === null ? warm : pickBetter(warm, breakTies(p, rules, s.plan));
    // Uniform: the search covers all-bus matrices; the all-direct one is the other choice.
    const lb = rules.policy === "uniform" ? Math.min(litCount(p), s.lowerBound) : s.lowerBound;
    searchBound = Math.min(Math.max(floor, lb), planCount(found));
    if (s.proven) return { columns: 0, complete: true, plan: found, lowerBound: searchBound, status: "optimal" };
    incumbent = found;
    // A short limit leaves HiGHS no time for its root (measured 1 to 7 s on
    // 0-F), and a root cut short by the clock would make the result depend
    // on the machine: so below this limit the search's result stands.
    if (opts.timeLimitMs < HIGHS_AFTER_SEARCH_MIN_MS)
      return { columns: 0, complete: true, plan: found, lowerBound: searchBound, status: "time-limit" };
  }
  const model = buildSharingModel(p, rules, family);
  const boundIsGlobal = family.complete && rules.depthLimit <= 2;
  const base = { columns: model.columns.length, complete: family.complete };

  let highsModel: HighsModelLike | undefined;
  try {
    const highs = await opts.loadHighs();
    highsModel = highs.createModel({ format: "lp", data: model.text });
    highsModel.options.set({
      output_flag: false,
      time_limit: Math.max(0.01, (deadlineMs - Date.now()) / 1000),
      random_seed: opts.seed,
      mip_rel_gap: 0,
      mip_abs_gap: 1e-6,
      // Measured on 0-9 (bench cases): restarts after root presolve cost about 40 % more time.
      mip_allow_restart: false,
      // The deterministic stop; the time limit above is the safety net.
      mip_max_nodes: budget.highsNodes,
    });
    const numCols = highsModel.getDimensions().numCols;
    const index = new Map<string, number>();
    for (const name of model.columns) index.set(name, highsModel.getColByName(name));
    const start = model.warmStart(incumbent);
    if (start) {
      const colValue = new Float64Array(numCols);
      for (const [name, v] of start) {
        const i = index.get(name);
        if (i !== undefined && i >= 0) colValue[i] = v;
      }
      highsModel.setSolution({ colValue });
    }
    const cols = Math.max(1, numCols);
    highsModel.run({
      [MIP_INTERRUPT]: (event) => {
        if (Number(event.data.mip_total_lp_iterations ?? 0) * cols > budget.highsWork) event.interrupt();
      },
    });
    const status = highsModel.getModelStatus();
    const dual = Number(highsModel.info.get("mip_dual_bound"));
    let plan = incumbent;
    if (Number(highsModel.info.get("primal_solution_status")) === PRIMAL_FEASIBLE) {
      const x = highsModel.getSolution().colValue;
      const found = breakTies(
        p,
        rules,
        model.decode((name) => x[index.get(name) ?? -1] ?? 0),
      );
      plan = pickBetter(incumbent, found);
    }
    const count = planCount(plan);
    let lowerBound = floor;
    if (boundIsGlobal && Number.isFinite(dual)) {
      const milpBound = Math.ceil(dual - 1e-6);
      // Uniform: the model is the all-bus matrix; the all-direct one is the other choice.
      lowerBound = Math.max(floor, rules.policy === "uniform" ? Math.min(litCount(p), milpBound) : milpBound);
    }
    if (lpBound !== null) lowerBound = Math.max(lowerBound, lpBound);
    if (searchBound !== null) lowerBound = Math.max(lowerBound, searchBound);
    lowerBound = Math.min(lowerBound, count);
    return { ...base, plan, lowerBound, status: status === STATUS_OPTIMAL ? "optimal" : "time-limit" };
  } catch (e) {
    return {
      ...base,
      plan: incumbent,
      lowerBound: Math.min(Math.max(floor, lpBound ?? 0, searchBound ?? 0), planCount(incumbent)),
      status: "solver-failed",
      message: String((e as Error)?.message ?? e),
    };
  } finally {
    try {
      highsModel?.dispose();
    } catch {
      // A module that aborted cannot free its memory; it is dropped with the instance.
    }
  }
}

/** The better of two valid plans: fewer diodes, then the tie-break rank; `a` on a full tie. */
function pickBetter(a: SharingPlan, b: SharingPlan): SharingPlan {
  const ca = planCount(a);
  const cb = planCount(b);
  return cb < ca || (cb === ca && tieRank(b) < tieRank(a)) ? b : a;
}

/** Tie-break rank among plans of one count: bus nodes first, then long paths (bus outputs and links). */
function tieRank(plan: SharingPlan): number {
  const long = plan.links.length + plan.buses.reduce((a, b) => a + b.outputs.length, 0);
  return plan.buses.length * 1e6 + long;
}

/**
 * Count-neutral clean-up of a solver plan: under the mixed policy a bus whose
 * block costs no more direct (2 x 2, or one state or one output) becomes
 * direct diodes, one bus node and some long paths fewer.
 */
function breakTies(p: SharingProblem, rules: SharingRules, plan: SharingPlan): SharingPlan {
  if (rules.policy !== "mixed") return plan;
  const direct: (readonly [number, number])[] = [...plan.direct];
  const have = new Set(direct.map(([k, o]) => k * p.m + o));
  const buses = plan.buses.filter((b) => {
    if (b.states.length * b.outputs.length > b.states.length + b.outputs.length) return true;
    for (const k of b.states) {
      for (const o of b.outputs) {
        if (!have.has(k * p.m + o)) {
          have.add(k * p.m + o);
          direct.push([k, o]);
        }
      }
    }
    return false;
  });
  return { direct, buses, links: plan.links };
}
