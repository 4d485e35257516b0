/**
 * A lower bound on the diodes of any two-level decoder, whatever terms it
 * uses: it needs no candidate family, so it stays valid where the family
 * was cut short.
 *
 * - OR diodes: two lit states of an output that no single term can join
 *   (the smallest product of literals holding both codes, the literals their
 *   codes share, is high in a state that leaves the output dark) need two
 *   terms. A set of lit states no two of which can be joined, found
 *   greedily, needs one OR diode each: summed over the outputs.
 * - AND diodes: a lit state that no single stage line can feed (every
 *   literal high in it is also high in a state that leaves the output dark)
 *   needs a gate; such states no two of which one term can join need a gate
 *   each, of at least two diodes. The largest such set over the outputs
 *   counts, since gates may be shared between outputs.
 */
import type { LogicProblem } from "./logicProblem.ts";
import { statesOfLiterals } from "./implicants.ts";
import { disjoint, hasState, statesOf, type StateSet } from "./stateSet.ts";
import { WorkMeter } from "../synth/workMeter.ts";

/**
 * @example
 * twoLevelFloor(p); // 33 on BCD 0-9 (its minimum is 40)
 */
export function twoLevelFloor(p: LogicProblem, meter: WorkMeter = new WorkMeter(Infinity)): number {
  let orDiodes = 0;
  let gates = 0;
  p.outputs.forEach((_, j) => {
    const off = p.off[j] as StateSet;
    const joinable = (a: number, b: number): boolean => {
      meter.charge(p.stages);
      const shared = p.literalSets.map((_, li) => li).filter((li) => hasState(p.literalSets[li]!, a) && hasState(p.literalSets[li]!, b));
      return disjoint(statesOfLiterals(p, shared), off);
    };
    const lit = statesOf(p.on[j]!);
    const needGate = lit.filter((k) => !p.literalSets.some((s) => hasState(s, k) && disjoint(s, off)));
    orDiodes += meter.spent() ? Math.min(1, lit.length) : apart(lit, joinable, meter);
    gates = Math.max(gates, meter.spent() ? Math.min(1, needGate.length) : apart(needGate, joinable, meter));
  });
  return orDiodes + 2 * gates;
}

/** Size of a set of states no two of which are joinable, built greedily in state order. */
function apart(states: readonly number[], joinable: (a: number, b: number) => boolean, meter: WorkMeter): number {
  const chosen: number[] = [];
  for (const k of states) {
    if (meter.spent()) break;
    if (chosen.every((c) => !joinable(c, k))) chosen.push(k);
  }
  return chosen.length;
}
