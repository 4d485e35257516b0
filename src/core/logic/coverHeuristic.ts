/**
 * A quick two-level decoder: greedy covers over the candidate terms, pruned,
 * and the one-gate-per-state decoder (every state's isolating term feeding
 * every output it lights) as a floor, so the result is never worse than
 * decoding every state on its own. It is the exact model's warm start and
 * the answer where the model does not run.
 *
 * Greedy: repeatedly take the term and outputs that cover the most lit
 * cells still open per diode added (a gate already placed costs only its
 * OR diodes), ties to fewer literals, then family order.
 */
import { WorkMeter } from "../synth/workMeter.ts";
import type { LogicProblem } from "./logicProblem.ts";
import { isolatingLiterals, statesOfLiterals, termCost, type Term } from "./implicants.ts";
import { compareCovers, pruneCover, type Cover, type CoverTerm } from "./cover.ts";
import { hasState, intersect, setSize, statesOf, type StateSet } from "./stateSet.ts";

/**
 * The one-gate-per-state decoder: state k's isolating term feeds every
 * output k lights. Always exact (codes are distinct).
 */
export function stateGateCover(p: LogicProblem): Cover {
  const cover: CoverTerm[] = [];
  for (let k = 0; k < p.size; k++) {
    const feeds = p.outputs.map((_, j) => j).filter((j) => hasState(p.on[j] as StateSet, k));
    if (feeds.length === 0) continue;
    const literals = isolatingLiterals(p, k);
    cover.push({ literals, states: statesOfLiterals(p, literals), feeds });
  }
  return cover;
}

/**
 * The best of the greedy cover and the one-gate-per-state cover.
 *
 * @example
 * const cover = heuristicCover(p, family.terms, new WorkMeter(1e7));
 * coverDiodes(cover); // 42 on BCD 0-9, before the exact model
 */
export function heuristicCover(p: LogicProblem, terms: readonly Term[], meter: WorkMeter): Cover {
  const floor = pruneCover(p, stateGateCover(p));
  const greedy = greedyCover(p, terms, meter);
  if (greedy === null) return floor;
  const pruned = pruneCover(p, greedy);
  return compareCovers(pruned, floor) <= 0 ? pruned : floor;
}

/** The greedy cover, or null when the meter ran out first. */
function greedyCover(p: LogicProblem, terms: readonly Term[], meter: WorkMeter): Cover | null {
  const open = p.on.map((s) => Uint32Array.from(s));
  let openCells = open.reduce((a, s) => a + setSize(s), 0);
  const feeds = new Map<number, Set<number>>();
  while (openCells > 0) {
    let best = -1;
    let bestGain = 0;
    let bestCost = 1;
    let bestOutputs: number[] = [];
    for (let t = 0; t < terms.length; t++) {
      const term = terms[t]!;
      let gain = 0;
      const outs: number[] = [];
      for (const j of term.outputs) {
        const g = setSize(intersect(term.states, open[j]!));
        if (g > 0) {
          gain += g;
          outs.push(j);
        }
      }
      if (meter.charge(1 + term.outputs.length)) return null;
      if (gain === 0) continue;
      const cost = (feeds.has(t) ? 0 : termCost(term)) + outs.length;
      // gain/cost > bestGain/bestCost, without division; ties to fewer literals, then the earlier term.
      const better =
        best < 0 ||
        gain * bestCost > bestGain * cost ||
        (gain * bestCost === bestGain * cost && term.literals.length < terms[best]!.literals.length);
      if (better) {
        best = t;
        bestGain = gain;
        bestCost = cost;
        bestOutputs = outs;
      }
    }
    if (best < 0) throw new Error("bug: an output's lit state has no candidate term");
    const term = terms[best]!;
    const f = feeds.get(best) ?? new Set<number>();
    for (const j of bestOutputs) {
      f.add(j);
      const left = open[j]!;
      for (const k of statesOf(intersect(term.states, left))) left[k >>> 5] = (left[k >>> 5] as number) & ~(1 << (k & 31));
    }
    feeds.set(best, f);
    openCells -= bestGain;
  }
  return [...feeds].map(([t, f]) => ({ literals: terms[t]!.literals, states: terms[t]!.states, feeds: [...f].sort((a, b) => a - b) }));
}
