/**
 * The exact two-level minimiser: the covering MILP of coverModel.ts over the
 * candidate family, solved by HiGHS twice (fewest diodes, then fewest gates
 * at that count), warm-started from the heuristic's cover.
 *
 * The lower bound is HiGHS's dual bound only when the family is complete
 * (it then holds a cheapest term for every set of states a term can have,
 * so the model covers every two-level decoder); otherwise only the
 * family-free floor of twoLevelBound.ts is claimed. Work budgets come from
 * the configured time limit (synth/workBudget.ts), never from the clock.
 */
import type { HighsLoader } from "../synth/exact.ts";
import type { WorkBudget } from "../synth/workBudget.ts";
import type { LogicProblem } from "./logicProblem.ts";
import type { TermFamily, Term } from "./implicants.ts";
import { feedableOutputs } from "./implicants.ts";
import { compareCovers, coverDiodes, coverExact, type Cover } from "./cover.ts";
import { coverModel } from "./coverModel.ts";
import { runHighs } from "../synth/highsRun.ts";
import { setKey } from "./stateSet.ts";

export interface TwoLevelExactOptions {
  readonly budget: WorkBudget;
  readonly deadlineMs: number;
  readonly seed: number;
  readonly loadHighs: HighsLoader;
  /** The family-free floor (twoLevelFloor), already computed. */
  readonly floor: number;
}

export type TwoLevelStatus = "optimal" | "stopped" | "too-big" | "solver-failed";

export interface TwoLevelOutcome {
  readonly cover: Cover;
  /** A proven lower bound on the diodes of every two-level decoder. */
  readonly lowerBound: number;
  readonly status: TwoLevelStatus;
  /** True when the gate count is proven least among decoders of this many diodes. */
  readonly gatesProven: boolean;
  readonly columns: number;
  readonly rows: number;
  readonly deadlineHit: boolean;
  readonly message?: string;
}

/**
 * A model whose rows times columns exceed this many times the HiGHS work
 * budget is not started: its root LP alone would overrun the budget (the
 * same guard as the matrix optimizer's, synth/exact.ts).
 */
const ROOT_SHARE = 4;

/**
 * Minimises diodes, then gates. `warm` must be an exact cover; the outcome
 * is never worse than it.
 *
 * @example
 * const out = await twoLevelExact(p, family, heuristicCover(p, family.terms, meter), opts);
 * out.status; // "optimal" on BCD: 40 diodes, 7 gates
 */
export async function twoLevelExact(
  p: LogicProblem,
  family: TermFamily,
  warm: Cover,
  opts: TwoLevelExactOptions,
): Promise<TwoLevelOutcome> {
  const terms = withCoverTerms(p, family.terms, warm);
  const model = coverModel(p, terms);
  const size = { columns: model.columns.length, rows: model.rows };
  const floor = Math.min(opts.floor, coverDiodes(warm));
  if (model.rows * model.columns.length > opts.budget.highsWork * ROOT_SHARE) {
    return { cover: warm, lowerBound: floor, status: "too-big", gatesProven: false, ...size, deadlineHit: false };
  }
  const run = {
    loadHighs: opts.loadHighs,
    seed: opts.seed,
    deadlineMs: opts.deadlineMs,
    maxNodes: opts.budget.highsNodes,
    maxWork: opts.budget.highsWork,
  };
  const first = await runHighs(model.text, model.columns, model.warmStart(warm), run);
  let cover = warm;
  if (first.values) cover = better(p, cover, model.decode(first.values));
  const diodes = coverDiodes(cover);
  let lowerBound = floor;
  if (family.complete && first.dualBound !== null) lowerBound = Math.max(lowerBound, Math.ceil(first.dualBound - 1e-6));
  lowerBound = Math.min(lowerBound, diodes);
  let deadlineHit = first.deadlineHit;
  if (first.status === "failed") {
    return {
      cover,
      lowerBound,
      status: "solver-failed",
      gatesProven: false,
      ...size,
      deadlineHit,
      ...(first.message ? { message: first.message } : {}),
    };
  }
  if (lowerBound < diodes) return { cover, lowerBound, status: "stopped", gatesProven: false, ...size, deadlineHit };

  // Diodes proven least: now the fewest gates at that count.
  const gatesModel = coverModel(p, terms, { gatesWithin: diodes });
  const second = await runHighs(gatesModel.text, gatesModel.columns, gatesModel.warmStart(cover), run);
  deadlineHit ||= second.deadlineHit;
  if (second.values) cover = better(p, cover, gatesModel.decode(second.values));
  const gatesProven = second.status === "optimal" && family.complete;
  return { cover, lowerBound, status: "optimal", gatesProven, ...size, deadlineHit };
}

/** The better of two covers (diodes, then gates); a decoded cover must be exact to count. */
function better(p: LogicProblem, incumbent: Cover, found: Cover): Cover {
  if (!coverExact(p, found)) return incumbent;
  return compareCovers(found, incumbent) < 0 ? found : incumbent;
}

/** The family plus any term of the cover it lacks (or holds only at more literals), so the warm start fits the model. */
function withCoverTerms(p: LogicProblem, terms: readonly Term[], cover: Cover): Term[] {
  const out = [...terms];
  const index = new Map(terms.map((t, i) => [setKey(t.states), i]));
  for (const t of cover) {
    const key = setKey(t.states);
    const i = index.get(key);
    const term = { literals: t.literals, states: t.states, outputs: feedableOutputs(p, t.states) };
    if (i === undefined) {
      index.set(key, out.length);
      out.push(term);
    } else if (out[i]!.literals.length > t.literals.length) out[i] = term;
  }
  return out;
}
