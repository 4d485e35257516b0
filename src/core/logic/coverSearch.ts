/**
 * Local search on a two-level cover: it takes a gate out, or all of one
 * output's connections, covers what is left open greedily again (gates
 * already placed cost only their OR diodes), and keeps the change when the
 * cover gets cheaper (diodes, then gates). Deterministic: the moves are
 * tried in a fixed order until a full round finds nothing or the work
 * budget is spent. It improves the greedy start where the exact model is
 * too big to finish.
 */
import { WorkMeter } from "../synth/workMeter.ts";
import type { LogicProblem } from "./logicProblem.ts";
import { feedableOutputs, termCost, type Term } from "./implicants.ts";
import { compareCovers, pruneCover, type Cover } from "./cover.ts";
import { intersect, isEmpty, setKey, setSize, statesOf, union, type StateSet } from "./stateSet.ts";

/** A cover as term indices into a family, each with the outputs it feeds. */
type Feeds = Map<number, Set<number>>;

/**
 * Improves `cover` by local search over `terms` (the cover's own terms are
 * added to the family when it lacks them).
 *
 * @example
 * const better = improveCover(p, family.terms, heuristicCover(p, family.terms, meter), new WorkMeter(1e7));
 */
export function improveCover(p: LogicProblem, familyTerms: readonly Term[], cover: Cover, meter: WorkMeter): Cover {
  const terms = [...familyTerms];
  const index = new Map(terms.map((t, i) => [setKey(t.states), i]));
  let feeds: Feeds = new Map();
  for (const t of cover) {
    const key = setKey(t.states);
    let i = index.get(key);
    if (i === undefined || terms[i]!.literals.length > t.literals.length) {
      i = terms.length;
      index.set(key, i);
      terms.push({ literals: t.literals, states: t.states, outputs: feedableOutputs(p, t.states) });
    }
    feeds.set(i, new Set([...(feeds.get(i) ?? []), ...t.feeds]));
  }
  let best: Cover = cover;
  let improved = true;
  while (improved && !meter.spent()) {
    improved = false;
    const moves: ((f: Feeds) => void)[] = [
      ...[...feeds.keys()].filter((t) => termCost(terms[t]!) > 0).map((t) => (f: Feeds) => void f.delete(t)),
      ...p.outputs.map((_, j) => (f: Feeds) => {
        for (const [t, outs] of f) {
          outs.delete(j);
          if (outs.size === 0) f.delete(t);
        }
      }),
    ];
    for (const move of moves) {
      if (meter.spent()) break;
      const trial: Feeds = new Map([...feeds].map(([t, outs]) => [t, new Set(outs)]));
      move(trial);
      if (!complete(p, terms, trial, meter)) continue;
      const candidate = pruneCover(p, toCover(terms, trial));
      if (compareCovers(candidate, best) < 0) {
        best = candidate;
        feeds = fromCover(index, candidate);
        improved = true;
      }
    }
  }
  return best;
}

function toCover(terms: readonly Term[], feeds: Feeds): Cover {
  return [...feeds]
    .filter(([, outs]) => outs.size > 0)
    .sort((a, b) => a[0] - b[0])
    .map(([t, outs]) => ({ literals: terms[t]!.literals, states: terms[t]!.states, feeds: [...outs].sort((a, b) => a - b) }));
}

function fromCover(index: ReadonlyMap<string, number>, cover: Cover): Feeds {
  return new Map(cover.map((t) => [index.get(setKey(t.states)) as number, new Set(t.feeds)]));
}

/** Covers every lit cell left open, greedily (see coverHeuristic.ts); false when the meter ran out. */
function complete(p: LogicProblem, terms: readonly Term[], feeds: Feeds, meter: WorkMeter): boolean {
  const open = p.on.map((on, j) => {
    const fed = [...feeds].filter(([, outs]) => outs.has(j)).map(([t]) => terms[t]!.states);
    const covered = union(p.size, fed);
    return on.map((w, i) => w & ~(covered[i] as number)) as StateSet;
  });
  let left = open.reduce((a, s) => a + setSize(s), 0);
  while (left > 0) {
    let best = -1;
    let bestGain = 0;
    let bestCost = 1;
    let bestOutputs: number[] = [];
    for (let t = 0; t < terms.length; t++) {
      const term = terms[t]!;
      if (meter.charge(1 + term.outputs.length)) return false;
      let gain = 0;
      const outs: number[] = [];
      for (const j of term.outputs) {
        if (isEmpty(open[j]!)) continue;
        const g = setSize(intersect(term.states, open[j]!));
        if (g > 0) {
          gain += g;
          outs.push(j);
        }
      }
      if (gain === 0) continue;
      const cost = (feeds.has(t) ? 0 : termCost(term)) + outs.length;
      if (
        best < 0 ||
        gain * bestCost > bestGain * cost ||
        (gain * bestCost === bestGain * cost && term.literals.length < terms[best]!.literals.length)
      ) {
        best = t;
        bestGain = gain;
        bestCost = cost;
        bestOutputs = outs;
      }
    }
    if (best < 0) throw new Error("bug: an open lit cell has no candidate term");
    const f = feeds.get(best) ?? new Set<number>();
    for (const j of bestOutputs) {
      f.add(j);
      const o = open[j]!;
      for (const k of statesOf(intersect(terms[best]!.states, o))) o[k >>> 5] = (o[k >>> 5] as number) & ~(1 << (k & 31));
    }
    feeds.set(best, f);
    left -= bestGain;
  }
  return true;
}
