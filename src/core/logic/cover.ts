/**
 * A two-level decoder as the minimiser sees it: the terms it uses and the
 * outputs each one feeds. The diode count of the cost model (docs, "The
 * cost model of coded counters"): a term of k >= 2 literals is an AND gate
 * of k diodes and one pull-up; a one-literal term is the stage line itself;
 * every term-to-output connection is one OR diode.
 */
import type { LogicProblem } from "./logicProblem.ts";
import { termCost } from "./implicants.ts";
import { disjoint, isSubset, union, type StateSet } from "./stateSet.ts";

export interface CoverTerm {
  /** Literal indices, ascending. */
  readonly literals: readonly number[];
  readonly states: StateSet;
  /** The outputs (indices) it feeds, ascending. */
  readonly feeds: readonly number[];
}

/** The terms of a two-level decoder; a term feeds at least one output. */
export type Cover = readonly CoverTerm[];

/** Diodes of a cover: its AND-gate inputs and its OR connections. */
export function coverDiodes(cover: Cover): number {
  let d = 0;
  for (const t of cover) d += termCost(t) + t.feeds.length;
  return d;
}

/** AND gates (terms of two or more literals) of a cover. */
export function coverGates(cover: Cover): number {
  return cover.filter((t) => t.literals.length >= 2).length;
}

/** Orders covers by diodes, then gates (negative: `a` is better). */
export function compareCovers(a: Cover, b: Cover): number {
  return coverDiodes(a) - coverDiodes(b) || coverGates(a) - coverGates(b);
}

/** True when the cover lights exactly every output's on-set (a check for the minimiser's own steps). */
export function coverExact(p: LogicProblem, cover: Cover): boolean {
  return p.outputs.every((_, j) => {
    const feeding = cover.filter((t) => t.feeds.includes(j)).map((t) => t.states);
    if (feeding.some((s) => !disjoint(s, p.off[j] as StateSet))) return false;
    return isSubset(p.on[j] as StateSet, union(p.size, feeding));
  });
}

/**
 * Drops connections the cover does not need (an output still covered
 * without them), costliest terms first, then terms that feed nothing.
 */
export function pruneCover(p: LogicProblem, cover: Cover): Cover {
  const feeds = cover.map((t) => [...t.feeds]);
  const order = cover.map((_, i) => i).sort((a, b) => termCost(cover[b]!) - termCost(cover[a]!) || b - a);
  p.outputs.forEach((_, j) => {
    for (const i of order) {
      if (!feeds[i]!.includes(j)) continue;
      const others = cover.filter((_, x) => x !== i && feeds[x]!.includes(j)).map((t) => t.states);
      if (isSubset(p.on[j] as StateSet, union(p.size, others))) feeds[i] = feeds[i]!.filter((o) => o !== j);
    }
  });
  return cover.map((t, i) => ({ ...t, feeds: feeds[i]! })).filter((t) => t.feeds.length > 0);
}
