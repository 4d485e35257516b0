/**
 * The per-segment policy's bound for counters with many outputs: the
 * Lagrangian bound of lagrangeBound.ts, branched on each output's level.
 *
 * Under per-segment every output has one path length in every state: at
 * level 1 only direct diodes feed it (and it may be a link source), at level
 * 2 only buses and links from level-1 outputs do. The plain relaxation lets
 * each row choose per output, as under mixed, so on 00-23 it gives the same
 * 82 for both policies although per-segment matrices need 89 where mixed
 * ones need 85. Deciding levels closes much of that: the relaxation with a
 * level fixed keeps only the structures that level allows, so it is valid
 * for every matrix with that level, and the least bound over a set of
 * partial level assignments that covers every assignment is valid for all.
 *
 * The search. After the root (the plain bound, with its whole budget),
 * each output is probed at level 1 from the root's shares; where that
 * reaches the best known count, no better matrix has the output at level 1,
 * so it goes to level 2 (on 00-23 nine of thirteen outputs do: a segment lit
 * in many states costs a diode per state at level 1). Then best first: the
 * open node of least bound is split on its first undecided output (the one
 * whose probe came nearest the count first), each child warm-started from
 * its parent's shares and step and never below its parent (it has fewer
 * choices); a leaf (every output decided) gets more rounds while they raise
 * it. The bound is the least over the open nodes when the work runs out (the
 * root's unspent budget and `branchWork`) or the least node stops rising,
 * and the count where every node reached it. Only a root that levelled off
 * inside its budget is branched: one the budget cut short stands as it is
 * (it would gain more from its own rounds; measured on 00-99, where a root
 * at half its budget and the branching gave 270 against its 272). Measured
 * (boundBench.ts, per-segment, bench limits): 00-23 82 -> 84; 00-59 and
 * 00-99 not branched (their roots use their whole budgets), 186 and 273
 * with the budget-scaled halving (`rootStall`).
 */
import type { SharingProblem, SharingRules } from "./plan.ts";
import { lagrangeBound, stallRounds, type LagrangeBound, type LagrangeOptions } from "./lagrangeBound.ts";

/**
 * A node's rounds come in stages of this many, at most `STAGES` of them; it
 * goes on to its next stage only while the last one raised it and it is
 * within `NEAR` diodes of the count (a leaf: while it rises, `LEAF_STALE`
 * stale runs at most). A child starts from its parent's shares and step, the
 * step at least `THETA_FLOOR`. Tuned on 00-23 and 00-59 per-segment.
 */
const STAGE_ROUNDS = 40;
const STAGES = 5;
const NEAR = 3;
const LEAF_STALE = 3;
const THETA_FLOOR = 0.5;
/**
 * Rounds without a gain before the step halves in every node: the fixed
 * rule the branching was tuned with. The root takes it too where its budget
 * pays for `LEVEL_OFF_ROUNDS` rounds or more, so that it levels off with
 * work left for the branching (on 00-23 after 785 of 1424 rounds; with the
 * budget-scaled halving of lagrangeBound.ts it rises to the end, 83 with
 * the branching against 84). A root that cannot afford them takes the
 * budget-scaled halving (00-59 and 00-99 at 760 and 768 rounds: 185 -> 186
 * and 272 -> 273) and is not branched.
 */
const STALL = 8;
const LEVEL_OFF_ROUNDS = 1000;
const rootStall = (affordable: number): number => (affordable >= LEVEL_OFF_ROUNDS ? STALL : stallRounds(affordable));

/**
 * The Lagrangian bound (`opts.maxWork` for its root); under per-segment,
 * branched on the outputs' levels with `branchWork` more. Same options and
 * result as `lagrangeBound` (`levels` and `warm` are set here); never below
 * the plain bound, and deterministic for given budgets.
 *
 * @example
 * levelBound(reduceRows(p).problem, rules, { maxWork: 1.28e9, upper: 89 }, 6.4e8).bound; // 84 on 00-23 per-segment (82 plain)
 */
export function levelBound(
  p: SharingProblem,
  rules: Pick<SharingRules, "policy" | "buses" | "links">,
  opts: LagrangeOptions,
  branchWork: number,
): LagrangeBound {
  // The root is the plain bound with its whole budget, so branching only ever adds to it.
  const root = lagrangeBound(p, rules, rules.policy === "per-segment" ? { ...opts, stall: rootStall } : opts);
  if (rules.policy !== "per-segment") return root;
  let work = root.work;
  let deadlineHit = root.deadlineHit;
  let rounds = root.rounds;
  // Branching pays only once the plain bound has levelled off: a root the budget cut short (00-59, 00-99
  // at their bench limits) would gain more from its own rounds, so it stands, at no extra work.
  if (root.bound === null || root.bound >= opts.upper || root.work >= opts.maxWork || root.deadlineHit) return root;
  const left = (): number => opts.maxWork + branchWork - work;
  /** The bound with `levels` decided, from `warm`: a short run, continued while it nears the count. */
  const evaluate = (
    levels: readonly number[],
    warm: LagrangeBound["shares"],
    floor: number,
    warmTheta: number,
    leaf = false,
  ): Node | null => {
    let shares = warm;
    // A child starts from its parent's step, not below the floor (its optimum moved); a leaf run goes on from its own.
    let theta = leaf ? warmTheta : Math.max(warmTheta, THETA_FLOOR);
    let bound = floor;
    for (let stage = 0; stage < STAGES; stage++) {
      if (left() <= 0) return null;
      const r = lagrangeBound(p, rules, { ...opts, maxWork: left(), maxRounds: STAGE_ROUNDS, levels, warm: shares, theta, stall: STALL });
      work += r.work;
      rounds += r.rounds;
      deadlineHit ||= r.deadlineHit;
      // A run the budget cut before one full round tells nothing.
      if (r.bound === null) return stage === 0 ? null : { levels, bound, shares, theta, stale: 0 };
      // A child is at least its parent: it has fewer choices.
      const gained = r.bound > bound;
      bound = Math.max(bound, r.bound);
      shares = r.shares;
      theta = r.theta ?? theta;
      if (bound >= opts.upper || (!leaf && bound < opts.upper - NEAR) || (!gained && stage > 0)) break;
    }
    return { levels, bound, shares, theta, stale: 0 };
  };
  const done = (bound: number): LagrangeBound => ({ bound: Math.min(bound, opts.upper), rounds, work, deadlineHit, shares: root.shares });

  // Probes: each output at level 1, from the root (level 1 is the one that rules out: a segment lit in many
  // states costs a diode per state there; probing level 2 too ruled out none on 00-23).
  const decided = Array<number>(p.m).fill(0);
  const probe = Array<number>(p.m).fill(root.bound);
  for (let o = 0; o < p.m; o++) {
    const trial = decided.slice();
    trial[o] = 1;
    const one = evaluate(trial, root.shares, root.bound, root.theta ?? 2)?.bound ?? null;
    if (one === null) return done(root.bound);
    if (one >= opts.upper) decided[o] = 2;
    else probe[o] = one;
  }
  // The open outputs, the one whose probe came nearest the count first.
  const open = decided.flatMap((l, o) => (l === 0 ? [o] : [])).sort((a, b) => (probe[b] as number) - (probe[a] as number) || a - b);

  // Best first: the open node of least bound is split on its first undecided output; the least bound among
  // the open nodes is the bound (every assignment lies under one of them).
  const first = evaluate(decided, root.shares, root.bound, root.theta ?? 2);
  if (first === null) return done(root.bound);
  const queue: Node[] = [first];
  for (;;) {
    queue.sort((a, b) => a.bound - b.bound);
    const node = queue[0] as Node;
    if (node.bound >= opts.upper || left() <= 0) return done(node.bound);
    const o = open.find((x) => node.levels[x] === 0);
    if (o === undefined) {
      // A leaf: more rounds, while they raise it.
      const more = evaluate(node.levels, node.shares, node.bound, node.theta, true);
      if (more === null || (more.bound <= node.bound && node.stale + 1 >= LEAF_STALE)) return done(node.bound);
      queue[0] = { ...more, stale: more.bound > node.bound ? 0 : node.stale + 1 };
      continue;
    }
    queue.shift();
    for (const level of [2, 1]) {
      const next = node.levels.slice();
      next[o] = level;
      const child = evaluate(next, node.shares, node.bound, node.theta);
      if (child === null) return done(Math.min(node.bound, ...queue.map((q) => q.bound)));
      if (child.bound < opts.upper) queue.push(child);
    }
    if (queue.length === 0) return done(opts.upper);
  }
}

interface Node {
  readonly levels: readonly number[];
  readonly bound: number;
  readonly shares: LagrangeBound["shares"];
  readonly theta: number;
  /** Runs in a row that did not raise a leaf. */
  readonly stale: number;
}
