/**
 * The circuit of a decoder with dark-decoded outputs, for one state: the
 * lit decoder's circuit (circuit.ts) with what dark decode adds, as
 * docs/electrical-model.md "Dark-decoded outputs" describes it:
 * - every active-low line `nS<k>` the matrix uses: a Thevenin source,
 *   `lowLine.low` volts in its own state and `lowLine.high` otherwise,
 *   behind `lowLine.resistance` (node `ns<k>`, source `ns<k>_v`);
 * - every dark-side diode turned round: anode on the node it pulls down;
 * - every dark-decoded output node `o<out>`: a pull-up to the logic supply
 *   (`RU<out>`), then its input network to the driver's input `i<out>`:
 *   the level-shift diodes (`DL<out>_<j>`, the matrix diode's model) or a
 *   divider's upper resistor (`RV<out>`); the output's pull-down moves to
 *   `i<out>`, where it is the shift diodes' bleed (or the divider's lower
 *   resistor), and the driver stage takes `i<out>` as its input.
 */
import type { DecodeSpec } from "../spec/decodeSpec.ts";
import { darkOutputs, darkSideDiodes, type DiodeMatrix } from "../matrix/matrix.ts";
import type { ElectricalModel } from "../project/project.ts";
import { buildCircuit, LOGIC_NODE, type Circuit, type CircuitElement } from "./circuit.ts";

/** The values of the dark outputs' input network. */
export interface DarkNetworkValues {
  /** Pull-up from the logic supply to each dark-decoded output node, ohms. */
  readonly pullUpOhms: number;
  /** Level-shift diodes per output (0 with a divider). */
  readonly shiftDiodes: number;
  /** A divider's upper resistor, ohms; null for level-shift diodes. */
  readonly dividerOhms: number | null;
}

/** The driver input node of a dark-decoded output. */
export function darkInputNode(output: string): string {
  return `i${output}`;
}

/**
 * Builds the circuit of state `stateIndex` of a matrix with dark-decoded
 * outputs. A matrix without any is built exactly as `buildCircuit` builds it.
 */
export function buildPolarityCircuit(
  spec: DecodeSpec,
  matrix: DiodeMatrix,
  model: ElectricalModel,
  stateIndex: number,
  values: DarkNetworkValues,
  design?: ReadonlyMap<string, number>,
): Circuit {
  const base = buildCircuit(spec, matrix, model, stateIndex, design);
  const dark = darkOutputs(matrix);
  if (dark.length === 0) return base;
  const darkSide = darkSideDiodes(matrix);
  const matrixDiodes = new Set(matrix.diodes.map((d) => d.ref));
  const moved = new Map(dark.map((o) => [`o${o}`, darkInputNode(o)]));
  const elements: CircuitElement[] = base.elements.map((el) => {
    if (el.kind === "diode" && darkSide.has(el.name)) return { ...el, anode: el.cathode, cathode: el.anode };
    if (el.kind === "diode" && matrixDiodes.has(el.name)) return el;
    // The output's pull-down and its driver stage move behind the input network.
    const out: Record<string, unknown> = {};
    for (const [k, v] of Object.entries(el)) out[k] = k !== "name" && typeof v === "string" ? (moved.get(v) ?? v) : v;
    return out as unknown as CircuitElement;
  });
  const nodes = [...base.nodes];
  const guess: Record<string, number> = { ...base.guess };
  const lineNodes: Record<string, string> = { ...base.lineNodes };
  const ll = model.lowLine;
  const used = new Set(matrix.diodes.map((d) => d.from));
  spec.polarity.activeLow.forEach((line, k) => {
    if (!used.has(line)) return;
    const node = line.toLowerCase();
    const src = `${node}_v`;
    const volts = k === stateIndex ? ll.low : ll.high;
    elements.push({ kind: "vsource", name: `V${line}`, node: src, volts });
    elements.push({ kind: "resistor", name: `R${line}`, role: "counter", a: src, b: node, ohms: ll.resistance });
    nodes.unshift(node, src);
    guess[node] = volts;
    guess[src] = volts;
    lineNodes[line] = node;
  });
  if (!elements.some((el) => el.kind === "vsource" && el.node === LOGIC_NODE)) {
    elements.push({ kind: "vsource", name: "VLOGIC", node: LOGIC_NODE, volts: model.logicSupply.volts });
    nodes.push(LOGIC_NODE);
    guess[LOGIC_NODE] = model.logicSupply.volts;
  }
  for (const o of dark) {
    const node = `o${o}`;
    const input = darkInputNode(o);
    elements.push({ kind: "resistor", name: `RU${o}`, role: "tie-on", a: LOGIC_NODE, b: node, ohms: values.pullUpOhms });
    if (values.dividerOhms !== null) {
      elements.push({ kind: "resistor", name: `RV${o}`, role: "base", a: node, b: input, ohms: values.dividerOhms });
    } else if (values.shiftDiodes === 0) {
      elements.push({ kind: "resistor", name: `RV${o}`, role: "base", a: node, b: input, ohms: 1e-3 });
    } else {
      let from = node;
      for (let j = 1; j <= values.shiftDiodes; j++) {
        const to = j === values.shiftDiodes ? input : `l${o}_${j}`;
        if (to !== input) {
          nodes.push(to);
          guess[to] = 0.5;
        }
        elements.push({
          kind: "diode",
          name: `DL${o}_${j}`,
          anode: from,
          cathode: to,
          isA: model.diode.is,
          n: model.diode.n,
          rsOhms: model.diode.rs,
        });
        from = to;
      }
    }
    nodes.push(input);
    guess[input] = guess[node] ?? 0.5;
  }
  const drivers = base.drivers.map((d) => (moved.has(d.inputNode) ? { ...d, inputNode: moved.get(d.inputNode) as string } : d));
  return { ...base, nodes, elements, drivers, guess, lineNodes };
}
