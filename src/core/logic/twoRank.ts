/**
 * Decoding in two ranks, as builders often do by hand: first one AND gate
 * per state (its fewest-literal decode, `isolatingLiterals`) to one line per
 * state, then the ring counter's matrix optimizer on those lines, as if they
 * were a one-hot counter's. `compare` and the app show it beside the
 * two-level decoder; the coded synthesizer also weighs it, since the
 * matrix's shared bus nodes can beat two-level logic where the depth limit
 * allows them.
 *
 * A variant merges states that light the same outputs: such a group is
 * decoded by as few products as cover it without touching another state,
 * and each product becomes one line of the matrix.
 */
import type { DecodeSpec } from "../spec/decodeSpec.ts";
import type { VerifiedMatrix } from "../matrix/matrix.ts";
import { fail, ok, type Result } from "../result/result.ts";
import type { SynthFailure, SynthSettings } from "../synth/synthesize.ts";
import type { LogicProblem } from "./logicProblem.ts";
import { literalLine } from "./logicProblem.ts";
import { isolatingLiterals, type StateSetNode } from "./implicants.ts";
import { logicMatrix, type LogicNode, type LogicPlan } from "./logicMatrix.ts";
import { verifyLogic } from "./verifyLogic.ts";
import { isSubset, setOf, statesOf, type StateSet } from "./stateSet.ts";

/** The ring counter's synthesizer, passed in (it is `synthesize` itself for a one-hot spec). */
export type OneHotSynth = (spec: DecodeSpec, settings: SynthSettings) => Promise<Result<VerifiedMatrix, SynthFailure>>;

/** A decoder built in two ranks, with its parts split by rank. */
export interface RankedDecoder {
  /** The whole decoder, verified as any coded decoder is. */
  readonly matrix: VerifiedMatrix;
  /** The matrix on the decoded lines, as the ring-counter optimizer returned it. */
  readonly lineMatrix: VerifiedMatrix;
  /** Diodes of the first rank (the AND gates' inputs). */
  readonly gateDiodes: number;
  /** Diodes of the second rank (the matrix). */
  readonly matrixDiodes: number;
}

/** One decoded line of the first rank: its literals and the states it is high in. */
export interface DecodedLine {
  readonly literals: readonly number[];
  readonly states: StateSet;
}

/**
 * One line per state: state k's fewest-literal decode.
 *
 * @example
 * stateLines(p)[1].literals; // 5-stage Johnson: [0, 3], Q0 nQ1
 */
export function stateLines(p: LogicProblem): DecodedLine[] {
  return Array.from({ length: p.size }, (_, k) => ({ literals: isolatingLiterals(p, k), states: setOf(p.size, [k]) }));
}

/**
 * Lines for states merged by what they light: each group of states with the
 * same lit outputs is covered greedily by products high in no state outside
 * it (most states first, then fewest literals, then walk order), every
 * state left over by its own decode. `nodes` are the walk's state sets.
 */
export function mergedLines(p: LogicProblem, spec: DecodeSpec, nodes: readonly StateSetNode[]): DecodedLine[] {
  const groups = new Map<string, number[]>();
  spec.lit.forEach((row, k) => {
    const key = row.map((x) => (x ? "1" : "0")).join("");
    groups.set(key, [...(groups.get(key) ?? []), k]);
  });
  const lines: DecodedLine[] = [];
  for (const [key, states] of groups) {
    if (!key.includes("1")) continue;
    const group = setOf(p.size, states);
    const inside = nodes.filter((n) => isSubset(n.states, group));
    const open = new Set(states);
    while (open.size > 0) {
      let best: StateSetNode | undefined;
      let bestGain = 0;
      for (const n of inside) {
        const gain = statesOf(n.states).filter((k) => open.has(k)).length;
        if (gain > bestGain || (gain === bestGain && gain > 0 && best !== undefined && n.literals.length < best.literals.length)) {
          best = n;
          bestGain = gain;
        }
      }
      if (best === undefined || bestGain <= 1) {
        for (const k of open) lines.push({ literals: isolatingLiterals(p, k), states: setOf(p.size, [k]) });
        break;
      }
      lines.push({ literals: best.literals, states: best.states });
      for (const k of statesOf(best.states)) open.delete(k);
    }
  }
  return lines.sort((a, b) => (statesOf(a.states)[0] ?? 0) - (statesOf(b.states)[0] ?? 0));
}

/**
 * Builds and verifies the decoder of `lines` (each the product of its
 * literals): the ring-counter optimizer finds the matrix on the lines, whose
 * rows are the lines' lit outputs; every line that drives a diode becomes
 * its gate (or, for one literal, the stage line itself).
 */
export async function rankedDecoder(
  spec: DecodeSpec,
  p: LogicProblem,
  allLines: readonly DecodedLine[],
  settings: SynthSettings,
  oneHot: OneHotSynth,
): Promise<Result<RankedDecoder, SynthFailure>> {
  // A line whose states light nothing drives no diode: it needs no gate and no row.
  const lines = allLines.filter((l) => (spec.lit[statesOf(l.states)[0] as number] ?? []).some(Boolean));
  const names = lines.map((_, i) => `S${i}`);
  const rows = lines.map((l) => {
    const k = statesOf(l.states)[0] as number;
    return spec.lit[k] ?? [];
  });
  const lineSpec: DecodeSpec = {
    ...spec,
    counter: { kind: "one-hot", stages: 0, codes: [] },
    states: names,
    lines: names,
    texts: lines.map((l) =>
      statesOf(l.states)
        .map((k) => spec.texts[k])
        .join(" / "),
    ),
    lit: rows,
  };
  const inner = await oneHot(lineSpec, settings);
  if (!inner.ok) return inner;
  const lineMatrix = inner.value;
  const gates: string[][] = [];
  const driver = new Map<string, LogicNode>();
  lines.forEach((l, i) => {
    const name = names[i] as string;
    if (!lineMatrix.diodes.some((d) => d.from === name)) return;
    const inputs = l.literals.map(literalLine);
    if (inputs.length >= 2) {
      driver.set(name, { gate: gates.length });
      gates.push(inputs);
    } else driver.set(name, { node: inputs[0] as string });
  });
  const plan: LogicPlan = {
    gates,
    edges: lineMatrix.diodes.map((d) => ({ from: driver.get(d.from) ?? { node: d.from }, to: d.to })),
  };
  const matrix = logicMatrix(spec, plan, {
    lowerBound: null,
    optimal: false,
    depthLimit: settings.depthLimit,
    policy: settings.policy,
    method: lineMatrix.method,
    deadlineHit: lineMatrix.deadlineHit,
  });
  const checked = verifyLogic(spec, matrix, settings);
  if (!checked.ok) {
    return fail({
      kind: "bug",
      message: "internal error: the two-rank decoder does not verify; please report it with the project file",
      details: checked.error,
    });
  }
  const gateDiodes = gates.reduce((a, g) => a + g.length, 0);
  return ok({ matrix: checked.value, lineMatrix, gateDiodes, matrixDiodes: lineMatrix.count });
}

/** True when some group of states lighting the same outputs holds two or more states. */
export function hasRepeatedRows(spec: DecodeSpec): boolean {
  const seen = new Set<string>();
  for (const row of spec.lit) {
    const key = row.map((x) => (x ? "1" : "0")).join("");
    if (seen.has(key)) return true;
    seen.add(key);
  }
  return false;
}
