/**
 * The diode matrix: counter lines, bus nodes and output lines joined by
 * diodes. `from` is the driving end of a diode (the anode, for source drive).
 *
 * A one-hot ring counter drives it from its state lines `S<k>`. A coded
 * counter (Johnson, binary, custom) drives it from its stage lines `Q<i>` and
 * `nQ<i>` through diode AND gates (`gates`): a gate's node has a pull-up and
 * one diode to each input line (anode at the gate node), and drives the OR
 * plane like a line. For a one-hot counter `gates` is empty.
 */
import type { DecodeSpec } from "../spec/decodeSpec.ts";
import type { DarkInput, DepthPolicy } from "../project/project.ts";
import type { OutputPolarity } from "../spec/decodeSpec.ts";
import { diodeRef } from "./designators.ts";

export const MATRIX_SCHEMA = "diodeloom/matrix@3";

/** A diode AND gate of a coded counter's decoder: its node is high only when every input line is high. */
export interface Gate {
  /** Reference designator and node name, `G1`.. */
  readonly ref: string;
  /** The stage lines it ANDs (`Q0`, `nQ2`), in line order; two or more. */
  readonly inputs: readonly string[];
}

export interface Diode {
  /** Reference designator, `D1`.. in assembly order. */
  readonly ref: string;
  /** Driving end (anode for source drive): a counter line, gate, bus or output line. */
  readonly from: string;
  /** Driven end (cathode for source drive): a bus or output line, or a gate's input line. */
  readonly to: string;
}

export type SynthesisMethod = "direct" | "heuristic" | "exact";

/**
 * The parts between the dark-decoded output nodes and their drivers, counted
 * apart from the matrix: each such output has a pull-up to the logic supply
 * and either level-shift diodes in series with its driver's input or a
 * two-resistor divider.
 */
export interface InputNetwork {
  readonly kind: DarkInput;
  /** Dark-decoded outputs it serves (each with one pull-up resistor). */
  readonly outputs: number;
  /** Level-shift diodes in all. */
  readonly diodes: number;
  /** Divider resistors in all (the pull-ups besides). */
  readonly resistors: number;
}

export interface DiodeMatrix {
  readonly schema: typeof MATRIX_SCHEMA;
  /** The counter's states, `S0`.., in counting order. */
  readonly states: readonly string[];
  /**
   * Per state, its code (the highest stage leftmost) for a coded counter;
   * empty for a one-hot one.
   */
  readonly codes: readonly string[];
  /** The counter lines that drive the matrix: the state lines, or every stage line `Q0`, `nQ0`, `Q1`, ... */
  readonly lines: readonly string[];
  /** The AND gates of a coded counter's decoder, `G1`..; empty for a one-hot counter. */
  readonly gates: readonly Gate[];
  /**
   * The designator prefix of one decoder of an instrument of several
   * (`2`: its parts are `2D1`, `2R3`, `2Q1`, `2DS1`; see `withRefPrefix` in
   * designators.ts); absent for a single decoder.
   */
  readonly refPrefix?: string;
  readonly outputs: readonly string[];
  readonly buses: readonly string[];
  readonly diodes: readonly Diode[];
  readonly tiedOn: readonly string[];
  /** Diodes among the lines, buses and output nodes (the input network's are counted apart). */
  readonly count: number;
  /**
   * Per output, the polarity it is decoded in; absent when every output is
   * decoded lit (a dark-decoded output's diodes have their cathode at the
   * driving end, `from`).
   */
  readonly decode?: Readonly<Record<string, OutputPolarity>>;
  /** The dark-decoded outputs' input network; absent when no output is decoded dark. */
  readonly inputNetwork?: InputNetwork;
  /**
   * Proven lower bound on the diodes the optimizer counts (`matrixObjective`:
   * the matrix's, plus the input network's), or null when none was proven.
   */
  readonly lowerBound: number | null;
  /** True when `matrixObjective` is proven minimal under the limit and policy. */
  readonly optimal: boolean;
  /**
   * Longest path in this matrix, in diodes, from a driving node to an
   * output: from a counter line, or for a coded counter from a gate node or
   * a stage line (the gate's own input diodes hold it low and are not on
   * that path, so two-level decoding has paths of one diode).
   */
  readonly longestPath: number;
  /** The depth limit it was built under (counted as `longestPath` is). */
  readonly depthLimit: number;
  readonly policy: DepthPolicy;
  readonly method: SynthesisMethod;
  /**
   * True when the clock (the time limit) stopped the optimizer before its
   * work budget ran out. The work budgets come from the configured limit, so
   * the same settings give the same matrix and bound on any machine, except
   * in such a run: another run may then differ.
   */
  readonly deadlineHit: boolean;
}

/** A matrix that `verifyMatrix` has proven correct against its spec. */
export type VerifiedMatrix = DiodeMatrix & { readonly verified: true };

export interface Edge {
  readonly from: string;
  readonly to: string;
}

export interface MatrixMeta {
  readonly lowerBound: number | null;
  readonly optimal: boolean;
  readonly depthLimit: number;
  readonly policy: DepthPolicy;
  readonly method: SynthesisMethod;
  /** See `DiodeMatrix.deadlineHit`; false when left out. */
  readonly deadlineHit?: boolean;
}

/**
 * The diodes the optimizer minimises: the matrix's `count` plus the
 * input network's level-shift diodes (the count alone when every output is
 * decoded lit).
 */
export function matrixObjective(m: Pick<DiodeMatrix, "count" | "inputNetwork">): number {
  return m.count + (m.inputNetwork?.diodes ?? 0);
}

/** The polarity of an output of a matrix (lit unless its `decode` says dark). */
export function outputDecode(m: Pick<DiodeMatrix, "decode">, output: string): OutputPolarity {
  return m.decode?.[output] ?? "lit";
}

/** The dark-decoded outputs of a matrix, in output order. */
export function darkOutputs(m: Pick<DiodeMatrix, "decode" | "outputs">): string[] {
  return m.outputs.filter((o) => m.decode?.[o] === "dark");
}

/**
 * The diodes on the active-low side of a matrix: every diode reached from an
 * active-low line (`nS<k>`) along the diodes (through the buses it feeds
 * and the links of the outputs it pulls down), and every diode into a
 * dark-decoded output. Their driving end (`from`) is the cathode; every
 * other diode's is the anode. A dark-decoded output of an NPN driver sits
 * on this side, and so does a lit-decoded output of a high-side switch.
 */
export function darkSideDiodes(m: Pick<DiodeMatrix, "decode" | "outputs" | "diodes" | "buses">): ReadonlySet<string> {
  const dark = new Set(darkOutputs(m));
  const lowLine = (n: string): boolean => /^nS\d+$/.test(n);
  const out = new Map<string, (typeof m.diodes)[number][]>();
  for (const d of m.diodes) out.set(d.from, [...(out.get(d.from) ?? []), d]);
  const side = new Set<string>();
  const reached = new Set<string>();
  const stack = [...new Set(m.diodes.map((d) => d.from).filter(lowLine))];
  while (stack.length > 0) {
    const x = stack.pop() as string;
    for (const d of out.get(x) ?? []) {
      side.add(d.ref);
      if (!reached.has(d.to)) {
        reached.add(d.to);
        stack.push(d.to);
      }
    }
  }
  for (const d of m.diodes) if (dark.has(d.to)) side.add(d.ref);
  return side;
}

/** Bus node name (1-based). */
export function busName(i: number): string {
  return `B${i}`;
}

/**
 * Builds a matrix from bare edges: renumbers the buses that are used in order
 * of first use, orders the diodes for assembly (counter lines first, in state
 * order, then buses, then output links) and gives them references D1...
 * (`diodeRef`)
 */
export function buildMatrix(spec: DecodeSpec, edges: readonly Edge[], meta: MatrixMeta): DiodeMatrix {
  const stateIdx = new Map(spec.states.map((s, i) => [s, i]));
  const outIdx = new Map(spec.outputs.map((o, i) => [o, i]));
  const busOrder = new Map<string, number>();
  const sortedByState = [...edges].sort((a, b) => (stateIdx.get(a.from) ?? 1e9) - (stateIdx.get(b.from) ?? 1e9));
  for (const e of sortedByState) {
    for (const n of [e.from, e.to]) {
      if (!stateIdx.has(n) && !outIdx.has(n) && !busOrder.has(n)) busOrder.set(n, busOrder.size);
    }
  }
  const rename = new Map<string, string>();
  for (const [old, i] of busOrder) rename.set(old, busName(i + 1));
  const nameOf = (n: string): string => rename.get(n) ?? n;

  const rank = (n: string): number => {
    const s = stateIdx.get(n);
    if (s !== undefined) return s;
    const b = busOrder.get(n);
    if (b !== undefined) return 1e6 + b;
    return 2e6 + (outIdx.get(n) ?? 0);
  };
  const ordered = [...edges].sort((a, b) => rank(a.from) - rank(b.from) || rank(a.to) - rank(b.to));
  const diodes = ordered.map((e, i) => ({ ref: diodeRef(i), from: nameOf(e.from), to: nameOf(e.to) }));
  return {
    schema: MATRIX_SCHEMA,
    states: spec.states,
    codes: spec.counter.codes,
    lines: spec.lines,
    gates: [],
    outputs: spec.outputs,
    buses: [...busOrder.keys()].map(nameOf),
    diodes,
    tiedOn: spec.tiedOn,
    count: diodes.length,
    lowerBound: meta.lowerBound,
    optimal: meta.optimal,
    longestPath: longestPath(diodes, new Set(spec.states)),
    depthLimit: meta.depthLimit,
    policy: meta.policy,
    method: meta.method,
    deadlineHit: meta.deadlineHit ?? false,
  };
}

/** Longest path, in diodes, from any counter line; assumes an acyclic graph. */
function longestPath(diodes: readonly Edge[], states: ReadonlySet<string>): number {
  const out = new Map<string, string[]>();
  for (const d of diodes) out.set(d.from, [...(out.get(d.from) ?? []), d.to]);
  const memo = new Map<string, number>();
  const depthFrom = (n: string, guard: number): number => {
    const m = memo.get(n);
    if (m !== undefined) return m;
    if (guard > diodes.length) return 0;
    let best = 0;
    for (const t of out.get(n) ?? []) best = Math.max(best, 1 + depthFrom(t, guard + 1));
    memo.set(n, best);
    return best;
  };
  let best = 0;
  for (const s of states) best = Math.max(best, depthFrom(s, 0));
  return best;
}
