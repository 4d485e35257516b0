/**
 * The counter's code table: which stage outputs are high in which state.
 *
 * A one-hot ring counter has one line per state (`S<k>`). A coded counter
 * has n stages (flip-flops); every stage offers its output `Q<i>` and its
 * complement `nQ<i>`, `Q0` the least significant. A state's code is written
 * as a bit string with the highest stage leftmost, as a binary number is:
 * for 5 stages `"00011"` has Q0 and Q1 high.
 */
import type { CounterCodeKind, CounterSection } from "../project/project.ts";

export interface CounterCode {
  readonly kind: CounterCodeKind;
  /** Stages (flip-flops); 0 for a one-hot ring counter, whose lines are its states. */
  readonly stages: number;
  /** Per state, its code, the highest stage leftmost; empty for one-hot. */
  readonly codes: readonly string[];
}

/** A stage output or its complement: the input of an AND gate or a one-literal term. */
export interface Literal {
  readonly stage: number;
  /** True for `Q<i>` (high when the stage is 1), false for `nQ<i>`. */
  readonly high: boolean;
}

/**
 * The code table of a validated counter section.
 *
 * @example
 * counterCode({ states: 6, drive: "source", code: "johnson", codes: [] }).codes;
 * // ["000", "001", "011", "111", "110", "100"]
 */
export function counterCode(counter: CounterSection): CounterCode {
  const n = counter.states;
  switch (counter.code) {
    case "one-hot":
      return { kind: "one-hot", stages: 0, codes: [] };
    case "johnson":
      return { kind: "johnson", stages: n / 2, codes: johnsonCodes(n) };
    case "binary":
      return { kind: "binary", stages: binaryStages(n), codes: binaryCodes(n) };
    case "custom":
      return { kind: "custom", stages: counter.codes[0]?.length ?? 0, codes: [...counter.codes] };
  }
}

/**
 * The states of a Johnson (twisted-ring) counter of `states / 2` stages:
 * state 0 is all zeros, and each step shifts every stage up by one and fills
 * Q0 with the complement of the top stage.
 *
 * @example
 * johnsonCodes(4); // ["00", "01", "11", "10"]
 */
export function johnsonCodes(states: number): string[] {
  if (!Number.isInteger(states) || states < 2 || states % 2 !== 0)
    throw new RangeError(`a Johnson counter has an even number of states, got ${states}`);
  const codes: string[] = [];
  let code = "0".repeat(states / 2);
  for (let k = 0; k < states; k++) {
    codes.push(code);
    code = code.slice(1) + (code[0] === "1" ? "0" : "1");
  }
  return codes;
}

/** Stages of a natural binary counter of `states` states: ceil(log2 states), at least 1. */
export function binaryStages(states: number): number {
  return Math.max(1, (states - 1).toString(2).length);
}

/**
 * Natural binary: state k has code k.
 *
 * @example
 * binaryCodes(3); // ["00", "01", "10"]
 */
export function binaryCodes(states: number): string[] {
  const n = binaryStages(states);
  return Array.from({ length: states }, (_, k) => k.toString(2).padStart(n, "0"));
}

/** True when stage `stage` is 1 in `code` (highest stage leftmost). */
export function stageBit(code: string, stage: number): boolean {
  return code[code.length - 1 - stage] === "1";
}

/** The line name of a literal: `Q3` or `nQ3`. */
export function literalName(l: Literal): string {
  return `${l.high ? "" : "n"}Q${l.stage}`;
}

/** The literal a stage line name stands for, or undefined for any other name. */
export function literalOf(name: string): Literal | undefined {
  const m = /^(n?)Q(\d+)$/.exec(name);
  return m ? { stage: Number(m[2]), high: m[1] === "" } : undefined;
}

/**
 * Every stage line of an n-stage counter, stage by stage: `Q0`, `nQ0`, `Q1`, `nQ1`, ...
 *
 * @example
 * stageLines(2); // ["Q0", "nQ0", "Q1", "nQ1"]
 */
export function stageLines(stages: number): string[] {
  const lines: string[] = [];
  for (let i = 0; i < stages; i++) lines.push(literalName({ stage: i, high: true }), literalName({ stage: i, high: false }));
  return lines;
}

/** True when the literal is high in the code. */
export function literalHigh(l: Literal, code: string): boolean {
  return stageBit(code, l.stage) === l.high;
}
