/**
 * A lower bound for counters with many outputs (two seven-segment positions
 * and more), valid at depth limit 2 under every policy: the per-state
 * Lagrangian bound of search.ts, without its level sets and with each
 * state's cover found by a subset DP over that state's own lit outputs.
 *
 * The relaxed problem. Every lit cell is covered by a direct diode (not
 * under uniform, see below), a link a -> b (where every state lighting a
 * lights b; fixed cost 1, free for the states lighting a, and a row that
 * uses it lights a by a direct diode: a link source sits at level 1, which
 * only direct diodes feed, under mixed and per-segment alike), a bus with
 * output set T (fixed cost |T|, and w for each row of weight w that feeds
 * it; only T lit by two or more rows, see candidates.ts: one bus per T
 * suffices) or a row's own padding bus (w plus one per output). Levels are
 * dropped: any depth-2 matrix of any policy is a solution of it at no more
 * diodes (its buses fed by one row are padding buses; two buses with one T
 * pay |T| once here), so its optimum is a lower bound. The link rule holds
 * row by row only (whichever rows use a link, a row lighting its source
 * without using the link may light the source otherwise). Under uniform the
 * exact stage weighs the all-bus matrix against the direct one (see
 * exact.ts), so there the relaxation takes no direct diodes and no links
 * and the caller takes the smaller of this bound and the direct count.
 *
 * The Lagrangian. A structure's fixed cost F is split into shares, one per
 * row that may use it, non-negative and summing to at most F; each row then
 * pays its cheapest cover with a structure costing its own charge plus its
 * share. The sum of those covers is at most the relaxation's optimum for
 * any shares (relax "a row uses a structure only if it exists", with the
 * shares as multipliers: the structure's own term F - sum of shares is then
 * at least 0), so every sum the search computes is a valid bound, however
 * far the tuning got; the shares are tuned by projected subgradient steps
 * towards the rows that use each structure. Because each row's cover is
 * solved in whole numbers, the bound is at least the covering LP's (the
 * Lagrangian dual of a problem whose subproblems are integral is at least
 * its LP relaxation; see docs/synthesis-method.md).
 *
 * A row's cover: over the subsets of its r lit outputs, the cheapest single
 * structure lighting at least each subset (a superset closure, r 2^r), then
 * the cheapest cover of each subset by one structure holding its lowest
 * output plus the cover of the rest (3^r / 2 steps). A link enters a row's
 * cover only in a star: the source's direct diode with a subset of the
 * links out of it, priced as one structure (2^t subsets for t links out of
 * one source), which keeps the link rule exact in the row. Rows of more than
 * `LAGRANGE_MAX_ROW_OUTPUTS` lit outputs are out of reach (the bound is
 * null).
 */
import type { SharingProblem, SharingRules } from "./plan.ts";
import { WorkMeter } from "./workMeter.ts";

/** Most lit outputs of one row the cover DP takes (3^r / 2 steps a row and round). */
export const LAGRANGE_MAX_ROW_OUTPUTS = 16;
/** Most structures (bus output sets) the bound enumerates; past it, no bound. */
const MAX_ITEMS = 200_000;
/** Most (structure, row) pairs, each holding a share (8 bytes): keeps the memory near 10 MB. On 00-99: 197 000. */
const MAX_PAIRS = 1_200_000;

export interface LagrangeOptions {
  /** The deterministic stop: DP steps over all rounds (one unit a step). */
  readonly maxWork: number;
  /** Safety net only: a `Date.now()` value past which no round starts. */
  readonly deadlineMs?: number;
  /** The best known count (the heuristic's): the step size aims at it, and the rounds stop when the bound reaches it. */
  readonly upper: number;
  /** Most subgradient rounds (default 2000: the work budget decides). */
  readonly maxRounds?: number;
}

export interface LagrangeBound {
  /** The bound (whole diodes), or null when the problem is out of reach or not one round was paid for. */
  readonly bound: number | null;
  /** Rounds done. */
  readonly rounds: number;
  /** Work done, for the bench and for calibrating budgets. */
  readonly work: number;
  /** True when the clock, not the work budget, ended it. */
  readonly deadlineHit: boolean;
}

interface Item {
  /** Outputs covered (a link covers its target only). */
  readonly outputs: readonly number[];
  readonly fixed: number;
  /** Rows that may use it, ascending. */
  readonly users: readonly number[];
  /** True for a link (free per row), false for a bus (w per row). */
  readonly link: boolean;
  /** A link's source output, -1 for a bus. */
  readonly from: number;
}

/** One row's structures in flat arrays, built once. */
interface RowData {
  /** Lit outputs. */
  readonly r: number;
  /** The row's weight (states it stands for). */
  readonly w: number;
  /** Per structure the row may use: its item, its mask over the row's own outputs, its share's place in the flat share array, and a link's source (local bit) or -1. */
  readonly item: Int32Array;
  readonly mask: Int32Array;
  readonly slot: Int32Array;
  readonly src: Int32Array;
  /** The row's links grouped by source: `linkStart[g]..linkStart[g+1]` index `linkPos`, positions in the arrays above. */
  readonly linkPos: Int32Array;
  readonly linkStart: Int32Array;
}

/** Scratch arrays of the cover DP, sized for the widest row. */
interface Workspace {
  readonly single: Float64Array;
  readonly singleItem: Int32Array;
  readonly f: Float64Array;
  /** A star's cost and mask by subset of its links. */
  readonly starCost: Float64Array;
  readonly starMask: Int32Array;
}

/** A row's cheapest cover: its cost and the positions (in its `RowData`) of the shared structures it uses (buses, and the links of its stars). */
interface RowCover {
  readonly cost: number;
  readonly used: number[];
  /** DP steps done, for the meter. */
  readonly steps: number;
}

/** Placeholder in `singleItem`: a direct diode. */
const DIRECT = -1;
/** Placeholder in `singleItem`: the row's own padding bus. */
const PAD = -2;
/** `singleItem` at or below this: star number STAR - value of the row's star scratch. */
const STAR = -3;

function popcount(x: number): number {
  let t = 0;
  for (let v = x; v !== 0; v &= v - 1) t++;
  return t;
}

/** Scratch of one row's stars (a link source's direct diode with links out of it), rebuilt each call. */
interface StarScratch {
  /** Per star: its group (in `RowData.linkStart`) and its subset of the group's links (bit i: the group's i-th link). */
  group: number[];
  sub: number[];
}

/**
 * Row `d`'s cheapest cover under the shares: direct diodes at its weight,
 * any of its buses at its weight plus its share, its own padding bus at its
 * weight plus one per output (several padding buses are allowed, but one
 * always does at least as well, since each costs the weight again), and
 * links only in a star: a source's direct diode (its weight) with any subset
 * of the links out of it, each at its share (a link source sits at level 1,
 * which only direct diodes feed, so a row using a link lights its source
 * directly; under mixed and per-segment alike). The star holds that rule
 * exactly, where a multiplier per row and link held it only at the optimum
 * of the multipliers. A top-level function over typed arrays, the share
 * places found once.
 */
function coverRow(d: RowData, share: Float64Array, directOk: boolean, padOk: boolean, ws: Workspace, stars: StarScratch): RowCover {
  const { r, w: wk, item, mask: masks, slot, src, linkPos, linkStart } = d;
  const { single, singleItem, f, starCost, starMask } = ws;
  const full = (1 << r) - 1;
  const count = item.length;
  single.fill(Infinity, 0, full + 1);
  singleItem.fill(DIRECT, 0, full + 1);
  if (directOk) for (let b = 0; b < r; b++) single[1 << b] = wk;
  if (padOk) {
    for (let m = 1; m <= full; m++) {
      const c = wk + popcount(m);
      if (c < (single[m] as number)) {
        single[m] = c;
        singleItem[m] = PAD;
      }
    }
  }
  for (let j = 0; j < count; j++) {
    if ((src[j] as number) >= 0) continue;
    const c = wk + (share[slot[j] as number] as number);
    const m = masks[j] as number;
    if (c < (single[m] as number)) {
      single[m] = c;
      singleItem[m] = j;
    }
  }
  let steps = r * (full + 1) + count;
  stars.group.length = 0;
  stars.sub.length = 0;
  if (directOk) {
    for (let g = 0; g + 1 < linkStart.length; g++) {
      const from = linkStart[g] as number;
      const t = (linkStart[g + 1] as number) - from;
      const srcBit = 1 << (src[linkPos[from] as number] as number);
      // Subset costs and masks built from the subset without its lowest link.
      starCost[0] = wk;
      starMask[0] = srcBit;
      for (let sub = 1; sub < 1 << t; sub++) {
        const lowBit = sub & -sub;
        const j = linkPos[from + 31 - Math.clz32(lowBit)] as number;
        const c = (starCost[sub ^ lowBit] as number) + (share[slot[j] as number] as number);
        const m = (starMask[sub ^ lowBit] as number) | (masks[j] as number);
        starCost[sub] = c;
        starMask[sub] = m;
        if (c < (single[m] as number)) {
          single[m] = c;
          singleItem[m] = STAR - stars.group.length;
          stars.group.push(g);
          stars.sub.push(sub);
        }
      }
      steps += 1 << t;
    }
  }
  // Superset closure: the cheapest single structure lighting at least each subset.
  for (let b = 0; b < r; b++) {
    const bit = 1 << b;
    for (let m = full; m >= 0; m--) {
      if (m & bit) continue;
      const up = m | bit;
      if ((single[up] as number) < (single[m] as number)) {
        single[m] = single[up] as number;
        singleItem[m] = singleItem[up] as number;
      }
    }
  }
  // Cover DP: one structure holding the lowest output, plus the cheapest cover of the rest (values only; the choices are found again below, along one path).
  f[0] = 0;
  for (let m = 1; m <= full; m++) {
    const low = m & -m;
    const rest = m ^ low;
    let bv = single[m] as number;
    for (let s = rest & (rest - 1); ; s = (s - 1) & rest) {
      const c = (single[s | low] as number) + (f[rest ^ s] as number);
      if (c < bv) bv = c;
      if (s === 0) break;
    }
    f[m] = bv;
    steps += 1 << popcount(rest);
  }
  const used: number[] = [];
  for (let m = full; m !== 0;) {
    const low = m & -m;
    const rest = m ^ low;
    let bv = Infinity;
    let bs = m;
    for (let s = rest; ; s = (s - 1) & rest) {
      const c = (single[s | low] as number) + (f[rest ^ s] as number);
      if (c < bv) {
        bv = c;
        bs = s | low;
      }
      if (s === 0) break;
    }
    steps += 1 << popcount(rest);
    const j = singleItem[bs] as number;
    if (j >= 0) used.push(j);
    else if (j <= STAR) {
      const x = STAR - j;
      const from = linkStart[stars.group[x] as number] as number;
      const sub = stars.sub[x] as number;
      for (let i = 0; sub >> i !== 0; i++) if ((sub >> i) & 1) used.push(linkPos[from + i] as number);
    }
    m ^= bs;
  }
  return { cost: f[full] as number, used, steps };
}

/**
 * The bound of the relaxation above, for a problem (possibly reduced, see
 * reduce.ts) at depth limit 2.
 *
 * @example
 * lagrangeBound(reduceRows(p).problem, rules, { maxWork: 5e8, upper: 195 }).bound; // 186 or so on 00-59
 */
export function lagrangeBound(
  p: SharingProblem,
  rules: Pick<SharingRules, "policy" | "buses" | "links">,
  opts: LagrangeOptions,
): LagrangeBound {
  const meter = new WorkMeter(opts.maxWork, opts.deadlineMs);
  const none = (): LagrangeBound => ({ bound: null, rounds: 0, work: meter.work, deadlineHit: meter.deadlineHit });
  if (p.row.some((r) => r.length > LAGRANGE_MAX_ROW_OUTPUTS)) return none();
  const uniform = rules.policy === "uniform";
  const directOk = !uniform;
  const items = structures(p, rules, meter);
  if (items === null) return none();
  const n = p.n;
  const w = (k: number): number => p.weight[k] ?? 1;

  // Shares in one flat array, item by item in `users` order; start from the even split.
  const shareStart = new Int32Array(items.length + 1);
  items.forEach((it, i) => (shareStart[i + 1] = (shareStart[i] as number) + it.users.length));
  const share = new Float64Array(shareStart[items.length] as number);
  items.forEach((it, i) => share.fill(it.fixed / Math.max(1, it.users.length), shareStart[i], shareStart[i + 1]));

  // Per row: its structures, with local masks, share slots and link sources.
  const lists: { item: number[]; mask: number[]; slot: number[]; src: number[] }[] = Array.from({ length: n }, () => ({
    item: [],
    mask: [],
    slot: [],
    src: [],
  }));
  const local = p.row.map((r) => new Map(r.map((o, i) => [o, i])));
  items.forEach((it, i) => {
    it.users.forEach((k, u) => {
      const loc = local[k] as Map<number, number>;
      const l = lists[k];
      if (!l) return;
      let mask = 0;
      for (const o of it.outputs) mask |= 1 << (loc.get(o) ?? 0);
      l.item.push(i);
      l.mask.push(mask);
      l.slot.push((shareStart[i] as number) + u);
      l.src.push(it.link ? (loc.get(it.from) ?? -1) : -1);
    });
  });
  const rows: RowData[] = lists.map((l, k) => {
    const bySource = new Map<number, number[]>();
    l.src.forEach((a, j) => {
      if (a < 0) return;
      let g = bySource.get(a);
      if (!g) bySource.set(a, (g = []));
      g.push(j);
    });
    const groups = [...bySource.values()];
    const linkStart = new Int32Array(groups.length + 1);
    groups.forEach((g, x) => (linkStart[x + 1] = (linkStart[x] as number) + g.length));
    return {
      r: (p.row[k] ?? []).length,
      w: w(k),
      item: Int32Array.from(l.item),
      mask: Int32Array.from(l.mask),
      slot: Int32Array.from(l.slot),
      src: Int32Array.from(l.src),
      linkPos: Int32Array.from(groups.flat()),
      linkStart,
    };
  });
  const maxR = Math.max(0, ...rows.map((d) => d.r));
  const ws: Workspace = {
    single: new Float64Array(1 << maxR),
    singleItem: new Int32Array(1 << maxR),
    f: new Float64Array(1 << maxR),
    starCost: new Float64Array(1 << maxR),
    starMask: new Int32Array(1 << maxR),
  };
  const stars: StarScratch = { group: [], sub: [] };
  const padOkOf = (d: RowData): boolean => rules.buses && (uniform || d.w >= 2);

  let bestBound = -Infinity;
  let rounds = 0;
  let theta = 2;
  let stall = 0;
  const maxRounds = opts.maxRounds ?? 2000;
  const covers: RowCover[] = [];
  for (; rounds < maxRounds; rounds++) {
    if (meter.spent() || meter.checkClock()) break;
    let sum = 0;
    covers.length = 0;
    let complete = true;
    for (let k = 0; k < n; k++) {
      const d = rows[k] as RowData;
      const c = coverRow(d, share, directOk, padOkOf(d), ws, stars);
      meter.charge(c.steps);
      sum += c.cost;
      covers.push(c);
      // A round cut short by the budget is not a bound.
      if (meter.spent() && k < n - 1) {
        complete = false;
        break;
      }
    }
    if (!complete) break;
    if (sum > bestBound + 1e-9) {
      bestBound = sum;
      stall = 0;
    } else if (++stall >= 8) {
      theta /= 2;
      stall = 0;
    }
    if (Math.ceil(bestBound - 1e-7) >= opts.upper || theta < 1e-4) break;
    // Subgradient: +1 on the share of each (structure, row) in use.
    let norm = 0;
    for (const c of covers) norm += c.used.length;
    if (norm === 0) break;
    const step = (theta * Math.max(0.5, opts.upper - sum)) / norm;
    // The shares in use move up by the step; each structure touched is projected back onto
    // its capped simplex (which lowers its other shares). The others keep their sums, so
    // they stay feasible untouched.
    const touched = new Set<number>();
    for (let k = 0; k < n; k++) {
      const d = rows[k] as RowData;
      for (const j of (covers[k] as RowCover).used) {
        const at = d.slot[j] as number;
        share[at] = (share[at] as number) + step;
        touched.add(d.item[j] as number);
      }
    }
    for (const i of touched) projectCapped(share.subarray(shareStart[i], shareStart[i + 1]), (items[i] as Item).fixed);
    meter.charge(touched.size);
  }
  const bound = bestBound === -Infinity ? null : Math.ceil(bestBound - 1e-7);
  return { bound, rounds, work: meter.work, deadlineHit: meter.deadlineHit };
}

/** Every bus output set lit by two or more rows, and every link; null when there are too many or the meter ran out. */
function structures(p: SharingProblem, rules: Pick<SharingRules, "policy" | "buses" | "links">, meter: WorkMeter): Item[] | null {
  const items: Item[] = [];
  if (rules.links && rules.policy !== "uniform") {
    for (let a = 0; a < p.m; a++) {
      for (let b = 0; b < p.m; b++)
        if (p.within[a]?.[b]) items.push({ outputs: [b], fixed: 1, users: p.col[a] ?? [], link: true, from: a });
    }
  }
  if (!rules.buses) return items;
  let over = false;
  let pairs = 0;
  const visit = (t: number[], s: number[], next: number): void => {
    for (let o = next; o < p.m && !over; o++) {
      const s2 = s.filter((k) => p.lit[k]?.[o] === true);
      if (meter.charge(s.length + 1)) {
        over = true;
        return;
      }
      if (s2.length < 2) continue;
      const t2 = [...t, o];
      items.push({ outputs: t2, fixed: t2.length, users: s2, link: false, from: -1 });
      pairs += s2.length;
      if (items.length > MAX_ITEMS || pairs > MAX_PAIRS) {
        over = true;
        return;
      }
      visit(t2, s2, o + 1);
    }
  };
  visit(
    [],
    Array.from({ length: p.n }, (_, k) => k),
    0,
  );
  return over ? null : items;
}

/** Euclidean projection of `v` onto { x >= 0, sum x <= cap }, in place. */
function projectCapped(v: Float64Array, cap: number): void {
  let sum = 0;
  for (let i = 0; i < v.length; i++) {
    if ((v[i] as number) < 0) v[i] = 0;
    sum += v[i] as number;
  }
  if (sum <= cap) return;
  const sorted = Array.from(v).sort((a, b) => b - a);
  let acc = 0;
  let tau = 0;
  for (let i = 0; i < sorted.length; i++) {
    acc += sorted[i] as number;
    const t = (acc - cap) / (i + 1);
    if ((sorted[i] as number) - t > 0) tau = t;
  }
  for (let i = 0; i < v.length; i++) v[i] = Math.max(0, (v[i] as number) - tau);
}
