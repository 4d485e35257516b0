/**
 * What the active-low side adds to a matrix's circuit (circuit.ts calls it
 * once the lit decoder's parts are in), as docs/electrical-model.md
 * "Dark-decoded outputs" describes it; a high-side switch's lit-decoded
 * outputs sit on the same side and take the same lines and turned diodes,
 * but no pull-up or network (the stage's own resistors pull the line up):
 * - every active-low line `nS<k>` the matrix uses: a Thevenin source,
 *   `lowLine.low` volts in its own state and `lowLine.high` otherwise,
 *   behind `lowLine.resistance` (node `ns<k>`, source `ns<k>_v`); these
 *   differ from state to state (`lowLineSources`);
 * - every dark-side diode turned round: anode on the node it pulls down;
 * - every dark-decoded output node `o<out>`: its pull-up from the logic
 *   supply, then its input network to the driver's input `i<out>`: the
 *   level-shift diodes (the matrix diode's model) or a divider's upper
 *   resistor; the output's pull-down moves to `i<out>`, where it is the
 *   shift diodes' bleed (or, with the divider's value, its lower resistor),
 *   and the driver stage takes `i<out>` as its input. Without diodes or
 *   divider the node is the driver's input.
 * Every part takes its designator and value from designators.ts.
 */
import type { DecodeSpec } from "../spec/decodeSpec.ts";
import { darkSideDiodes, type DiodeMatrix } from "../matrix/matrix.ts";
import type { CircuitModel, DarkInputParts, Designators } from "../matrix/designators.ts";
import { LOGIC_NODE } from "./circuitNodes.ts";
import type { CircuitElement, DriverStage } from "./circuit.ts";

export type { DarkNetworkValues } from "../matrix/designators.ts";

/** The driver input node of a dark-decoded output. */
export function darkInputNode(output: string): string {
  return `i${output}`;
}

/** True when a dark-decoded output has parts between its node and its driver. */
function hasNetwork(p: DarkInputParts): boolean {
  return p.divider !== null || p.shiftDiodes.length > 0;
}

/** An active-low line the matrix uses, and the state it is low in. */
export interface LowLine {
  readonly line: string;
  readonly stateIndex: number;
  /** Its node, `ns<k>` (its source's node is `ns<k>_v`). */
  readonly node: string;
}

/** The parts every state shares, before or after the dark side is added. */
export interface SharedParts {
  readonly shared: readonly CircuitElement[];
  readonly nodes: readonly string[];
  readonly drivers: readonly DriverStage[];
  readonly lineNodes: Readonly<Record<string, string>>;
}

/** The shared parts with the dark side, the active-low lines and the dark side's own nodes' starting guess. */
export interface DarkShared extends SharedParts {
  readonly lowLines: readonly LowLine[];
  /** Volts per node of the dark side that every state starts from. */
  readonly darkGuess: Readonly<Record<string, number>>;
}

/**
 * Adds the dark side to the parts every state shares. A matrix with no
 * dark-decoded output comes back as it was, with no active-low line.
 */
export function addDarkSide(lit: SharedParts, spec: DecodeSpec, matrix: DiodeMatrix, model: CircuitModel, parts: Designators): DarkShared {
  const darkSide = darkSideDiodes(matrix);
  if (parts.darkInputs.length === 0 && darkSide.size === 0) return { ...lit, lowLines: [], darkGuess: {} };
  const matrixDiodes = new Set(matrix.diodes.map((d) => d.ref));
  const moved = new Map(parts.darkInputs.filter(hasNetwork).map((p) => [`o${p.output}`, darkInputNode(p.output)]));
  const shared: CircuitElement[] = lit.shared.map((el) => {
    if (el.kind === "diode" && darkSide.has(el.name)) return { ...el, anode: el.cathode, cathode: el.anode };
    if (el.kind === "diode" && matrixDiodes.has(el.name)) return el;
    // The output's pull-down and its driver stage move behind the input network.
    const out: Record<string, unknown> = {};
    for (const [k, v] of Object.entries(el)) out[k] = k !== "name" && typeof v === "string" ? (moved.get(v) ?? v) : v;
    return out as unknown as CircuitElement;
  });
  const lowNodes: string[] = [];
  const darkNodes: string[] = [];
  const darkGuess: Record<string, number> = {};
  const lineNodes: Record<string, string> = { ...lit.lineNodes };
  const used = new Set(matrix.diodes.map((d) => d.from));
  const lowLines: LowLine[] = [];
  spec.polarity.activeLow.forEach((line, k) => {
    if (!used.has(line)) return;
    const node = line.toLowerCase();
    lowNodes.push(node, `${node}_v`);
    lineNodes[line] = node;
    lowLines.push({ line, stateIndex: k, node });
  });
  // The pull-ups hang from the logic supply (a high-side switch's lines need none: its own resistors pull them up).
  if (parts.darkInputs.length > 0 && !shared.some((el) => el.kind === "vsource" && el.node === LOGIC_NODE)) {
    shared.push({ kind: "vsource", name: "VLOGIC", node: LOGIC_NODE, volts: model.logicSupply.volts });
    darkNodes.push(LOGIC_NODE);
  }
  if (parts.darkInputs.length > 0) darkGuess[LOGIC_NODE] = model.logicSupply.volts;
  for (const p of parts.darkInputs) {
    const node = `o${p.output}`;
    const input = moved.get(node) ?? node;
    shared.push({ kind: "resistor", name: p.pullUp.ref, role: "pull-up", a: LOGIC_NODE, b: node, ohms: p.pullUp.ohms });
    if (p.divider !== null) {
      shared.push({ kind: "resistor", name: p.divider.ref, role: "divider", a: node, b: input, ohms: p.divider.ohms });
    } else {
      let from = node;
      p.shiftDiodes.forEach((ref, j) => {
        const to = j === p.shiftDiodes.length - 1 ? input : `l${p.output}_${j + 1}`;
        if (to !== input) {
          darkNodes.push(to);
          darkGuess[to] = 0.5;
        }
        shared.push({ kind: "diode", name: ref, anode: from, cathode: to, isA: model.diode.is, n: model.diode.n, rsOhms: model.diode.rs });
        from = to;
      });
    }
    if (input !== node) darkNodes.push(input);
  }
  const drivers = lit.drivers.map((d) => (moved.has(d.inputNode) ? { ...d, inputNode: moved.get(d.inputNode) as string } : d));
  return { shared, nodes: [...lowNodes, ...lit.nodes, ...darkNodes], drivers, lineNodes, lowLines, darkGuess };
}

/** The active-low lines' sources and resistors in state `stateIndex`: low in their own state, high otherwise. */
export function lowLineSources(lowLines: readonly LowLine[], model: CircuitModel, stateIndex: number): CircuitElement[] {
  const ll = model.lowLine;
  return lowLines.flatMap(({ line, stateIndex: k, node }): CircuitElement[] => [
    { kind: "vsource", name: `V${line}`, node: `${node}_v`, volts: k === stateIndex ? ll.low : ll.high },
    { kind: "resistor", name: `R${line}`, role: "counter", a: `${node}_v`, b: node, ohms: ll.resistance },
  ]);
}

/**
 * The starting guess of the dark side in state `stateIndex`, over the lit
 * side's: each active-low line at its open-circuit level, each dark-decoded
 * node pulled down a diode drop above the low level or up to the logic
 * supply, each driver input a little below its node.
 */
export function darkStateGuess(
  shared: DarkShared,
  model: CircuitModel,
  stateIndex: number,
  guess: Record<string, number>,
): Record<string, number> {
  if (shared.lowLines.length === 0) return guess;
  const ll = model.lowLine;
  for (const { node, stateIndex: k } of shared.lowLines) {
    guess[node] = k === stateIndex ? ll.low : ll.high;
    guess[`${node}_v`] = guess[node] as number;
  }
  Object.assign(guess, shared.darkGuess);
  for (const d of shared.drivers) {
    const node = `o${d.output}`;
    if (d.inputNode !== node) guess[d.inputNode] = guess[node] ?? 0.5;
  }
  return guess;
}
