/**
 * The work budgets of one synthesis run, computed from the configured time
 * limit alone, never from the time left on the clock: so the same settings
 * stop every phase at the same point on an idle machine and a busy one, on
 * the command line and in the web app. The clock is only the deadline, a
 * safety net (see workMeter.ts); a run it cuts says so (`deadlineHit`).
 *
 * Each phase's budget is its share of the limit times the rate of its work
 * units per CPU millisecond, measured with `process.cpuUsage` (which other
 * processes' load leaves alone) at the slowest, cold rate seen on this
 * 2-core machine. The shares of the phases one run can go through add up to
 * 0.3 (heuristic, family, search, HiGHS; or heuristic, family and, where
 * the Lagrangian bound is out of reach, the LP bound), so a run normally
 * ends on its budgets at about a third of the limit, and still does on a
 * machine loaded three times over. The Lagrangian bound's share is 0.4
 * (0.5 in all on its path) because its rate is set well below the rates
 * measured (at that share its CPU time came to 0.13 to 0.26 of the limit
 * on the two-position counters, on a machine loaded six times over), and
 * every round it gets raises the bound (0.3 -> 0.4: 00-59 184 -> 185,
 * uniform 186 -> 187; 00-99 270 -> 272). Under per-segment, where its root
 * levels off inside its budget, it branches on the outputs' levels with what
 * is left and 0.2 more (levelBound.ts; 00-23 82 -> 84).
 */

/** Deterministic work limits of one run. */
export interface WorkBudget {
  /** Heuristic work: cells looked at (heuristic.ts, greedyCover.ts). */
  readonly heuristicWork: number;
  /** Candidate-family enumeration: states looked at (candidates.ts). */
  readonly familyWork: number;
  /** Branch-and-bound work units (search.ts). */
  readonly searchWork: number;
  /** LP-bound work: nonzeros solved and states priced (bounds.ts). */
  readonly lpWork: number;
  /** Lagrangian-bound work: steps of the rows' cover DP (lagrangeBound.ts). */
  readonly lagrangeWork: number;
  /** More of the same, for branching on the outputs' levels under per-segment (levelBound.ts). */
  readonly levelWork: number;
  /** HiGHS `mip_max_nodes`. */
  readonly highsNodes: number;
  /**
   * HiGHS LP iterations (over the whole MIP solve) times the model's columns:
   * it tracks time even at the root, where no node is counted. HiGHS stops
   * at the first interrupt checkpoint past it.
   */
  readonly highsWork: number;
}

/** Share of the time limit each phase's budget is planned to take. */
const SHARE = { heuristic: 0.05, family: 0.05, search: 0.1, lp: 0.2, lagrange: 0.4, level: 0.2, highs: 0.1 } as const;

/**
 * Heuristic cells looked at per CPU millisecond: about 20 000 on the largest
 * projects (256 states on 8 positions), more on small ones.
 */
const HEURISTIC_RATE = 20_000;
/** Candidate-family work (states looked at per output set visited) per CPU millisecond. */
const FAMILY_RATE = 50_000;
/**
 * Search work units per CPU millisecond. A whole search in a fresh process
 * (cold JIT included) ran 64 000 (1-12 per-segment) to 92 000 (0-F
 * per-segment) a millisecond, warm runs up to 120 000; tiny searches run
 * slower (20 000 on 0-9 mixed, 4 million units in 0.2 s) but end at once.
 */
const SEARCH_RATE = 60_000;
/**
 * LP-bound work per CPU millisecond: 360 to 400 nonzeros on 00-23 and 00-59,
 * 232 on 00-99, 139 on 00-99 uniform (bigger LPs cost more a nonzero).
 * Loading HiGHS costs about 1 s more on a first run.
 */
const LP_RATE = 140;
/**
 * Lagrangian-bound work (cover DP steps) per CPU millisecond: 390 000 to
 * 590 000 measured over whole bounds on 00-23 (cold, in a fresh process),
 * 00-59 and 00-99 on a machine loaded 8 times over (the DP runs as one
 * top-level function over typed arrays), so a cold run is taken below the
 * lower end.
 */
const LAGRANGE_RATE = 320_000;
/**
 * HiGHS work (LP iterations times model columns) per millisecond: 5 200 to
 * 12 200 over whole solves on 0-F, 1-12 and 00-23, but only 3 200 in the
 * first 5 s on 00-23, whose root spends long stretches on other work.
 * HiGHS looks at its interrupt checkpoint only every so often (gaps of up to
 * 4 s measured on 0-F at depth 3), so its phase is the one most likely to
 * meet the deadline; then the result says so.
 */
const HIGHS_RATE = 5_000;
/** HiGHS branch-and-bound nodes per millisecond (measured 10 to 35 ms a node on 0-F, after a root of 1 to 7 s). */
const HIGHS_NODE_RATE = 1 / 35;

/**
 * The budgets for a configured time limit (milliseconds).
 *
 * @example
 * workBudget(20_000).searchWork; // 120 000 000
 */
export function workBudget(timeLimitMs: number): WorkBudget {
  const of = (share: number, rate: number, least: number): number => Math.max(least, Math.floor(timeLimitMs * share * rate));
  return {
    heuristicWork: of(SHARE.heuristic, HEURISTIC_RATE, 1e5),
    familyWork: of(SHARE.family, FAMILY_RATE, 1e5),
    searchWork: of(SHARE.search, SEARCH_RATE, 1e5),
    lpWork: of(SHARE.lp, LP_RATE, 1e4),
    lagrangeWork: of(SHARE.lagrange, LAGRANGE_RATE, 1e6),
    levelWork: of(SHARE.level, LAGRANGE_RATE, 1e6),
    highsNodes: of(SHARE.highs, HIGHS_NODE_RATE, 20),
    highsWork: of(SHARE.highs, HIGHS_RATE, 1e5),
  };
}

/**
 * Room left after the deadline for decoding, tie-breaks and the verifier,
 * so that the whole run ends inside the caller's limit: 5 %, at most 0.5 s.
 */
export function deadlineMarginMs(timeLimitMs: number): number {
  return Math.min(500, timeLimitMs * 0.05);
}
