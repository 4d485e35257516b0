/**
 * The heuristic's inner step: for one level assignment (each output's
 * level, see `levelRules`), cover the lit cells greedily. At each step it
 * takes the bus or link that saves the most diodes over what the cells
 * would cost otherwise (1 for a cell that may be driven directly, 2 for one
 * that would need a padding bus), then drives what is left directly or
 * through padding buses. The greedy choice of bus shapes follows the usual
 * greedy for Boolean matrix factorisation (Miettinen et al., "The Discrete
 * Basis Problem", see docs/sources.md): candidate output sets come from the
 * rows and their pairwise intersections (see `busShapes`).
 *
 * Gains only fall as cells get covered, so the greedy is lazy: it keeps the
 * structures in a heap by their last gain and recomputes only the top one,
 * which picks the same structure as a full scan would, at a fraction of the
 * work on big instances. Every gain it computes is charged to the meter; a
 * cover the meter stops half way is dropped (null), so a cut-short greedy
 * never yields a half-made plan.
 */
import type { PlanBus, PlanLink, SharingPlan, SharingProblem, SharingRules } from "./plan.ts";
import { levelRules, linkPairs } from "./rules.ts";
import type { WorkMeter } from "./workMeter.ts";

/** Greedy orders: most diodes saved first; links before buses; best saving per diode placed first. */
export type GreedyOrder = "gain" | "links-first" | "ratio";
export const GREEDY_ORDERS: readonly GreedyOrder[] = ["gain", "links-first", "ratio"];

/** Candidate bus output sets with their states as bit sets, shared by every greedy call of one heuristic run. */
export interface ShapePool {
  /** Output sets, ascending. */
  readonly outputs: readonly Int32Array[];
  /** Per output, its states as a bit set (32 states a word). */
  readonly colBits: readonly Uint32Array[];
  /** Words per state bit set. */
  readonly words: number;
  /** Shapes cut to the outputs a bus may feed, by those outputs and the banned shapes (filled by the greedy). */
  readonly cut: Map<string, { readonly t: readonly Int32Array[]; readonly s: readonly Int32Array[] }>;
}

/**
 * Candidate bus output sets: every row and every pairwise row intersection
 * with two or more outputs (row a, then its intersections with the rows
 * after it), until `maxShapes` or the meter stops it.
 */
export function busShapes(p: SharingProblem, meter: WorkMeter, maxShapes: number): ShapePool {
  const words = Math.max(1, Math.ceil(p.n / 32));
  const colBits = p.col.map((c) => {
    const b = new Uint32Array(words);
    for (const k of c) b[k >>> 5]! |= 1 << (k & 31);
    return b;
  });
  const seen = new Set<string>();
  const outputs: Int32Array[] = [];
  const add = (t: readonly number[]): void => {
    if (t.length === 0 || outputs.length >= maxShapes) return;
    const key = t.join(",");
    if (seen.has(key)) return;
    seen.add(key);
    outputs.push(Int32Array.from(t));
  };
  for (let a = 0; a < p.n && outputs.length < maxShapes; a++) {
    const ra = p.row[a] ?? [];
    add(ra);
    for (let b = a + 1; b < p.n && outputs.length < maxShapes; b++) {
      if (meter.charge(ra.length)) return { outputs, colBits, words, cut: new Map() };
      const lb = p.lit[b] ?? [];
      const t = ra.filter((o) => lb[o]);
      if (t.length >= 2) add(t);
    }
  }
  return { outputs, colBits, words, cut: new Map() };
}

/**
 * The pool's shapes restricted to the outputs a bus may feed (`busOk`), each
 * with the states lighting all of them; shapes that repeat or are banned are
 * left out. Level assignments with the same bus outputs share the result
 * (kept in `pool.cut`), which is charged to the meter once. Null when the
 * meter ran out.
 */
function shapesFor(
  pool: ShapePool,
  busOk: readonly boolean[],
  banned: ReadonlySet<string>,
  meter: WorkMeter,
): { readonly t: readonly Int32Array[]; readonly s: readonly Int32Array[] } | null {
  const key = `${busOk.map((x) => (x ? 1 : 0)).join("")}|${[...banned].sort().join(";")}`;
  const hit = pool.cut.get(key);
  if (hit) return hit;
  const shapeT: Int32Array[] = [];
  const shapeS: Int32Array[] = [];
  const seen = new Set<string>();
  const acc = new Uint32Array(pool.words);
  for (const c of pool.outputs) {
    const t = c.filter((o) => busOk[o] === true);
    if (meter.charge(c.length)) return null;
    if (t.length === 0) continue;
    const tk = t.join(",");
    if (seen.has(tk) || banned.has(tk)) continue;
    seen.add(tk);
    acc.fill(0xffffffff);
    for (const o of t) {
      const cb = pool.colBits[o] as Uint32Array;
      for (let w = 0; w < pool.words; w++) acc[w]! &= cb[w]!;
    }
    if (meter.charge(t.length * pool.words)) return null;
    const s: number[] = [];
    for (let w = 0; w < pool.words; w++) {
      for (let x = acc[w]!; x !== 0; x &= x - 1) s.push(w * 32 + (31 - Math.clz32(x & -x)));
    }
    shapeT.push(t);
    shapeS.push(Int32Array.from(s));
  }
  const out = { t: shapeT, s: shapeS };
  pool.cut.set(key, out);
  return out;
}

/**
 * Greedy cover for one level assignment, or null when the levels admit no
 * plan (a per-segment level-3 output its links cannot cover) or the meter
 * ran out first.
 */
export function greedyCover(
  p: SharingProblem,
  rules: SharingRules,
  levels: readonly number[],
  pool: ShapePool,
  order: GreedyOrder,
  banned: ReadonlySet<string>,
  meter: WorkMeter,
): SharingPlan | null {
  const { n, m } = p;
  const lvl = (o: number): number => levels[o] ?? 1;
  const directOk = Array.from({ length: m }, (_, o) => levelRules.direct(rules, lvl(o)));
  const busOk = Array.from({ length: m }, (_, o) => levelRules.bus(rules, lvl(o)));
  // Cost of leaving a cell to the end: direct 1, padding bus about 2, impossible 3.
  const weight = Array.from({ length: m }, (_, o) => (directOk[o] ? 1 : busOk[o] ? 2 : 3));
  // What leaving each cell uncovered would cost; zero once covered or unlit.
  const need = new Uint8Array(n * m);
  for (let k = 0; k < n; k++) for (const o of p.row[k] ?? []) need[k * m + o] = weight[o] ?? 1;
  if (meter.charge(n + m)) return null;

  // Links first, then bus shapes restricted to the outputs a bus may feed,
  // each with the states that light all of them.
  const links = linkPairs(p, rules).filter((l) => levelRules.link(rules, lvl(l.from), lvl(l.to)));
  const shapes = busOk.some(Boolean) ? shapesFor(pool, busOk, banned, meter) : null;
  if (shapes === null && busOk.some(Boolean)) return null;
  const shapeT = shapes?.t ?? [];
  const shapeS = shapes?.s ?? [];

  const nLinks = links.length;
  // A row that stands for several states saves (and costs) that many times over.
  const rowWeight = p.weight;
  const LINK_FIRST = 1e9;
  // Score of item i under this order, and for a bus the states worth feeding it.
  const chosen: number[] = [];
  const score = (i: number): number => {
    if (i < nLinks) {
      const l = links[i] as PlanLink;
      const users = p.col[l.from] ?? [];
      let g = -1;
      for (const k of users) g += (need[k * m + l.to] ?? 0) * (rowWeight[k] ?? 1);
      meter.charge(users.length);
      if (g <= 0) return 0;
      if (order === "links-first") return LINK_FIRST + g;
      return order === "ratio" ? (g + 1) / 1 : g;
    }
    const t = shapeT[i - nLinks] as Int32Array;
    const s = shapeS[i - nLinks] as Int32Array;
    let g = -t.length;
    let inputs = 0;
    chosen.length = 0;
    for (const k of s) {
      let gk = 0;
      const base = k * m;
      for (const o of t) gk += need[base + o] ?? 0;
      if (gk > 1) {
        const w = rowWeight[k] ?? 1;
        g += (gk - 1) * w;
        inputs += w;
        chosen.push(k);
      }
    }
    meter.charge(s.length * t.length);
    if (g <= 0) return 0;
    return order === "ratio" ? (g + inputs + t.length) / (inputs + t.length) : g;
  };

  // Max-heap of [score, item], ties to the lower item (the order a full scan meets them).
  const heapScore: number[] = [];
  const heapItem: number[] = [];
  const above = (a: number, b: number): boolean =>
    heapScore[a]! > heapScore[b]! || (heapScore[a] === heapScore[b] && heapItem[a]! < heapItem[b]!);
  const swap = (a: number, b: number): void => {
    [heapScore[a], heapScore[b]] = [heapScore[b]!, heapScore[a]!];
    [heapItem[a], heapItem[b]] = [heapItem[b]!, heapItem[a]!];
  };
  const push = (sc: number, item: number): void => {
    heapScore.push(sc);
    heapItem.push(item);
    for (let i = heapScore.length - 1; i > 0;) {
      const up = (i - 1) >> 1;
      if (!above(i, up)) break;
      swap(i, up);
      i = up;
    }
  };
  const pop = (): void => {
    const last = heapScore.length - 1;
    swap(0, last);
    heapScore.pop();
    heapItem.pop();
    for (let i = 0; ;) {
      const l = 2 * i + 1;
      const r = l + 1;
      let top = i;
      if (l < heapScore.length && above(l, top)) top = l;
      if (r < heapScore.length && above(r, top)) top = r;
      if (top === i) break;
      swap(i, top);
      i = top;
    }
  };
  const total = nLinks + shapeT.length;
  for (let i = 0; i < total; i++) {
    const sc = score(i);
    if (sc > 0) push(sc, i);
  }
  if (meter.spent()) return null;

  const buses: PlanBus[] = [];
  const planLinks: PlanLink[] = [];
  while (heapScore.length > 0) {
    const item = heapItem[0] as number;
    pop();
    const sc = score(item);
    if (meter.spent()) return null;
    if (sc <= 0) continue;
    // A fresh score at least the best stored one is the maximum (stored scores never fall short
    // of fresh ones under the gain orders); otherwise it goes back with its fresh score.
    const next = heapScore.length > 0 ? (heapScore[0] as number) : -Infinity;
    if (!(sc > next || (sc === next && item < (heapItem[0] as number)))) {
      push(sc, item);
      continue;
    }
    if (item < nLinks) {
      const l = links[item] as PlanLink;
      planLinks.push(l);
      for (const k of p.col[l.from] ?? []) need[k * m + l.to] = 0;
    } else {
      const t = shapeT[item - nLinks] as Int32Array;
      const states = chosen.slice();
      buses.push({ states, outputs: [...t] });
      for (const k of states) for (const o of t) need[k * m + o] = 0;
    }
  }

  // What is left: direct where allowed, padding buses where not.
  const direct: [number, number][] = [];
  const pads = new Map<string, { states: number[]; outputs: number[] }>();
  for (let k = 0; k < n; k++) {
    const rest: number[] = [];
    for (const o of p.row[k] ?? []) {
      if (need[k * m + o] === 0) continue;
      if (directOk[o]) direct.push([k, o]);
      else if (busOk[o]) rest.push(o);
      else return null;
    }
    if (rest.length > 0) {
      const key = rest.join(",");
      const pad = pads.get(key) ?? { states: [], outputs: rest };
      pad.states.push(k);
      pads.set(key, pad);
    }
  }
  for (const pad of pads.values()) buses.push(pad);
  if (meter.charge(n * m)) return null;
  return prune(p, { direct, buses, links: planLinks });
}

/**
 * Drops bus inputs and links whose every cell another structure also covers
 * (the greedy can leave some behind), then empty buses.
 */
function prune(p: SharingProblem, plan: SharingPlan): SharingPlan {
  const { m } = p;
  const cover = new Uint16Array(p.n * m);
  for (const [k, o] of plan.direct) cover[k * m + o]!++;
  for (const b of plan.buses) for (const k of b.states) for (const o of b.outputs) cover[k * m + o]!++;
  for (const l of plan.links) for (const k of p.col[l.from] ?? []) cover[k * m + l.to]!++;
  const links = plan.links.filter((l) => {
    const cells = (p.col[l.from] ?? []).map((k) => k * m + l.to);
    if (cells.every((c) => (cover[c] ?? 0) > 1)) {
      for (const c of cells) cover[c]!--;
      return false;
    }
    return true;
  });
  const buses: PlanBus[] = [];
  for (const b of plan.buses) {
    const states = b.states.filter((k) => {
      const cells = b.outputs.map((o) => k * m + o);
      if (cells.every((c) => (cover[c] ?? 0) > 1)) {
        for (const c of cells) cover[c]!--;
        return false;
      }
      return true;
    });
    // An output whose cells in this bus are all covered elsewhere costs a diode for nothing.
    const outputs = b.outputs.filter((o) => {
      const cells = states.map((k) => k * m + o);
      if (cells.every((c) => (cover[c] ?? 0) > 1)) {
        for (const c of cells) cover[c]!--;
        return false;
      }
      return true;
    });
    if (states.length > 0 && outputs.length > 0) buses.push({ states, outputs });
  }
  return { direct: plan.direct, buses, links };
}
