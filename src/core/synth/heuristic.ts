/**
 * The fast heuristic: no MILP, deterministic, for live editing and for big
 * instances (and as the exact optimizer's warm start).
 *
 * Two nested searches. The outer one assigns every output a level (see
 * `levelRules` in rules.ts) by hill climbing from a few fixed starts. The
 * inner one, for a fixed assignment, covers the lit cells greedily (see
 * greedyCover.ts), in three orders, keeping the best. A last ruin-and-recreate
 * step forbids the chosen bus shapes one at a time and covers again.
 *
 * Each greedy plan is then refined by the local search of refine.ts, where
 * every row takes its exact cheapest cover, with kicks out of its local
 * minima and, on small problems, fresh starts (nothing shared; everything
 * direct) beside the greedy's plan.
 *
 * It runs on the problem with identical states merged (see reduce.ts). A
 * problem of few outputs (one position, or 1-12) is searched whole. Else
 * each display position is searched alone first: a position's digits
 * repeat over the states (a tens digit over ten of them), so merged it is a
 * small problem, and the union of the positions' plans is a valid matrix,
 * which the local search then refines on the whole problem, where buses and
 * links may span positions.
 *
 * Everything is charged to one work meter: when it runs out (or its deadline
 * passes) the heuristic returns the best plan found so far. The direct plan
 * is valid under every policy, so there always is one.
 */
import { busShapes, greedyCover, GREEDY_ORDERS, type ShapePool } from "./greedyCover.ts";
import { directPlan, type SharingPlan, type SharingProblem, type SharingRules } from "./plan.ts";
import { contractPlan, expandPlan, reduceRows, unionPlans } from "./reduce.ts";
import { refinePlan } from "./refine.ts";
import { comparePlans } from "./tieBreak.ts";
import { WorkMeter } from "./workMeter.ts";

/** Outer-search budget: most level assignments tried. Keeps big instances bounded. */
const MAX_EVALUATIONS = 400;
/** Below this many level assignments the outer search tries them all. */
const EXHAUSTIVE_ASSIGNMENTS = 256;
/** Ruin-and-recreate budget: rounds, and bus shapes tried per round. */
const RECREATE_ROUNDS = 6;
const RECREATE_BUSES = 12;
/**
 * Most work of the whole problem's greedy once the positions have a plan,
 * for the quick first answer: none. The refinement of the positions' union
 * (with its kicks) finds the buses and links across positions that this
 * greedy found on 00-23 (mixed 85, per-segment 89, uniform 91 without it),
 * and on the bigger counters the positions' plans win. The exact mode gives
 * it what the budget allows.
 */
export const WHOLE_AFTER_POSITIONS_WORK = 0;
/** A problem of at most this many outputs is searched whole, not position by position (0-F: 7, 1-12: 9, 00-23: 14). */
const SMALL_OUTPUTS = 10;
/**
 * Work of the refinement's kicks, per start (see refine.ts), measured on
 * the bench: on a small problem 400 000 (0-F per-segment and uniform reach
 * 53 from the empty start at about 300 000, the optimum 52 at 600 000); on
 * each position 300 000; on the union of the positions 500 000 (00-23: 85,
 * 89, 91; with 300 000: 85, 90, 92).
 */
const SMALL_KICK_WORK = 400_000;
const POSITION_KICK_WORK = 300_000;
const UNION_KICK_WORK = 500_000;
/** Most candidate bus shapes (rows and row intersections). */
const MAX_SHAPES = 20_000;

/**
 * Default work budget, in cells looked at: measured on the bench, the
 * heuristic needs at most a few million on counters of up to 100 states
 * (00-99), so this leaves those untouched and stops the largest projects
 * the format allows in about a second.
 */
export const HEURISTIC_DEFAULT_WORK = 60_000_000;

export interface HeuristicOptions {
  /** The meter to charge (its budget and deadline); by default `HEURISTIC_DEFAULT_WORK` and no deadline. */
  readonly meter?: WorkMeter;
  /**
   * Most work of the whole problem's greedy once the positions have a plan
   * (default `WHOLE_AFTER_POSITIONS_WORK`, for a quick first answer); the
   * exact mode passes more.
   */
  readonly wholeAfterPositions?: number;
}

/**
 * Runs the heuristic. Always returns a valid plan: the direct plan is the
 * first start, and it is valid under every policy.
 *
 * @example
 * const plan = heuristicPlan(problemFromLit(spec.lit), { depthLimit: 2, policy: "per-segment", buses: true, links: true });
 */
export function heuristicPlan(p: SharingProblem, rules: SharingRules, opts: HeuristicOptions = {}): SharingPlan {
  const meter = opts.meter ?? new WorkMeter(HEURISTIC_DEFAULT_WORK);
  let best = directPlan(p);
  const consider = (plan: SharingPlan | null): void => {
    if (plan !== null && comparePlans(plan, best, p) < 0) best = plan;
  };
  const sharing = rules.depthLimit >= 2 && (rules.buses || (rules.links && rules.policy !== "uniform"));
  if (!sharing) return best;

  // Position by position. Under the uniform policy every path of the whole
  // matrix has one length, so each position must go through buses (the
  // all-direct plan is the other choice, and is `best` already). Each
  // position's plan is refined with exact row covers (refine.ts), then their
  // union is refined on the whole problem, where buses may span positions.
  const whole = reduceRows(p);
  const groups = [...new Set(p.group)].sort((a, b) => a - b);
  let positionsDone = false;
  const small = whole.problem.m <= SMALL_OUTPUTS;
  if (!small && groups.length > 1 && (rules.policy !== "uniform" || rules.buses)) {
    const parts: SharingPlan[] = [];
    // Each position gets an even portion of half of what is left; the union's refinement and the whole problem share the rest.
    const positions = meter.portion(2);
    for (const [i, g] of groups.entries()) {
      const r = reduceRows(
        p,
        p.group.flatMap((x, o) => (x === g ? [o] : [])),
      );
      const portion = positions.portion(groups.length - i);
      const part = coreHeuristic(r.problem, rules, portion, rules.policy === "uniform");
      const refined = part === null ? null : refinePlan(r.problem, rules, part, portion, { restarts: true, kickWork: POSITION_KICK_WORK });
      positions.settle(portion);
      if (refined === null) break;
      parts.push(expandPlan(r, refined));
    }
    meter.settle(positions);
    if (parts.length === groups.length) {
      positionsDone = true;
      const union = unionPlans(parts);
      consider(union);
      const portion = meter.portion(2);
      consider(expandPlan(whole, refinePlan(whole.problem, rules, contractPlan(whole, union), portion, { kickWork: UNION_KICK_WORK })));
      meter.settle(portion);
    }
  }
  // The whole problem, identical states merged: after the positions only a
  // greedy where the caller allows one (the exact mode), alone the greedy
  // and its refinement with fresh starts.
  if (positionsDone) {
    const most = opts.wholeAfterPositions ?? WHOLE_AFTER_POSITIONS_WORK;
    if (most > 0) {
      const portion = meter.portion(1, most);
      const plan = coreHeuristic(whole.problem, rules, portion, false);
      meter.settle(portion);
      if (plan !== null) consider(expandPlan(whole, plan));
    }
  } else {
    const plan = coreHeuristic(whole.problem, rules, meter, false);
    if (plan !== null)
      consider(expandPlan(whole, refinePlan(whole.problem, rules, plan, meter, { restarts: true, kickWork: SMALL_KICK_WORK })));
  }
  return best;
}

/**
 * The two nested searches on one problem; null when the meter ran out before
 * any plan (or, with `allShared`, before a plan with every output fed
 * through buses).
 */
function coreHeuristic(p: SharingProblem, rules: SharingRules, meter: WorkMeter, allShared: boolean): SharingPlan | null {
  const maxLevel = Math.max(1, Math.min(rules.depthLimit, rules.buses || rules.links ? 3 : 1));
  const cache = new Map<string, SharingPlan | null>();
  let pool: ShapePool | null = null;
  let evaluations = 0;
  const evaluate = (levels: readonly number[]): SharingPlan | null => {
    const key = levels.join("");
    const hit = cache.get(key);
    if (hit !== undefined) return hit;
    if (meter.spent()) return null;
    evaluations++;
    pool ??= busShapes(p, meter, MAX_SHAPES);
    const plan = coverForLevels(p, rules, levels, pool, meter);
    // A cover the meter cut short is not remembered as "no plan".
    if (plan !== null || !meter.spent()) cache.set(key, plan);
    return plan;
  };
  const better = (a: SharingPlan, b: SharingPlan | null): boolean => b === null || comparePlans(a, b, p) < 0;

  const starts: number[][] = allShared ? [] : [Array(p.m).fill(1)];
  if (rules.policy === "uniform") {
    // One length for every path: all direct, or everything through buses.
    if (maxLevel >= 2 && rules.buses) starts.push(Array(p.m).fill(2));
  } else if (maxLevel >= 2) {
    starts.push(Array(p.m).fill(2));
    // Outputs whose states all light some other output make good link sources.
    starts.push(p.within.map((w) => (w.some(Boolean) ? 1 : 2)));
    if (maxLevel >= 3) starts.push(p.within.map((w) => (w.some(Boolean) ? 1 : 3)));
  }

  // Few outputs: every level assignment is cheap to try, so the climb below
  // only refines from a global best.
  if (rules.policy !== "uniform" && maxLevel >= 2 && Math.pow(maxLevel, p.m) <= EXHAUSTIVE_ASSIGNMENTS) {
    let bestAll: SharingPlan | null = null;
    let bestLevels: number[] | null = null;
    const levels = Array(p.m).fill(1) as number[];
    for (;;) {
      const plan = evaluate(levels);
      if (plan !== null && better(plan, bestAll)) {
        bestAll = plan;
        bestLevels = levels.slice();
      }
      let o = 0;
      while (o < p.m && levels[o] === maxLevel) levels[o++] = 1;
      if (o === p.m || meter.spent()) break;
      levels[o] = (levels[o] ?? 1) + 1;
    }
    if (bestLevels) starts.unshift(bestLevels);
  }

  // Every start first, so that a short budget still ends with the best of them;
  // then the climb from each, best start first.
  const evaluated = starts.flatMap((levels, i) => {
    const plan = evaluate(levels);
    return plan === null ? [] : [{ levels, plan, i }];
  });
  evaluated.sort((a, b) => comparePlans(a.plan, b.plan, p) || a.i - b.i);
  let best: SharingPlan | null = null;
  let bestLevels: readonly number[] = starts[0] ?? [];
  for (const start of evaluated) {
    let levels = start.levels;
    let current = start.plan;
    if (rules.policy !== "uniform" && maxLevel >= 2) {
      // First-improvement hill climb over single-output level changes.
      let improved = true;
      while (improved && evaluations < MAX_EVALUATIONS && !meter.spent()) {
        improved = false;
        for (let o = 0; o < p.m && evaluations < MAX_EVALUATIONS && !meter.spent(); o++) {
          for (let l = 1; l <= maxLevel; l++) {
            if (l === levels[o]) continue;
            const next = levels.slice();
            next[o] = l;
            const plan = evaluate(next);
            if (plan !== null && better(plan, current)) {
              levels = next;
              current = plan;
              improved = true;
            }
          }
        }
      }
    }
    if (better(current, best)) {
      best = current;
      bestLevels = levels;
    }
  }
  if (best === null) return null;

  // Ruin and recreate: forbid one of the chosen bus shapes and cover again;
  // the greedy's first choices are often the ones that lock it in.
  let banned = new Set<string>();
  for (let round = 0; round < RECREATE_ROUNDS && pool !== null && !meter.spent(); round++) {
    let improved = false;
    for (const b of best.buses.slice(0, RECREATE_BUSES)) {
      const tryBan = new Set([...banned, b.outputs.join(",")]);
      const plan = coverForLevels(p, rules, bestLevels, pool, meter, tryBan);
      if (plan !== null && better(plan, best)) {
        best = plan;
        banned = tryBan;
        improved = true;
        break;
      }
    }
    if (!improved) break;
  }
  return best;
}

/**
 * The best greedy cover for one level assignment over the three orders, or
 * null when the levels admit no plan or the meter ran out.
 */
function coverForLevels(
  p: SharingProblem,
  rules: SharingRules,
  levels: readonly number[],
  pool: ShapePool,
  meter: WorkMeter,
  banned: ReadonlySet<string> = new Set(),
): SharingPlan | null {
  // Greedy gains overrate a wide bus against several one-diode links, so try
  // every order and keep the best.
  let best: SharingPlan | null = null;
  for (const order of GREEDY_ORDERS) {
    const plan = greedyCover(p, rules, levels, pool, order, banned, meter);
    if (plan !== null && (best === null || comparePlans(plan, best, p) < 0)) best = plan;
    if (meter.spent()) break;
  }
  return best;
}
