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
 * Under per-segment a caller may decide some outputs' levels (`levels`,
 * see levelBound.ts): a level-1 output then takes direct diodes only and
 * no bus, a level-2 output no direct diode (its row's padding bus stays
 * open to it even in a row of one state), and links run only from outputs
 * not at level 2 into outputs not at level 1.
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
  /**
   * Per-segment only: per output its level if decided (1: direct diodes
   * only, and it may be a link source; 2: buses and links in only), or 0
   * when either is still open. By default every output is open.
   */
  readonly levels?: readonly number[];
  /** Shares to start from, per structure key (`itemKey`), in its users' order. */
  readonly warm?: ReadonlyMap<string, readonly number[]>;
  /** The step factor to start from (default 2; a warm start passes its parent's). */
  readonly theta?: number;
  /**
   * Rounds in a row without a gain after which the step halves, or a rule
   * giving them from the rounds the budget pays for (estimated from the
   * first round's work). By default `stallRounds`.
   */
  readonly stall?: number | ((affordable: number) => number);
}

/**
 * The default of `LagrangeOptions.stall`: 1/64 of the rounds the budget
 * pays for (`affordable`, from the first round's work), 8 to 30. A fixed 8
 * halved the step so fast on 00-23 that it fell to nothing after 785 of the
 * 1424 rounds its 10 s budget paid for, at 81.4 (82); halving after 22 uses
 * them all and reaches 82.3 (83), and 87 for 86 under uniform. Where the
 * budget pays for fewer rounds (760 on 00-59 and 768 on 00-99 at 30 and
 * 60 s) a slow halving leaves the step too long at the end (00-59 uniform
 * 186 after 20, 187 after 8), and 12 gives 186 for 185 on 00-59 and 273
 * for 272 on 00-99 under mixed (boundBench.ts; our own tuning, measured on
 * this 2-core machine). Halving the step after rounds without a gain is
 * the usual subgradient rule (Held, Wolfe and Crowder, docs/sources.md).
 */
export function stallRounds(affordable: number): number {
  return Math.min(30, Math.max(8, Math.round(affordable / 64)));
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
  /** The shares of the best round, per structure key, for a warm start. */
  readonly shares?: ReadonlyMap<string, readonly number[]>;
  /** The step factor reached. */
  readonly theta?: number;
}

/** A structure's key: `b:1,2,3` for a bus on outputs 1, 2, 3; `l4:7` for a link 4 -> 7. */
function itemKey(link: boolean, from: number, outputs: readonly number[]): string {
  return link ? `l${from}:${outputs.join(",")}` : `b:${outputs.join(",")}`;
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
  /** Local bits that may take a direct diode, and that a padding bus may drive. */
  readonly directBits: number;
  readonly padBits: number;
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
  const { r, w: wk, item, mask: masks, slot, src, linkPos, linkStart, directBits, padBits } = d;
  const { single, singleItem, f, starCost, starMask } = ws;
  const full = (1 << r) - 1;
  const count = item.length;
  single.fill(Infinity, 0, full + 1);
  singleItem.fill(DIRECT, 0, full + 1);
  if (directOk) for (let b = 0; b < r; b++) if ((directBits >> b) & 1) single[1 << b] = wk;
  if (padOk) {
    for (let m = 1; m <= full; m++) {
      if ((m & padBits) !== m) continue;
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
  const level = (o: number): number => opts.levels?.[o] ?? 0;
  const all = structures(p, rules, meter);
  if (all === null) return none();
  // Decided levels: a level-1 output takes no bus; a link runs from an output not at level 2 into one not at level 1.
  const items = all.filter((it) =>
    it.link ? level(it.from) !== 2 && level(it.outputs[0] as number) !== 1 : it.outputs.every((o) => level(o) !== 1),
  );
  const n = p.n;
  const w = (k: number): number => p.weight[k] ?? 1;

  // Shares in one flat array, item by item in `users` order; start from the even split. Under
  // a swap of positions that maps the rows onto themselves (see `positionSwap`), the share of
  // (structure, row) and that of their mirrors are one cell: the shares stay symmetric, which
  // loses nothing (the dual is concave and symmetric, so the mean of an optimum and its mirror
  // is an optimum), and a row and its mirror then cost the same, so only one of them is solved.
  const swap = opts.levels?.some((l) => l !== 0) ? null : positionSwap(p);
  const mirror = swap === null ? null : mirrorItems(items, swap.out);
  const rowMirror = (k: number): number => (mirror === null || swap === null ? k : (swap.row[k] as number));
  const itemMirror = (i: number): number => (mirror === null ? i : (mirror[i] as number));
  const cellOf: Int32Array[] = [];
  let cells = 0;
  items.forEach((it, i) => {
    const at = new Int32Array(it.users.length);
    const mi = itemMirror(i);
    it.users.forEach((k, u) => {
      const mk = rowMirror(k);
      if (mi < i || (mi === i && mk < k)) {
        const other = items[mi] as Item;
        at[u] = (mi === i ? at : (cellOf[mi] as Int32Array))[sortedIndex(other.users, mk)] as number;
      } else at[u] = cells++;
    });
    cellOf.push(at);
  });
  const share = new Float64Array(cells);
  items.forEach((it, i) => {
    const from = opts.warm?.get(itemKey(it.link, it.from, it.outputs));
    (cellOf[i] as Int32Array).forEach((c, u) => (share[c] = from?.[u] ?? it.fixed / Math.max(1, it.users.length)));
  });
  // Per structure kept (one of each mirror pair): its distinct cells and how many of its users each stands for.
  const projection = items.map((_, i) => {
    if (itemMirror(i) < i) return null;
    const count = new Map<number, number>();
    for (const c of cellOf[i] as Int32Array) count.set(c, (count.get(c) ?? 0) + 1);
    return { cells: Int32Array.from(count.keys()), weight: Float64Array.from(count.values()) };
  });
  // The rows solved (one of each mirror pair) and how many rows each stands for.
  const solved: number[] = [];
  const times: number[] = [];
  for (let k = 0; k < n; k++) {
    const mk = rowMirror(k);
    if (mk < k) continue;
    solved.push(k);
    times.push(mk === k ? 1 : 2);
  }

  // Per row solved: its structures, with local masks, share cells and link sources.
  const lists = new Map(solved.map((k) => [k, { item: [] as number[], mask: [] as number[], slot: [] as number[], src: [] as number[] }]));
  const local = p.row.map((r) => new Map(r.map((o, i) => [o, i])));
  items.forEach((it, i) => {
    it.users.forEach((k, u) => {
      const l = lists.get(k);
      if (!l) return;
      const loc = local[k] as Map<number, number>;
      let mask = 0;
      for (const o of it.outputs) mask |= 1 << (loc.get(o) ?? 0);
      l.item.push(i);
      l.mask.push(mask);
      l.slot.push((cellOf[i] as Int32Array)[u] as number);
      l.src.push(it.link ? (loc.get(it.from) ?? -1) : -1);
    });
  });
  const rows: RowData[] = solved.map((k) => {
    const l = lists.get(k) as { item: number[]; mask: number[]; slot: number[]; src: number[] };
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
    const lit = p.row[k] ?? [];
    let directBits = 0;
    let padBits = 0;
    lit.forEach((o, b) => {
      if (level(o) !== 2) directBits |= 1 << b;
      if (level(o) !== 1) padBits |= 1 << b;
    });
    return {
      r: lit.length,
      directBits,
      padBits,
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
  // A row of one state has no use for its padding bus while direct diodes may feed its outputs (they cost less); an output at level 2 may need it.
  const padOkOf = (d: RowData): boolean => rules.buses && (uniform || d.w >= 2 || d.directBits !== (1 << d.r) - 1);

  let bestBound = -Infinity;
  let bestShares: Float64Array | null = null;
  let rounds = 0;
  let theta = opts.theta ?? 2;
  let stall = 0;
  let stallLimit = typeof opts.stall === "number" ? opts.stall : 8;
  const maxRounds = opts.maxRounds ?? 2000;
  const workBefore = meter.work;
  const covers: RowCover[] = [];
  const grad = new Float64Array(cells);
  for (; rounds < maxRounds; rounds++) {
    if (meter.spent() || meter.checkClock()) break;
    let sum = 0;
    covers.length = 0;
    let complete = true;
    for (let x = 0; x < rows.length; x++) {
      const d = rows[x] as RowData;
      const c = coverRow(d, share, directOk, padOkOf(d), ws, stars);
      meter.charge(c.steps);
      sum += (times[x] as number) * c.cost;
      covers.push(c);
      // A round cut short by the budget is not a bound.
      if (meter.spent() && x < rows.length - 1) {
        complete = false;
        break;
      }
    }
    if (!complete) break;
    if (rounds === 0 && typeof opts.stall !== "number") {
      const perRound = Math.max(1, meter.work - workBefore);
      stallLimit = (opts.stall ?? stallRounds)(Math.min(maxRounds, (opts.maxWork - workBefore) / perRound));
    }
    if (sum > bestBound + 1e-9) {
      bestBound = sum;
      bestShares = share.slice();
      stall = 0;
    } else if (++stall >= stallLimit) {
      theta /= 2;
      stall = 0;
    }
    if (Math.ceil(bestBound - 1e-7) >= opts.upper || theta < 1e-4) break;
    // Subgradient: on each share cell, the uses of the (structure, row) pairs it stands for
    // (a row solved for itself and its mirror counts twice).
    const touchedCells: number[] = [];
    const touched = new Set<number>();
    for (let x = 0; x < rows.length; x++) {
      const d = rows[x] as RowData;
      for (const j of (covers[x] as RowCover).used) {
        const at = d.slot[j] as number;
        if (grad[at] === 0) touchedCells.push(at);
        grad[at] = (grad[at] as number) + (times[x] as number);
        const i = d.item[j] as number;
        touched.add(Math.min(i, itemMirror(i)));
      }
    }
    let norm = 0;
    for (const at of touchedCells) norm += (grad[at] as number) ** 2;
    if (norm === 0) break;
    const step = (theta * Math.max(0.5, opts.upper - sum)) / norm;
    // The shares in use move up along the subgradient; each structure touched is projected
    // back onto its capped simplex (which lowers its other shares). The others keep their
    // sums, so they stay feasible untouched.
    for (const at of touchedCells) {
      share[at] = (share[at] as number) + step * (grad[at] as number);
      grad[at] = 0;
    }
    for (const i of touched) {
      const pr = projection[i] as { cells: Int32Array; weight: Float64Array };
      projectWeighted(share, pr.cells, pr.weight, (items[i] as Item).fixed);
    }
    meter.charge(touched.size);
  }
  const bound = bestBound === -Infinity ? null : Math.ceil(bestBound - 1e-7);
  const shares = new Map<string, number[]>();
  const kept = bestShares;
  if (kept !== null)
    items.forEach((it, i) =>
      shares.set(
        itemKey(it.link, it.from, it.outputs),
        Array.from(cellOf[i] as Int32Array, (c) => kept[c] as number),
      ),
    );
  return { bound, rounds, work: meter.work, deadlineHit: meter.deadlineHit, shares, theta };
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

/**
 * The swap of a problem's two positions (outputs of group 0 and group 1, of
 * equal number, in order) when it maps the rows onto rows of the same
 * weight (00-99: the row of 37 onto that of 73): per output its mirror, per
 * row its mirror; null when there are not two such positions or a row has
 * no mirror.
 */
export function positionSwap(p: SharingProblem): { readonly out: Int32Array; readonly row: Int32Array } | null {
  const groups = [...new Set(p.group)];
  if (groups.length !== 2) return null;
  const g0 = p.group.flatMap((g, o) => (g === groups[0] ? [o] : []));
  const g1 = p.group.flatMap((g, o) => (g === groups[1] ? [o] : []));
  if (g0.length !== g1.length || g0.length + g1.length !== p.m) return null;
  const out = new Int32Array(p.m);
  g0.forEach((o, i) => {
    out[o] = g1[i] as number;
    out[g1[i] as number] = o;
  });
  const key = (lit: readonly boolean[]): string => lit.map((x) => (x ? "1" : "0")).join("");
  const byKey = new Map(p.lit.map((l, k) => [key(l), k]));
  const row = new Int32Array(p.n);
  for (let k = 0; k < p.n; k++) {
    const lit = p.lit[k] ?? [];
    const mirrored = Array.from({ length: p.m }, (_, o) => lit[out[o] as number] === true);
    const mk = byKey.get(key(mirrored));
    if (mk === undefined || (p.weight[mk] ?? 1) !== (p.weight[k] ?? 1)) return null;
    row[k] = mk;
  }
  return { out, row };
}

/** Per structure, its mirror under the output map `out` (a bus on the mirrored outputs, a link between the mirrored outputs); null when one is missing. */
function mirrorItems(items: readonly Item[], out: Int32Array): Int32Array | null {
  const key = (link: boolean, from: number, outputs: readonly number[]): string => `${link ? `l${from}` : "b"}:${outputs.join(",")}`;
  const index = new Map(items.map((it, i) => [key(it.link, it.from, it.outputs), i]));
  const mirror = new Int32Array(items.length);
  for (let i = 0; i < items.length; i++) {
    const it = items[i] as Item;
    const outputs = it.outputs.map((o) => out[o] as number).sort((a, b) => a - b);
    const mi = index.get(key(it.link, it.link ? (out[it.from] as number) : -1, outputs));
    if (mi === undefined) return null;
    mirror[i] = mi;
  }
  return mirror;
}

/** Index of `x` in the ascending array `a` (which holds it). */
function sortedIndex(a: readonly number[], x: number): number {
  let lo = 0;
  let hi = a.length - 1;
  while (lo < hi) {
    const mid = (lo + hi) >> 1;
    if ((a[mid] as number) < x) lo = mid + 1;
    else hi = mid;
  }
  return lo;
}

/**
 * Euclidean projection of the cells `at` of `x` onto { x >= 0, sum c x <= cap }
 * (c = `weight`, the users each cell stands for), in place:
 * x = max(0, x - tau c) with the least tau >= 0 that meets the cap.
 */
function projectWeighted(x: Float64Array, at: Int32Array, weight: Float64Array, cap: number): void {
  let sum = 0;
  for (let i = 0; i < at.length; i++) {
    const c = at[i] as number;
    if ((x[c] as number) < 0) x[c] = 0;
    sum += (weight[i] as number) * (x[c] as number);
  }
  if (sum <= cap) return;
  // Breakpoints x / c, highest first; tau from the cells still above zero.
  const order = Array.from({ length: at.length }, (_, i) => i).sort(
    (a, b) => (x[at[b] as number] as number) / (weight[b] as number) - (x[at[a] as number] as number) / (weight[a] as number) || a - b,
  );
  let acc = 0;
  let accW = 0;
  let tau = 0;
  for (const i of order) {
    const c = weight[i] as number;
    const v = x[at[i] as number] as number;
    acc += c * v;
    accW += c * c;
    const t = (acc - cap) / accW;
    if (v / c - t > 0) tau = t;
  }
  for (let i = 0; i < at.length; i++) {
    const c = at[i] as number;
    x[c] = Math.max(0, (x[c] as number) - tau * (weight[i] as number));
  }
}
