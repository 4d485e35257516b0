/**
 * A lower bound for counters with many outputs (two seven-segment positions
 * and more), valid at depth limit 2 under every policy: the per-state
 * Lagrangian bound of search.ts, without its level sets and with each
 * state's cover found by a subset DP over that state's own lit outputs.
 *
 * The relaxed problem. Every lit cell is covered by a direct diode (not
 * under uniform, see below), a link a -> b (where every state lighting a
 * lights b; fixed cost 1, free for the states lighting a), a bus with
 * output set T (fixed cost |T|, and w for each row of weight w that feeds
 * it; only T lit by two or more rows, see candidates.ts: one bus per T
 * suffices) or a row's own padding bus (w plus one per output). Levels are
 * dropped: any depth-2 matrix of any policy is a solution of it at no more
 * diodes (its buses fed by one row are padding buses; two buses with one T
 * pay |T| once here), so its optimum is a lower bound. Under uniform the
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
 * output plus the cover of the rest (3^r / 2 steps). Rows of more than
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

  // Per row: its items, and for each the local mask and the slot of its share.
  const rowItems: number[][] = Array.from({ length: n }, () => []);
  const rowMasks: number[][] = Array.from({ length: n }, () => []);
  const rowSrc: number[][] = Array.from({ length: n }, () => []);
  const local = p.row.map((r) => new Map(r.map((o, i) => [o, i])));
  items.forEach((it, i) => {
    it.users.forEach((k) => {
      const loc = local[k] as Map<number, number>;
      let mask = 0;
      for (const o of it.outputs) mask |= 1 << (loc.get(o) ?? 0);
      rowItems[k]?.push(i);
      rowMasks[k]?.push(mask);
      rowSrc[k]?.push(it.link ? (loc.get(it.from) ?? -1) : -1);
    });
  });
  // Level multipliers, per row and its links (0 for a bus): a row that lights a link's source
  // a and uses the link must light a by a direct diode (a link source sits at level 1, which
  // only direct diodes feed, under mixed and per-segment alike). Relaxed with a multiplier
  // that the link's use pays and a's direct diode earns back; kept non-negative and, per row
  // and source, at most the row's weight, so a direct diode never costs less than nothing.
  const nu = rowItems.map((l) => new Float64Array(l.length));
  const directCost = new Float64Array(Math.max(1, ...p.row.map((r) => r.length)));
  // Shares, per item in `users` order; start from the even split.
  const share = items.map((it) => new Float64Array(it.users.length).fill(it.fixed / Math.max(1, it.users.length)));
  const userSlot = items.map((it) => new Map(it.users.map((k, u) => [k, u])));

  const maxR = Math.max(0, ...p.row.map((r) => r.length));
  const size = 1 << maxR;
  const single = new Float64Array(size);
  const singleItem = new Int32Array(size);
  const f = new Float64Array(size);
  const choice = new Int32Array(size);

  /** Row k's cheapest cover under the shares and multipliers: its cost, the places (in its list) of the items it uses, and its direct outputs (local bits). */
  const cover = (k: number): { cost: number; used: number[]; direct: number } => {
    const r = (p.row[k] ?? []).length;
    const wk = w(k);
    const full = (1 << r) - 1;
    const list = rowItems[k] as number[];
    const masks = rowMasks[k] as number[];
    const src = rowSrc[k] as number[];
    const nk = nu[k] as Float64Array;
    directCost.fill(wk, 0, r);
    for (let j = 0; j < list.length; j++)
      if ((src[j] as number) >= 0) directCost[src[j] as number] = (directCost[src[j] as number] as number) - (nk[j] as number);
    let best = Infinity;
    let bestUsed: number[] = [];
    let bestDirect = 0;
    // Two passes: without the padding bus, and with it (outputs left over go on it at 1 each).
    const padOk = rules.buses && (uniform || wk >= 2);
    for (const pad of padOk ? [false, true] : [false]) {
      // Without the pad, outputs left over go direct (not under uniform, where they cannot).
      single.fill(Infinity, 0, full + 1);
      singleItem.fill(-1, 0, full + 1);
      for (let b = 0; b < r; b++) {
        const d = directOk ? (directCost[b] as number) : Infinity;
        single[1 << b] = pad ? Math.min(1, d) : d;
      }
      for (let j = 0; j < list.length; j++) {
        const i = list[j] as number;
        const it = items[i] as Item;
        const c = (it.link ? (nk[j] as number) : wk) + ((share[i] as Float64Array)[userSlot[i]?.get(k) ?? 0] ?? 0);
        const mk = masks[j] as number;
        if (c < (single[mk] as number)) {
          single[mk] = c;
          singleItem[mk] = j;
        }
      }
      // Superset closure: the cheapest single structure lighting at least each subset.
      for (let b = 0; b < r; b++) {
        const bit = 1 << b;
        for (let mask = full; mask >= 0; mask--) {
          if (mask & bit) continue;
          const up = mask | bit;
          if ((single[up] as number) < (single[mask] as number)) {
            single[mask] = single[up] as number;
            singleItem[mask] = singleItem[up] as number;
          }
        }
      }
      f[0] = 0;
      let steps = 0;
      for (let mask = 1; mask <= full; mask++) {
        const low = mask & -mask;
        const rest = mask ^ low;
        let bv = Infinity;
        let bc = 0;
        // Every subset of the rest, with the lowest output added.
        for (let s = rest; ; s = (s - 1) & rest) {
          const sub = s | low;
          const c = (single[sub] as number) + (f[mask ^ sub] as number);
          if (c < bv) {
            bv = c;
            bc = sub;
          }
          steps++;
          if (s === 0) break;
        }
        f[mask] = bv;
        choice[mask] = bc;
      }
      meter.charge(steps + r * (full + 1) + list.length);
      const total = (f[full] as number) + (pad ? wk : 0);
      if (total < best) {
        best = total;
        bestUsed = [];
        bestDirect = 0;
        for (let mask = full; mask !== 0;) {
          const sub = choice[mask] as number;
          const j = singleItem[sub] as number;
          if (j >= 0) bestUsed.push(j);
          else if (!pad || (directCost[31 - Math.clz32(sub)] as number) < 1) bestDirect |= sub;
          mask ^= sub;
        }
      }
    }
    return { cost: best, used: bestUsed, direct: bestDirect };
  };

  let bestBound = -Infinity;
  let rounds = 0;
  let theta = 2;
  let stall = 0;
  const maxRounds = opts.maxRounds ?? 2000;
  for (; rounds < maxRounds; rounds++) {
    if (meter.spent() || meter.checkClock()) break;
    let sum = 0;
    const used: number[][] = [];
    const direct: number[] = [];
    let complete = true;
    for (let k = 0; k < n; k++) {
      const c = cover(k);
      sum += c.cost;
      used.push(c.used);
      direct.push(c.direct);
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
    } else if (++stall >= 4) {
      theta /= 2;
      stall = 0;
    }
    if (Math.ceil(bestBound - 1e-7) >= opts.upper || theta < 1e-4) break;
    // Subgradient on the shares: +1 for each (structure, row) in use, projected back onto the capped simplex.
    const g = new Map<number, number[]>();
    let norm = 0;
    // And on the level multipliers: a link used without its source direct pushes up, a direct source without the link down.
    const gNu: Float64Array[] = [];
    used.forEach((list, k) => {
      const row = rowItems[k] as number[];
      for (const j of list) {
        const i = row[j] as number;
        let gi = g.get(i);
        if (!gi) g.set(i, (gi = []));
        gi.push(userSlot[i]?.get(k) ?? 0);
        norm++;
      }
      const src = rowSrc[k] as number[];
      const gk = new Float64Array(row.length);
      const inUse = new Set(list);
      for (let j = 0; j < row.length; j++) {
        const a = src[j] as number;
        if (a < 0) continue;
        gk[j] = (inUse.has(j) ? 1 : 0) - (((direct[k] as number) >> a) & 1);
        norm += (gk[j] as number) * (gk[j] as number);
      }
      gNu.push(gk);
    });
    if (norm === 0) break;
    const step = (theta * Math.max(0.5, opts.upper - sum)) / norm;
    for (let k = 0; k < n; k++) {
      const nk = nu[k] as Float64Array;
      const gk = gNu[k] as Float64Array;
      const src = rowSrc[k] as number[];
      const bySource = new Map<number, number[]>();
      for (let j = 0; j < nk.length; j++) {
        const a = src[j] as number;
        if (a < 0) continue;
        nk[j] = (nk[j] as number) + step * (gk[j] as number);
        let l = bySource.get(a);
        if (!l) bySource.set(a, (l = []));
        l.push(j);
      }
      for (const js of bySource.values()) {
        const v = Float64Array.from(js, (j) => nk[j] as number);
        projectCapped(v, w(k));
        js.forEach((j, x) => (nk[j] = v[x] as number));
      }
    }
    // Every structure's shares move: those in use up by the step, then all projected (which lowers the others).
    items.forEach((it, i) => {
      const sh = share[i] as Float64Array;
      const gi = g.get(i);
      if (gi) for (const u of gi) sh[u] = (sh[u] ?? 0) + step;
      else if (it.users.length === 0) return;
      projectCapped(sh, it.fixed);
    });
    meter.charge(items.length);
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
