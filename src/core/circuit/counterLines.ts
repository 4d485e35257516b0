/**
 * Which of the counter's lines are high in a state, and which nodes drive
 * the OR plane from them: the one place the circuit, the budget and the
 * starting guess read a state's levels from.
 *
 * A one-hot ring counter has one line per state, high only in its state. A
 * coded counter's stage line `Q<i>` is high where stage i is 1 in the
 * state's code and `nQ<i>` where it is 0; an AND gate's node is high where
 * every input line is high (its pull-up lifts it), and a gate's input
 * diodes (anode at the gate, cathode at a stage line) hold it low otherwise.
 */
import type { DiodeMatrix } from "../matrix/matrix.ts";
import { literalHigh, literalOf } from "../spec/counterCode.ts";

/** True for a coded matrix (it has stage lines and, usually, gates). */
export function isCoded(matrix: DiodeMatrix): boolean {
  return matrix.codes.length > 0;
}

/**
 * Every line the counter drives as a source, wired or not: a one-hot
 * counter's state lines `S<k>`, a coded counter's stage lines.
 */
export function allSourceLines(matrix: DiodeMatrix): readonly string[] {
  return isCoded(matrix) ? matrix.lines : matrix.states;
}

/** `sourceLines`' answers, per matrix (a sweep asks for every state). */
const wired = new WeakMap<DiodeMatrix, readonly string[]>();

/**
 * The counter's lines the circuit drives as sources (`allSourceLines`),
 * only those a diode meets. A line no diode meets carries no current and is
 * wired to nothing, so its source is left out of the circuit and the SPICE
 * deck: every state line of a sink-drive counter (it has only the
 * active-low lines `nS<k>`), the line of a state that lights nothing, a
 * stage line no gate reads.
 *
 * @example
 * sourceLines(sinkDriveMatrix); // [] (its diodes meet nS0..nS9 only)
 */
export function sourceLines(matrix: DiodeMatrix): readonly string[] {
  const known = wired.get(matrix);
  if (known !== undefined) return known;
  const met = new Set<string>();
  for (const d of matrix.diodes) met.add(d.from).add(d.to);
  const lines = allSourceLines(matrix).filter((l) => met.has(l));
  wired.set(matrix, lines);
  return lines;
}

/**
 * The counter's lines that are high in state `k` (0-based).
 *
 * @example
 * highLines(bcdMatrix, 3); // Set { "Q0", "Q1", "nQ2", "nQ3" }
 */
export function highLines(matrix: DiodeMatrix, k: number): Set<string> {
  if (!isCoded(matrix)) return new Set([matrix.states[k] as string]);
  const code = matrix.codes[k];
  if (code === undefined) throw new RangeError(`state index ${k} is outside 0..${matrix.codes.length - 1}`);
  const high = new Set<string>();
  for (const l of matrix.lines) {
    const lit = literalOf(l);
    if (lit === undefined) throw new Error(`bug: ${l} is not a stage line`);
    if (literalHigh(lit, code)) high.add(l);
  }
  return high;
}

/** The AND gates whose every input is high in state `k`. */
export function highGates(matrix: DiodeMatrix, k: number): Set<string> {
  const high = highLines(matrix, k);
  return new Set(matrix.gates.filter((g) => g.inputs.every((i) => high.has(i))).map((g) => g.ref));
}

/** The nodes that drive the OR plane high in state `k`: the high lines and the high gates. */
export function highDrivers(matrix: DiodeMatrix, k: number): Set<string> {
  return new Set([...highLines(matrix, k), ...highGates(matrix, k)]);
}

/** True for an AND gate's input diode (gate node to stage line), which is not on any path to an output. */
export function isGateInput(matrix: DiodeMatrix, d: { readonly from: string; readonly to: string }): boolean {
  return matrix.gates.some((g) => g.ref === d.from) && matrix.lines.includes(d.to);
}

/** The diodes of the OR plane (every diode but the gates' inputs), as a map from driving node to driven nodes. */
export function orPlane(matrix: DiodeMatrix): Map<string, string[]> {
  const gates = new Set(matrix.gates.map((g) => g.ref));
  const lines = new Set(matrix.lines);
  const next = new Map<string, string[]>();
  for (const d of matrix.diodes) {
    if (gates.has(d.from) && lines.has(d.to)) continue;
    const list = next.get(d.from);
    if (list) list.push(d.to);
    else next.set(d.from, [d.to]);
  }
  return next;
}
