/**
 * The decode spec of a coded counter as a multi-output logic problem: for
 * every output, the states that must light it (on-set) and the used states
 * that must leave it dark (off-set); codes the counter never reaches are
 * don't-cares. Every stage line (a literal) is the set of states it is high
 * in, so a term's states are the intersection of its literals' sets.
 */
import type { DecodeSpec } from "../spec/decodeSpec.ts";
import { literalHigh, literalName, type Literal } from "../spec/counterCode.ts";
import { setOf, type StateSet } from "./stateSet.ts";

export interface LogicProblem {
  /** Stages n; literals are numbered 0..2n-1 (see `literalIndex`). */
  readonly stages: number;
  /** Used states N (the counter's states). */
  readonly size: number;
  /** Per state, its code (highest stage leftmost). */
  readonly codes: readonly string[];
  /** The outputs the decoder drives, as in the spec. */
  readonly outputs: readonly string[];
  /** Per output, the states that light it. */
  readonly on: readonly StateSet[];
  /** Per output, the states that leave it dark. */
  readonly off: readonly StateSet[];
  /** Per literal index, the states it is high in. */
  readonly literalSets: readonly StateSet[];
}

/** Index of a literal: `Q<i>` is 2i, `nQ<i>` is 2i + 1 (the order of `stageLines`). */
export function literalIndex(l: Literal): number {
  return 2 * l.stage + (l.high ? 0 : 1);
}

/** The literal of an index. */
export function literalAt(index: number): Literal {
  return { stage: index >> 1, high: (index & 1) === 0 };
}

/** The stage line name of a literal index: `Q0`, `nQ0`, `Q1`, ... */
export function literalLine(index: number): string {
  return literalName(literalAt(index));
}

/**
 * The logic problem of a coded counter's spec.
 *
 * @example
 * const p = logicProblem(spec); // a BCD counter: 4 stages, 10 states
 * p.literalSets[0]; // the states with Q0 high: 1, 3, 5, 7, 9
 */
export function logicProblem(spec: DecodeSpec): LogicProblem {
  const { stages, codes } = spec.counter;
  if (spec.counter.kind === "one-hot") throw new Error("bug: logicProblem needs a coded counter");
  const size = codes.length;
  const states = codes.map((_, k) => k);
  const on = spec.outputs.map((_, j) =>
    setOf(
      size,
      states.filter((k) => spec.lit[k]?.[j] === true),
    ),
  );
  const off = spec.outputs.map((_, j) =>
    setOf(
      size,
      states.filter((k) => spec.lit[k]?.[j] !== true),
    ),
  );
  const literalSets: StateSet[] = [];
  for (let i = 0; i < 2 * stages; i++) {
    const l = literalAt(i);
    literalSets.push(
      setOf(
        size,
        states.filter((k) => literalHigh(l, codes[k] as string)),
      ),
    );
  }
  return { stages, size, codes, outputs: spec.outputs, on, off, literalSets };
}
