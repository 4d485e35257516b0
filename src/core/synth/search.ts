/**
 * A custom branch-and-bound for the minimum matrix at depth limit 2, used
 * before HiGHS on small instances (few outputs per position), where it proves
 * the optimum far faster than the general MILP.
 *
 * Structure it exploits: at depth 2, once the level-1 outputs (set A) and the
 * shared structures in use are fixed, the cost of one state is independent of
 * every other state. A shared structure ("item") is a bus with output set T
 * (fixed cost |T|, one diode per state that feeds it) or a link a -> b
 * (fixed cost 1, free for the states lighting a). A state covers the lit
 * outputs it has outside A with items whose outputs it lights, direct diodes
 * (mixed policy) or its padding bus (cost 1 plus one per output; under
 * mixed only for a merged row, see below), and the outputs in A with direct
 * diodes. A row that stands for w identical states (reduce.ts) pays w for
 * each direct diode and bus input, and w plus one per output for its padding
 * bus, which all w states feed. That per-state cover
 * is a subset DP over at most 2^m masks.
 *
 * The search fixes items in or out. Its bound charges a fixed-in item's fixed
 * cost once and splits an undecided item's fixed cost F into shares, one per
 * potential user, non-negative and summing to at most F; a state that uses
 * the item pays its share on top of its diode. That is a valid lower bound on
 * every completion: an item used in the completion is used by some of its
 * potential users only, so F >= the sum of their shares; summing the
 * per-state minimum covers under these charges can only be lower still. (It
 * is a Lagrangian bound: the shares are the multipliers of "a state feeds a
 * bus only if the bus exists".) The shares start even (F / |U|) and are
 * moved towards the states that use the item by projected subgradient steps,
 * at each root and at every node; any shares keep the bound valid, so they
 * are never restored on backtracking. When the per-state minima use fixed-in
 * items only, the bound is the cost of a real matrix (fixed-in items and
 * those covers), so the node is solved.
 *
 * Which A are possible: per-segment, every subset of outputs (level 1 takes
 * direct diodes only, level 2 everything else); mixed, the subsets of link
 * sources (a link source must be fed directly, or the path through the link
 * would be three diodes); uniform, only the empty set (the all-bus matrix; the
 * caller weighs it against the direct one). Every depth-2 matrix is a
 * solution of one A's problem with at most its count (one bus per T suffices,
 * see candidates.ts), so the smallest over all A is the optimum.
 *
 * The search stops on a work budget, never on the clock (that is only a safety
 * net), so a run that is cut short is the same every time. Then the bound it
 * reports is the least over what it left unexplored: the branches still open
 * in the level set it stopped in, and the root bounds of those it did not
 * start; each is valid for its part, and with the finished parts they cover
 * every matrix.
 */
import type { CandidateFamily } from "./candidates.ts";
import { planCost, type PlanBus, type PlanLink, type SharingPlan, type SharingProblem, type SharingRules } from "./plan.ts";
import { linkPairs } from "./rules.ts";

/** Most outputs the subset DP handles (2^m masks per state). */
export const SEARCH_MAX_OUTPUTS = 10;

/**
 * Subgradient rounds on the shares at each level set's root, and at every
 * node. Measured on 0-9 and 0-F (all policies): 10 rounds a node cut the
 * nodes from 12275 to 67 on 0-9 uniform and made 0-F provable in under 1 s;
 * more rounds at the root than 50 or at a node than 10 bought nothing.
 */
const ROOT_TUNE_ROUNDS = 50;
const NODE_TUNE_ROUNDS = 10;

export interface SearchOptions {
  /**
   * Most work units, the deterministic stop. A unit is one item looked at in
   * the per-state DP, which is where the time goes (root tuning included),
   * so the budget tracks time far better than a node count does.
   */
  readonly maxWork: number;
  /**
   * Safety net only: a `Date.now()` value after which the search stops as if
   * the work budget had run out. Set it well past the time the work budget
   * normally takes, so that it never decides an ordinary run.
   */
  readonly deadlineMs?: number;
}

export interface SearchOutcome {
  /** The best plan found, or null when none beat `upper`. */
  readonly plan: SharingPlan | null;
  /** Proven lower bound on every depth-2 matrix of this kind (for uniform: every all-bus matrix). */
  readonly lowerBound: number;
  /** True when the search finished: the optimum is `plan`, or `upper` if plan is null. */
  readonly proven: boolean;
  /** True when the safety-net clock, not the work budget, stopped the search. */
  readonly deadlineHit: boolean;
  /** Nodes and work units used, for the bench and for calibrating budgets. */
  readonly nodes: number;
  readonly work: number;
}

interface Item {
  /** Outputs covered, as a bit mask. */
  readonly mask: number;
  /** Cost paid once when the item exists. */
  readonly fixed: number;
  /** Cost per state using it. */
  readonly per: number;
  /** States that may use it, ascending. */
  readonly users: readonly number[];
  /** The link, or null for a bus. */
  readonly link: PlanLink | null;
}

/** Per state: the chosen items, direct outputs and padding outputs of its cover. */
interface StateCover {
  readonly items: readonly number[];
  readonly direct: number;
  readonly pad: number;
}

/**
 * Whether the search applies: depth limit 2, a complete family, few outputs.
 * (Depth 3 needs chains the per-state cover does not model.)
 */
export function searchApplies(p: SharingProblem, rules: SharingRules, family: CandidateFamily): boolean {
  return rules.depthLimit === 2 && family.complete && p.m <= SEARCH_MAX_OUTPUTS;
}

/**
 * Finds a plan with fewer diodes than `upper` (the warm start's count), or
 * proves there is none. Deterministic: the same input gives the same nodes
 * in the same order.
 */
export function searchPlan(
  p: SharingProblem,
  rules: SharingRules,
  family: CandidateFamily,
  upper: number,
  opts: SearchOptions,
): SearchOutcome {
  const m = p.m;
  const full = (1 << m) - 1;
  const mixed = rules.policy === "mixed";
  const uniform = rules.policy === "uniform";
  // Padding buses (one row's own bus): under per-segment and uniform for every row; under mixed
  // only a merged row (weight 2 or more) can gain from one, over direct diodes.
  const pads = rules.buses;
  const rowMask = p.row.map((r) => r.reduce((a, o) => a | (1 << o), 0));

  // The level sets A to search.
  const sets: number[] = [];
  if (uniform) sets.push(0);
  else if (mixed) {
    let sources = 0;
    for (const l of linkPairs(p, rules)) sources |= 1 << l.from;
    for (let s = sources; ; s = (s - 1) & sources) {
      sets.push(s);
      if (s === 0) break;
    }
  } else for (let s = 0; s <= full; s++) sets.push(s);

  let best = upper;
  let bestPlan: SharingPlan | null = null;
  const meter: Meter = { work: 0, nodes: 0, maxWork: opts.maxWork, deadlineMs: opts.deadlineMs ?? Infinity, deadlineHit: false };
  const roots: { set: number; bound: number; ctx: Context }[] = [];
  for (const set of sets) {
    const ctx = new Context(p, itemsFor(p, rules, family, set), rowMask, set, mixed, pads, meter);
    // Any shares give a valid bound, so tuning may stop anywhere when the budget runs out.
    if (ceilBound(ctx.bound()) < best) ctx.tune(best, ROOT_TUNE_ROUNDS);
    roots.push({ set, bound: ctx.bound(), ctx });
  }
  roots.sort((a, b) => a.bound - b.bound || a.set - b.set);

  let unfinished = Infinity;
  for (let r = 0; r < roots.length; r++) {
    const root = roots[r] as (typeof roots)[number];
    if (ceilBound(root.bound) >= best) break;
    const done = root.ctx.run(
      () => best,
      (count, plan) => {
        best = count;
        bestPlan = plan;
      },
    );
    if (!done) {
      // The roots are sorted by bound, so the next one's is the least of those not started.
      unfinished = Math.min(Math.max(root.bound, root.ctx.openBound), roots[r + 1]?.bound ?? Infinity);
      break;
    }
  }
  const proven = unfinished === Infinity;
  const lowerBound = proven ? best : Math.min(best, ceilBound(unfinished));
  return { plan: bestPlan, lowerBound, proven, deadlineHit: meter.deadlineHit, nodes: meter.nodes, work: meter.work };
}

/** Work done across the level sets of one search, and its limits. */
interface Meter {
  work: number;
  nodes: number;
  readonly maxWork: number;
  readonly deadlineMs: number;
  /** Set when the clock stopped the search before the work budget did. */
  deadlineHit: boolean;
}

/** Whole-number lower bound from a fractional one (diode counts are whole). */
function ceilBound(x: number): number {
  return Math.ceil(x - 1e-7);
}

/** The shared structures allowed with level-1 set `set`. */
function itemsFor(p: SharingProblem, rules: SharingRules, family: CandidateFamily, set: number): Item[] {
  const items: Item[] = [];
  if (rules.buses) {
    family.buses.forEach((b) => {
      const mask = b.outputs.reduce((a, o) => a | (1 << o), 0);
      if ((mask & set) !== 0 || b.states.length < 2) return;
      items.push({ mask, fixed: b.outputs.length, per: 1, users: b.states, link: null });
    });
  }
  // A link runs from a level-1 output (in the set) into a level-2 one (outside it).
  for (const l of linkPairs(p, rules)) {
    if (((set >> l.from) & 1) === 0 || ((set >> l.to) & 1) !== 0) continue;
    items.push({ mask: 1 << l.to, fixed: 1, per: 0, users: p.col[l.from] ?? [], link: l });
  }
  return items;
}

const UNDECIDED = 0;
const IN = 1;
const OUT = 2;

/** One level set's search state: item decisions, per-state shares and cover values. */
class Context {
  private readonly state: Uint8Array;
  /** Per state, the items it may use, and its share of each one's fixed cost (the bound's charge). */
  private readonly byState: Int32Array[];
  /** Per item and user (in `users` order): where the item sits in that state's list. */
  private readonly slot: readonly (readonly number[])[];
  /** Per item: state -> its place in `users`. */
  private readonly userIndex: readonly Map<number, number>[];
  private readonly share: Float64Array[];
  /** Per state, the charge of each of its items under the current decisions (scratch for the DP). */
  private readonly cost: Float64Array[];
  private readonly value: Float64Array;
  private readonly covers: StateCover[];
  private fixedIn = 0;
  private readonly memo: Float64Array;
  private readonly memoPad: Float64Array;
  private readonly stamp: Uint32Array;
  private readonly stampPad: Uint32Array;
  private tick = 0;
  private current = 0;
  /** Cost of a direct diode for the row being covered (its weight). */
  private directCost = 1;

  constructor(
    private readonly p: SharingProblem,
    private readonly items: readonly Item[],
    private readonly rowMask: readonly number[],
    private readonly set: number,
    private readonly mixed: boolean,
    private readonly pads: boolean,
    private readonly meter: Meter,
  ) {
    this.state = new Uint8Array(items.length);
    const lists: number[][] = Array.from({ length: p.n }, () => []);
    items.forEach((it, i) => {
      for (const k of it.users) lists[k]?.push(i);
    });
    this.byState = lists.map((l) => Int32Array.from(l));
    this.slot = items.map((it, i) => it.users.map((k) => (lists[k] as number[]).indexOf(i)));
    this.userIndex = items.map((it) => new Map(it.users.map((k, u) => [k, u])));
    // Start from the even split: F / |U| for every potential user.
    this.share = lists.map((l) => Float64Array.from(l, (i) => (items[i]?.fixed ?? 0) / Math.max(1, items[i]?.users.length ?? 1)));
    this.cost = lists.map((l) => new Float64Array(l.length));
    const size = 1 << p.m;
    this.memo = new Float64Array(size);
    this.memoPad = new Float64Array(size);
    this.stamp = new Uint32Array(size);
    this.stampPad = new Uint32Array(size);
    this.value = new Float64Array(p.n);
    this.covers = Array.from({ length: p.n }, () => ({ items: [], direct: 0, pad: 0 }));
    for (let k = 0; k < p.n; k++) this.refresh(k);
  }

  /** The current lower bound. */
  bound(): number {
    let b = this.fixedIn;
    for (let k = 0; k < this.p.n; k++) b += this.value[k] ?? 0;
    return b;
  }

  /**
   * Raises the root bound by moving each item's fixed cost between its
   * potential users (projected subgradient on the shares). Any shares that
   * are non-negative and sum to at most the fixed cost keep the bound valid
   * (see the file comment), so this only changes how good it is.
   */
  tune(upper: number, rounds: number): void {
    const n = this.p.n;
    let best = this.bound();
    let bestShare = this.share.map((s) => s.slice());
    let theta = 1;
    let stall = 0;
    const pos = this.slot;
    for (let round = 0; round < rounds && !this.spent(); round++) {
      const used: boolean[][] = this.items.map((it) => it.users.map(() => false));
      let norm = 0;
      for (let k = 0; k < n; k++) {
        for (const i of (this.covers[k] as StateCover).items) {
          const u = (this.userIndex[i] as Map<number, number>).get(k) ?? 0;
          (used[i] as boolean[])[u] = true;
          norm++;
        }
      }
      if (norm === 0) break;
      const step = (theta * Math.max(0.5, upper - best)) / norm;
      this.items.forEach((it, i) => {
        if (it.fixed === 0) return;
        const v = it.users.map((k, u) => (this.share[k] as Float64Array)[(pos[i] as number[])[u] as number] ?? 0);
        const g = used[i] as boolean[];
        for (let u = 0; u < v.length; u++) v[u] = (v[u] ?? 0) + (g[u] ? step : 0);
        const proj = cappedSimplex(v, it.fixed);
        it.users.forEach((k, u) => {
          (this.share[k] as Float64Array)[(pos[i] as number[])[u] as number] = proj[u] ?? 0;
        });
      });
      for (let k = 0; k < n; k++) this.refresh(k);
      const b = this.bound();
      if (b > best + 1e-9) {
        best = b;
        bestShare = this.share.map((s) => s.slice());
        stall = 0;
      } else if (++stall >= 3) {
        theta /= 2;
        stall = 0;
      }
      if (ceilBound(best) >= upper) break;
    }
    bestShare.forEach((s, k) => (this.share[k] as Float64Array).set(s));
    for (let k = 0; k < n; k++) this.refresh(k);
  }

  /**
   * After a `run` cut short: the least bound over the parts of the tree it
   * left unexplored (the node it stopped at and every "out" branch it had
   * not started), so a valid bound for all of them.
   */
  openBound = Infinity;

  /**
   * Depth-first search for plans below `best()`. Returns false when the work
   * budget ran out first (see `openBound`).
   */
  run(best: () => number, improve: (count: number, plan: SharingPlan) => void): boolean {
    this.openBound = Infinity;
    const dfs = (): boolean => {
      if (this.spent()) {
        this.openBound = Math.min(this.openBound, this.bound());
        return false;
      }
      this.meter.nodes++;
      let bound = this.bound();
      if (ceilBound(bound) >= best()) return true;
      // Shares tuned here stay valid everywhere (they never depend on the decisions), so nothing is restored on the way back.
      this.tune(best(), NODE_TUNE_ROUNDS);
      bound = this.bound();
      if (ceilBound(bound) >= best()) return true;
      const pick = this.branchItem();
      if (pick < 0) {
        // Only fixed-in items in use: the bound is a real matrix.
        const plan = this.plan();
        const count = planCost(this.p, plan);
        if (count < best()) improve(count, plan);
        return true;
      }
      this.decide(pick, IN);
      const a = dfs();
      this.decide(pick, OUT);
      // Cut short in the "in" branch: the whole "out" branch is left open, and its bound holds for it.
      if (!a) this.openBound = Math.min(this.openBound, this.bound());
      const b = a && dfs();
      this.decide(pick, UNDECIDED);
      return a && b;
    };
    return dfs();
  }

  /** True when the budget, or the safety-net clock, has run out. */
  private spent(): boolean {
    const m = this.meter;
    if (m.work >= m.maxWork) return true;
    if (m.deadlineMs !== Infinity && Date.now() > m.deadlineMs) m.deadlineHit = true;
    return m.deadlineHit;
  }

  /** The undecided item that carries the most fixed cost in the minimum covers, or -1. */
  private branchItem(): number {
    const uses = new Map<number, number>();
    for (const c of this.covers) {
      for (const i of c.items) if (this.state[i] === UNDECIDED) uses.set(i, (uses.get(i) ?? 0) + 1);
    }
    let pick = -1;
    let most = 0;
    for (const [i, u] of uses) {
      const w = u * (this.items[i]?.fixed ?? 0);
      if (w > most || (w === most && i < pick)) {
        most = w;
        pick = i;
      }
    }
    return pick;
  }

  private decide(i: number, to: number): void {
    const it = this.items[i] as Item;
    if (this.state[i] === IN) this.fixedIn -= it.fixed;
    if (to === IN) this.fixedIn += it.fixed;
    this.state[i] = to;
    for (const k of it.users) this.refresh(k);
  }

  /** Recomputes state k's minimum cover under the current decisions and shares. */
  private refresh(k: number): void {
    const list = this.byState[k] as Int32Array;
    const share = this.share[k] as Float64Array;
    const cost = this.cost[k] as Float64Array;
    const w = this.p.weight[k] ?? 1;
    for (let j = 0; j < list.length; j++) {
      const i = list[j] as number;
      const st = this.state[i];
      const it = this.items[i] as Item;
      cost[j] = st === IN ? it.per * w : st === OUT ? Infinity : it.per * w + (share[j] ?? 0);
    }
    const c = this.coverState(k);
    this.value[k] = c.cost;
    this.covers[k] = c.cover;
  }

  /**
   * Minimum cover of state k under the charges in `cost[k]`. A row standing
   * for w states (see reduce.ts) pays w for each direct diode and bus input,
   * and w plus one per output for its padding bus.
   */
  private coverState(k: number): { cost: number; cover: StateCover } {
    const lit = this.rowMask[k] ?? 0;
    const direct = lit & this.set;
    const work = lit & ~this.set;
    const w = this.p.weight[k] ?? 1;
    const base = popcount(direct) * w;
    if (work === 0) return { cost: base, cover: { items: [], direct, pad: 0 } };
    this.tick++;
    this.current = k;
    this.directCost = w;
    const list = this.byState[k] as Int32Array;
    const charge = this.cost[k] as Float64Array;
    const noPad = this.dp(work, false);
    let cost = noPad;
    let usePad = false;
    if (this.pads && (!this.mixed || w >= 2)) {
      const withPad = w + this.dp(work, true);
      if (withPad < cost) {
        cost = withPad;
        usePad = true;
      }
    }
    // Per-segment without buses: a level-2 output no link reaches leaves this level set infeasible.
    if (cost === Infinity) return { cost, cover: { items: [], direct, pad: 0 } };
    // Walk the memo back to the choices.
    const memo = usePad ? this.memoPad : this.memo;
    const after = (x: number): number => (x === 0 ? 0 : (memo[x] ?? 0));
    const used: number[] = [];
    let dmask = direct;
    let pmask = 0;
    let mask = work;
    while (mask !== 0) {
      const bit = mask & -mask;
      const target = memo[mask] ?? 0;
      const rest = mask & ~bit;
      if ((this.mixed || usePad) && near((usePad ? 1 : w) + after(rest), target)) {
        if (usePad) pmask |= bit;
        else dmask |= bit;
        mask = rest;
        continue;
      }
      let found = false;
      for (let j = 0; j < list.length; j++) {
        const im = this.items[list[j] as number]?.mask ?? 0;
        if ((im & bit) === 0) continue;
        const r2 = mask & ~im;
        if (near((charge[j] ?? 0) + after(r2), target)) {
          used.push(list[j] as number);
          mask = r2;
          found = true;
          break;
        }
      }
      if (!found) throw new Error("search: cover walk-back failed");
    }
    return { cost: cost + base, cover: { items: used, direct: dmask, pad: pmask } };
  }

  /**
   * Least cost to cover `mask` (at least) with the current state's items,
   * plus direct diodes (mixed) or padding outputs (`pad`) at 1 each.
   * Memoised per state through `tick`. Every item of a state lies inside its
   * lit outputs outside A (see itemsFor), so it never reaches an unlit cell.
   */
  private dp(mask: number, pad: boolean): number {
    if (mask === 0) return 0;
    const memo = pad ? this.memoPad : this.memo;
    const stamp = pad ? this.stampPad : this.stamp;
    if (stamp[mask] === this.tick) return memo[mask] ?? Infinity;
    const bit = mask & -mask;
    // A padding-bus output costs one diode; a direct one (mixed) one per state the row stands for.
    let best = this.mixed || pad ? (pad ? 1 : this.directCost) + this.dp(mask & ~bit, pad) : Infinity;
    const list = this.byState[this.current] as Int32Array;
    const charge = this.cost[this.current] as Float64Array;
    this.meter.work += list.length;
    for (let j = 0; j < list.length; j++) {
      const c0 = charge[j] ?? Infinity;
      if (c0 === Infinity || c0 >= best) continue;
      const im = this.items[list[j] as number]?.mask ?? 0;
      if ((im & bit) === 0) continue;
      const c = c0 + this.dp(mask & ~im, pad);
      if (c < best) best = c;
    }
    memo[mask] = best;
    stamp[mask] = this.tick;
    return best;
  }

  /** The matrix of the current covers; call only when they use fixed-in items only. */
  private plan(): SharingPlan {
    const direct: [number, number][] = [];
    const users = new Map<number, number[]>();
    const padBuses: PlanBus[] = [];
    for (let k = 0; k < this.p.n; k++) {
      const c = this.covers[k] as StateCover;
      for (let o = 0; o < this.p.m; o++) if ((c.direct >> o) & 1) direct.push([k, o]);
      for (const i of c.items) {
        let u = users.get(i);
        if (!u) users.set(i, (u = []));
        u.push(k);
      }
      if (c.pad !== 0) padBuses.push({ states: [k], outputs: bits(c.pad, this.p.m) });
    }
    const buses: PlanBus[] = [];
    const links: PlanLink[] = [];
    for (const [i, u] of [...users.entries()].sort((a, b) => a[0] - b[0])) {
      const it = this.items[i] as Item;
      if (it.link) links.push(it.link);
      else buses.push({ states: u, outputs: bits(it.mask, this.p.m) });
    }
    return { direct, buses: [...buses, ...padBuses], links };
  }
}

/** Euclidean projection of v onto { x >= 0, sum x <= cap }. */
function cappedSimplex(v: readonly number[], cap: number): number[] {
  const pos = v.map((x) => Math.max(0, x));
  if (pos.reduce((a, x) => a + x, 0) <= cap) return pos;
  const sorted = [...v].sort((a, b) => b - a);
  let sum = 0;
  let tau = 0;
  for (let i = 0; i < sorted.length; i++) {
    sum += sorted[i] ?? 0;
    const t = (sum - cap) / (i + 1);
    if ((sorted[i] ?? 0) - t > 0) tau = t;
  }
  return v.map((x) => Math.max(0, x - tau));
}

function near(a: number, b: number): boolean {
  return Math.abs(a - b) < 1e-9;
}

function popcount(x: number): number {
  let c = 0;
  for (let v = x; v !== 0; v &= v - 1) c++;
  return c;
}

function bits(mask: number, m: number): number[] {
  const out: number[] = [];
  for (let o = 0; o < m; o++) if ((mask >> o) & 1) out.push(o);
  return out;
}
