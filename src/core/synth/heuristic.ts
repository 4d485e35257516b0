/**
 * The fast heuristic: no MILP, deterministic, for live editing and for big
 * instances (and as the exact optimizer's warm start).
 *
 * Two nested searches. The outer one assigns every output a level (see
 * `levelRules` in rules.ts) by hill climbing from a few fixed starts. The
 * inner one, for a fixed assignment, covers the lit cells greedily: at each
 * step it takes the bus or link that saves the most diodes over what the
 * cells would cost otherwise (1 for a cell that may be driven directly, 2 for
 * one that would need a padding bus), then drives what is left directly or
 * through padding buses. The greedy choice of bus shapes follows the usual
 * greedy for Boolean matrix factorisation (Miettinen et al., "The Discrete
 * Basis Problem"): candidate output sets are the rows and the pairwise row
 * intersections.
 */
import type { PlanBus, PlanLink, SharingPlan, SharingProblem, SharingRules } from "./plan.ts";
import { busStates, levelRules, linkPairs } from "./rules.ts";
import { comparePlans } from "./tieBreak.ts";

/** Outer-search budget: most level assignments tried. Keeps big instances bounded. */
const MAX_EVALUATIONS = 400;
/** Below this many level assignments the outer search tries them all. */
const EXHAUSTIVE_ASSIGNMENTS = 256;
/** Ruin-and-recreate budget: rounds, and bus shapes tried per round. */
const RECREATE_ROUNDS = 6;
const RECREATE_BUSES = 12;

/**
 * Runs the heuristic. Always returns a plan: the direct plan is one of the
 * starts, and it is valid under every policy.
 *
 * @example
 * const plan = heuristicPlan(problemFromLit(spec.lit), { depthLimit: 2, policy: "per-segment", buses: true, links: true });
 */
export function heuristicPlan(p: SharingProblem, rules: SharingRules): SharingPlan {
  const maxLevel = Math.max(1, Math.min(rules.depthLimit, rules.buses || rules.links ? 3 : 1));
  const cands = busCandidates(p);
  const cache = new Map<string, SharingPlan | null>();
  let evaluations = 0;
  const evaluate = (levels: readonly number[]): SharingPlan | null => {
    const key = levels.join("");
    const hit = cache.get(key);
    if (hit !== undefined) return hit;
    evaluations++;
    const plan = coverForLevels(p, rules, levels, cands);
    cache.set(key, plan);
    return plan;
  };
  const better = (a: SharingPlan, b: SharingPlan | null): boolean => b === null || comparePlans(a, b) < 0;

  const starts: number[][] = [Array(p.m).fill(1)];
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
      if (o === p.m) break;
      levels[o] = (levels[o] ?? 1) + 1;
    }
    if (bestLevels) starts.unshift(bestLevels);
  }

  let best: SharingPlan | null = null;
  let bestLevels: readonly number[] = starts[0] ?? [];
  for (const start of starts) {
    let levels = start;
    let current = evaluate(levels);
    if (current === null) continue;
    if (rules.policy !== "uniform" && maxLevel >= 2) {
      // First-improvement hill climb over single-output level changes.
      let improved = true;
      while (improved && evaluations < MAX_EVALUATIONS) {
        improved = false;
        for (let o = 0; o < p.m && evaluations < MAX_EVALUATIONS; o++) {
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
  if (best === null) throw new Error("bug: the all-direct start always yields a plan");

  // Ruin and recreate: forbid one of the chosen bus shapes and cover again;
  // the greedy's first choices are often the ones that lock it in.
  let banned = new Set<string>();
  for (let round = 0; round < RECREATE_ROUNDS; round++) {
    let improved = false;
    for (const b of best.buses.slice(0, RECREATE_BUSES)) {
      const tryBan = new Set([...banned, b.outputs.join(",")]);
      const plan = coverForLevels(p, rules, bestLevels, cands, tryBan);
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

/** Candidate bus output sets: every row and every pairwise row intersection with 2+ outputs. */
function busCandidates(p: SharingProblem): number[][] {
  const seen = new Set<string>();
  const out: number[][] = [];
  const add = (t: number[]): void => {
    if (t.length === 0) return;
    const key = t.join(",");
    if (seen.has(key)) return;
    seen.add(key);
    out.push(t);
  };
  for (let a = 0; a < p.n; a++) {
    const ra = p.row[a] ?? [];
    add([...ra]);
    for (let b = a + 1; b < p.n; b++) {
      const lb = p.lit[b] ?? [];
      const t = ra.filter((o) => lb[o]);
      if (t.length >= 2) add(t);
    }
  }
  return out;
}

/**
 * Greedy cover for one level assignment, or null when the levels admit no
 * plan (a per-segment level-3 output its links cannot cover).
 */
function coverForLevels(
  p: SharingProblem,
  rules: SharingRules,
  levels: readonly number[],
  cands: readonly number[][],
  banned: ReadonlySet<string> = new Set(),
): SharingPlan | null {
  // Greedy gains overrate a wide bus against several one-diode links, so try
  // both orders: best gain first, and links before buses.
  let best: SharingPlan | null = null;
  for (const order of ORDERS) {
    const plan = greedyCover(p, rules, levels, cands, order, banned);
    if (plan !== null && (best === null || comparePlans(plan, best) < 0)) best = plan;
  }
  return best;
}

/** Greedy orders: most diodes saved first; links before buses; best saving per diode placed first. */
type GreedyOrder = "gain" | "links-first" | "ratio";
const ORDERS: readonly GreedyOrder[] = ["gain", "links-first", "ratio"];

function greedyCover(
  p: SharingProblem,
  rules: SharingRules,
  levels: readonly number[],
  cands: readonly number[][],
  order: GreedyOrder,
  banned: ReadonlySet<string>,
): SharingPlan | null {
  const linksFirst = order === "links-first";
  // Score of a structure that saves `gain` diodes by placing `cost`.
  const score =
    order === "ratio" ? (gain: number, cost: number): number => (gain > 0 ? (gain + cost) / cost : 0) : (gain: number): number => gain;
  const { n, m } = p;
  const lvl = (o: number): number => levels[o] ?? 1;
  const directOk = Array.from({ length: m }, (_, o) => levelRules.direct(rules, lvl(o)));
  const busOk = Array.from({ length: m }, (_, o) => levelRules.bus(rules, lvl(o)));
  // Cost of leaving a cell to the end: direct 1, padding bus about 2, impossible 3.
  const weight = Array.from({ length: m }, (_, o) => (directOk[o] ? 1 : busOk[o] ? 2 : 3));
  const covered = new Uint8Array(n * m);
  // What leaving each cell uncovered would cost; zero once covered or unlit.
  const needW = new Uint8Array(n * m);
  for (let k = 0; k < n; k++) for (const o of p.row[k] ?? []) needW[k * m + o] = weight[o] ?? 1;
  const cover = (k: number, o: number): void => {
    covered[k * m + o] = 1;
    needW[k * m + o] = 0;
  };

  // Bus shapes restricted to the outputs a bus may feed; states that light all of them.
  const shapes: { t: number[]; s: number[] }[] = [];
  const seen = new Set<string>();
  for (const c of cands) {
    const t = c.filter((o) => busOk[o]);
    if (t.length === 0) continue;
    const key = t.join(",");
    if (seen.has(key) || banned.has(key)) continue;
    seen.add(key);
    shapes.push({ t, s: busStates(p, t) });
  }
  const allowedLinks = linkPairs(p, rules).filter((l) => levelRules.link(rules, lvl(l.from), lvl(l.to)));

  const buses: PlanBus[] = [];
  const links: PlanLink[] = [];
  const usedLink = new Set<number>();
  for (;;) {
    let bestGain = 0;
    let pick: { bus?: PlanBus; link?: PlanLink; li?: number } | null = null;
    allowedLinks.forEach((l, li) => {
      if (usedLink.has(li)) return;
      let g = -1;
      for (const k of p.col[l.from] ?? []) g += needW[k * m + l.to] ?? 0;
      const sc = score(g, 1);
      if (sc > bestGain) {
        bestGain = sc;
        pick = { link: l, li };
      }
    });
    if (linksFirst && pick !== null) bestGain = Infinity;
    let alive = 0;
    for (const shape of shapes) {
      const { t, s } = shape;
      let g = -t.length;
      const chosen: number[] = [];
      for (const k of s) {
        let gk = 0;
        const base = k * m;
        for (const o of t) gk += needW[base + o] ?? 0;
        if (gk > 1) {
          g += gk - 1;
          chosen.push(k);
        }
      }
      // Covering only grows, so a shape that saves nothing now never will: drop it.
      if (g <= 0) continue;
      shapes[alive++] = shape;
      const sc = score(g, chosen.length + t.length);
      if (sc > bestGain) {
        bestGain = sc;
        pick = { bus: { states: chosen, outputs: t } };
      }
    }
    shapes.length = alive;
    if (pick === null) break;
    const chosenPick: { bus?: PlanBus; link?: PlanLink; li?: number } = pick;
    if (chosenPick.link && chosenPick.li !== undefined) {
      const l = chosenPick.link;
      usedLink.add(chosenPick.li);
      links.push(l);
      for (const k of p.col[l.from] ?? []) cover(k, l.to);
    } else if (chosenPick.bus) {
      const b = chosenPick.bus;
      buses.push(b);
      for (const k of b.states) for (const o of b.outputs) cover(k, o);
    }
  }

  // What is left: direct where allowed, padding buses where not.
  const direct: [number, number][] = [];
  const pads = new Map<string, { states: number[]; outputs: number[] }>();
  for (let k = 0; k < n; k++) {
    const rest: number[] = [];
    for (const o of p.row[k] ?? []) {
      if (covered[k * m + o]) continue;
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
  return prune(p, { direct, buses, links });
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
