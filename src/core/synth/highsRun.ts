/**
 * One HiGHS solve of an LP-format MILP, stopped deterministically: by the
 * node limit and by LP iterations times columns at its interrupt checkpoint
 * (the work units of workBudget.ts),
 * with the clock only as the safety net. A solver that throws or aborts is
 * an outcome, not an exception; a fresh instance is loaded every time
 * (see exact.ts on why).
 */
import type { HighsLoader, HighsModelLike } from "./exact.ts";

/** A MILP in LP format whose named columns decode to a `T` and take a `T` as a warm start. */
export interface MilpModel<T> {
  /** The LP-format text. */
  readonly text: string;
  /** Column names, in the order `warmStart` and `decode` use. */
  readonly columns: readonly string[];
  /** Number of constraint rows. */
  readonly rows: number;
  decode(values: (name: string) => number): T;
  /** Column values of a `T`, for the warm start; null when it uses a column outside the model. */
  warmStart(start: T): Map<string, number> | null;
}

/** HiGHS callback channel of the MIP interrupt checkpoint. */
const MIP_INTERRUPT = 6;
/** `highs.constants.modelStatus`: optimal. */
const STATUS_OPTIMAL = 7;
/** `highs.constants.modelStatus`: its time limit (the deadline) stopped it. */
const STATUS_TIME_LIMIT = 13;
/** `primal_solution_status` 2: feasible. */
const PRIMAL_FEASIBLE = 2;

export interface HighsRunOptions {
  readonly loadHighs: HighsLoader;
  readonly seed: number;
  /** `Date.now()` value of the safety-net deadline. */
  readonly deadlineMs: number;
  readonly maxNodes: number;
  /** LP iterations times columns after which the solve stops at its next checkpoint. */
  readonly maxWork: number;
  /** HiGHS's `mip_allow_restart`; left at HiGHS's default when absent. */
  readonly allowRestart?: boolean;
}

export interface HighsRunOutcome {
  readonly status: "optimal" | "stopped" | "failed";
  /** The best dual bound of the objective (a valid lower bound), or null. */
  readonly dualBound: number | null;
  /** The best solution's value per column name, or null when none was found. */
  readonly values: ((name: string) => number) | null;
  readonly deadlineHit: boolean;
  readonly message?: string;
}

/**
 * Solves `text` (LP format), warm-started from `start` (column values by name) when given.
 *
 * @example
 * const r = await runHighs(model.text, model.columns, model.warmStart(cover), opts);
 * if (r.status === "optimal") model.decode(r.values!);
 */
export async function runHighs(
  text: string,
  columns: readonly string[],
  start: ReadonlyMap<string, number> | null,
  opts: HighsRunOptions,
): Promise<HighsRunOutcome> {
  let model: HighsModelLike | undefined;
  try {
    const highs = await opts.loadHighs();
    model = highs.createModel({ format: "lp", data: text });
    model.options.set({
      output_flag: false,
      time_limit: Math.max(0.01, (opts.deadlineMs - Date.now()) / 1000),
      random_seed: opts.seed,
      mip_rel_gap: 0,
      mip_abs_gap: 1e-6,
      mip_max_nodes: opts.maxNodes,
      ...(opts.allowRestart === undefined ? {} : { mip_allow_restart: opts.allowRestart }),
    });
    const numCols = model.getDimensions().numCols;
    const index = new Map<string, number>();
    for (const name of columns) index.set(name, model.getColByName(name));
    if (start) {
      const colValue = new Float64Array(numCols);
      for (const [name, v] of start) {
        const i = index.get(name);
        if (i !== undefined && i >= 0) colValue[i] = v;
      }
      model.setSolution({ colValue });
    }
    const cols = Math.max(1, numCols);
    model.run({
      [MIP_INTERRUPT]: (event) => {
        if (Number(event.data.mip_total_lp_iterations ?? 0) * cols > opts.maxWork) event.interrupt();
      },
    });
    const status = model.getModelStatus();
    const dual = Number(model.info.get("mip_dual_bound"));
    let values: ((name: string) => number) | null = null;
    if (Number(model.info.get("primal_solution_status")) === PRIMAL_FEASIBLE) {
      const x = Float64Array.from(model.getSolution().colValue);
      values = (name) => x[index.get(name) ?? -1] ?? 0;
    }
    return {
      status: status === STATUS_OPTIMAL ? "optimal" : "stopped",
      dualBound: Number.isFinite(dual) ? dual : null,
      values,
      deadlineHit: status === STATUS_TIME_LIMIT,
    };
  } catch (e) {
    return { status: "failed", dualBound: null, values: null, deadlineHit: false, message: String((e as Error)?.message ?? e) };
  } finally {
    try {
      model?.dispose();
    } catch {
      // A module that aborted cannot free its memory; it goes with the instance.
    }
  }
}
