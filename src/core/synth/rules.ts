/**
 * The synthesis rules, written once: which links and buses light exactly the
 * intended cells, which structures a depth policy allows into an output, and
 * when a bus pays for itself. Every synthesizer, the MILP model and the
 * bounds take them from here.
 *
 * A link a -> b is a diode from output line a to output line b: it lights b
 * in every state that lights a. It is exact only when every state lighting a
 * lights b (`p.within[a][b]`), or it would light b where b must stay dark (a
 * sneak path).
 *
 * A bus is a node fed by counter lines S and driving outputs T: it lights
 * every output of T in every state of S. It is exact only when every state of
 * S lights every output of T; the states that may feed a bus driving T are
 * those lighting all of T (`busStates`).
 */
import type { PlanLink, SharingProblem, SharingRules } from "./plan.ts";

/**
 * Every link the rules allow, ignoring levels: links on, a policy that has
 * them (uniform has none: a link makes a path one diode longer than its
 * source's), and exact. In order of source, then target.
 *
 * @example
 * linkPairs(problemFromLit(litRows("11", "01")), rules); // [{ from: 0, to: 1 }]
 */
export function linkPairs(p: SharingProblem, rules: Pick<SharingRules, "links" | "policy">): PlanLink[] {
  const out: PlanLink[] = [];
  if (!rules.links || rules.policy === "uniform") return out;
  for (let a = 0; a < p.m; a++) {
    const w = p.within[a];
    for (let b = 0; b < p.m; b++) if (w?.[b]) out.push({ from: a, to: b });
  }
  return out;
}

/** True when output a may drive output b through a link without a sneak path. */
export function linkFits(p: SharingProblem, a: number, b: number): boolean {
  return p.within[a]?.[b] === true;
}

/**
 * The states that may feed a bus driving `outputs`: those lighting every one
 * of them, ascending (Smax(T)). A bus fed by a subset of them is exact.
 *
 * @example
 * busStates(problemFromLit(litRows("11", "10", "11")), [0, 1]); // [0, 2]
 */
export function busStates(p: SharingProblem, outputs: readonly number[]): number[] {
  const s: number[] = [];
  for (let k = 0; k < p.n; k++) {
    const row = p.lit[k];
    if (outputs.every((o) => row?.[o] === true)) s.push(k);
  }
  return s;
}

/** Narrows `states` to those lighting output `o` (one step of growing T by o). */
export function statesLighting(p: SharingProblem, states: readonly number[], o: number): number[] {
  return states.filter((k) => p.lit[k]?.[o] === true);
}

/** True when a bus fed by `states` and driving `outputs` lights only lit cells. */
export function busFits(p: SharingProblem, states: readonly number[], outputs: readonly number[]): boolean {
  return states.every((k) => outputs.every((o) => p.lit[k]?.[o] === true));
}

/**
 * True when a bus of `states` x `outputs` costs fewer diodes (|S| + |T|) than
 * the direct diodes it replaces (|S| |T|), i.e. (|S| - 1)(|T| - 1) >= 2.
 * Under the mixed policy a bus that does not pay is never needed: its cells
 * can take direct diodes, for no more diodes and shorter paths.
 */
export function busPays(states: number, outputs: number): boolean {
  return (states - 1) * (outputs - 1) >= 2;
}

/** Least states a bus driving `outputs` outputs needs to pay (see `busPays`); Infinity for one output. */
export function statesToPay(outputs: number): number {
  return outputs < 2 ? Infinity : outputs === 2 ? 3 : 2;
}

/**
 * Level rules: which structures may feed an output at level `level` (the
 * longest path allowed into it under `mixed`, the one path length under
 * `per-segment` and `uniform`). Level 1 takes only direct diodes, level 2
 * adds buses and links from level-1 outputs, level 3 links from level-2
 * outputs. Buses are always fed by counter lines, so a bus path has two
 * diodes.
 */
export const levelRules = {
  /** May direct diodes feed an output at this level? */
  direct(rules: SharingRules, level: number): boolean {
    return rules.policy === "mixed" || level === 1;
  },
  /** May a bus (two diodes per path) feed an output at this level? */
  bus(rules: SharingRules, level: number): boolean {
    if (!rules.buses) return false;
    return rules.policy === "mixed" ? level >= 2 : level === 2;
  },
  /** May an output at `fromLevel` link into one at `toLevel`? */
  link(rules: SharingRules, fromLevel: number, toLevel: number): boolean {
    if (!rules.links || rules.policy === "uniform") return false;
    return rules.policy === "mixed" ? fromLevel < toLevel : fromLevel + 1 === toLevel;
  },
};
