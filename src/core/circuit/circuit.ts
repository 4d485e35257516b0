/**
 * Stage "circuit" of the pipeline: verified matrix + electrical model -> one
 * netlist per active state, as plain data.
 *
 * The circuit (source drive), as docs/electrical-model.md describes it:
 * - counter line Sk: a Thevenin source, `counterOutput.high` volts when k is
 *   the active state and `counterOutput.low` otherwise, behind
 *   `counterOutput.resistance` ohms;
 * - matrix diodes anode = `from`, cathode = `to`, Shockley with `diode.is`,
 *   `diode.n` and series `diode.rs`;
 * - every driven output line: `pullDown` ohms to ground and the base of its
 *   own NPN; emitter to ground through its emitter resistor; collector fed
 *   from `supply.volts` through a string of `string.dies` identical dies;
 * - every tied-on output: the same driver and string, its base fed from
 *   `counterOutput.high` through a resistor of `counterOutput.resistance`
 *   ohms, plus the pull-down;
 * - never-lit outputs have no driver and are left out.
 *
 * Node names are SPICE-safe and lower case: counter line `s0`, its source
 * `s0_v`, bus `b1`, output line (= driver base) `o1a`, emitter `e1a`,
 * collector `c1a`, string supply `vsup`, tie-on source `vhi`; ground is `0`.
 * Element names and resistor values come from the designators
 * (`matrix/designators.ts`), so that a netlist and a BOM name the same parts
 * with the same values.
 */
import type { DecodeSpec } from "../spec/decodeSpec.ts";
import type { DiodeMatrix } from "../matrix/matrix.ts";
import { shockleyVoltage, thermalVoltage } from "./physics.ts";
import type { ElectricalModel } from "../project/project.ts";
import { designators, type DriverParts, type PartResistorRole } from "../matrix/designators.ts";

export const GROUND = "0";
export const SUPPLY_NODE = "vsup";
export const TIE_ON_NODE = "vhi";

/** A voltage source from `node` to ground. */
export interface VoltageSource {
  readonly kind: "vsource";
  readonly name: string;
  readonly node: string;
  readonly volts: number;
}

/** `counter`: the counter line's own source resistance (part of the counter, not a part to fit). */
export type ResistorRole = "counter" | PartResistorRole;

export interface Resistor {
  readonly kind: "resistor";
  readonly name: string;
  readonly role: ResistorRole;
  readonly a: string;
  readonly b: string;
  readonly ohms: number;
}

/** A matrix diode. */
export interface CircuitDiode {
  readonly kind: "diode";
  readonly name: string;
  readonly anode: string;
  readonly cathode: string;
  /** Saturation current, amperes. */
  readonly isA: number;
  readonly n: number;
  /** Series resistance, ohms. */
  readonly rsOhms: number;
}

/**
 * A display string: `dies` identical Shockley dies in series. They carry one
 * current, so each drops a `dies`-th of the string voltage and the string
 * behaves exactly like one diode with emission coefficient `dies * n` (and,
 * with SPICE's GMIN across every die, GMIN / dies across the string).
 */
export interface LedString {
  readonly kind: "string";
  readonly name: string;
  readonly anode: string;
  readonly cathode: string;
  readonly dies: number;
  /** Saturation current per die, amperes. */
  readonly isA: number;
  readonly n: number;
}

export interface Npn {
  readonly kind: "npn";
  readonly name: string;
  readonly collector: string;
  readonly base: string;
  readonly emitter: string;
  /** Transport saturation current, amperes. */
  readonly isA: number;
  readonly betaF: number;
  readonly betaR: number;
}

export type CircuitElement = VoltageSource | Resistor | CircuitDiode | LedString | Npn;

/** One output's driver stage: its parts (from the designators) and the nodes they join. */
export interface DriverStage extends DriverParts {
  readonly baseNode: string;
  readonly emitterNode: string;
  readonly collectorNode: string;
}

export interface Circuit {
  readonly state: string;
  readonly stateIndex: number;
  /** Temperature the saturation currents hold at, degrees Celsius. */
  readonly temperatureC: number;
  /**
   * Every node except ground, in the order the solver eliminates them best:
   * counter lines, sources, collectors, emitters, buses, output lines.
   */
  readonly nodes: readonly string[];
  readonly elements: readonly CircuitElement[];
  readonly drivers: readonly DriverStage[];
  /** Circuit node of each matrix line (state, bus or output name). */
  readonly lineNodes: Readonly<Record<string, string>>;
  /**
   * A starting point for the solver, volts per node: lines the active state
   * reaches sit half a volt lower per diode, lit emitters 0.6 V below their
   * base, lit collectors below the supply by the string's drop at the
   * target current. Only a guess; the solver finds the real values.
   */
  readonly guess: Readonly<Record<string, number>>;
}

/** Node of a matrix line: `S3` -> `s3`, `B1` -> `b1`, output `1a` -> `o1a`. */
export function lineNode(line: string, outputs: ReadonlySet<string>): string {
  return outputs.has(line) ? `o${line}` : line.toLowerCase();
}

/**
 * Builds the circuit of the state `stateIndex` (0-based) of a matrix.
 *
 * @param model the electrical model (a tolerance corner passes a changed copy)
 * @param trim optional emitter resistor values of the design, ohms, keyed by output (see `designators`)
 * @example
 * const c = buildCircuit(spec, matrix, project.electrical, 0);
 * c.elements.find((e) => e.name === "VS0"); // { kind: "vsource", node: "s0_v", volts: 2.4, ... }
 */
export function buildCircuit(
  spec: DecodeSpec,
  matrix: DiodeMatrix,
  model: ElectricalModel,
  stateIndex: number,
  trim?: ReadonlyMap<string, number>,
): Circuit {
  if (!Number.isInteger(stateIndex) || stateIndex < 0 || stateIndex >= matrix.states.length) {
    throw new RangeError(`state index ${stateIndex} is outside 0..${matrix.states.length - 1}`);
  }
  const outputs = new Set(matrix.outputs);
  const parts = designators(spec, matrix, model, trim);
  const tiedCount = parts.drivers.filter((d) => d.tiedOn).length;
  const co = model.counterOutput;
  const elements: CircuitElement[] = [];
  const lineNodes: Record<string, string> = {};
  for (const l of [...matrix.states, ...matrix.buses, ...matrix.outputs]) lineNodes[l] = lineNode(l, outputs);

  const lineOrder: string[] = [];
  const sourceOrder: string[] = [];
  matrix.states.forEach((s, k) => {
    const node = lineNode(s, outputs);
    const src = `${node}_v`;
    lineOrder.push(node);
    sourceOrder.push(src);
    elements.push({ kind: "vsource", name: `V${s}`, node: src, volts: k === stateIndex ? co.high : co.low });
    elements.push({ kind: "resistor", name: `R${s}`, role: "counter", a: src, b: node, ohms: co.resistance });
  });

  for (const d of matrix.diodes) {
    elements.push({
      kind: "diode",
      name: d.ref,
      anode: lineNode(d.from, outputs),
      cathode: lineNode(d.to, outputs),
      isA: model.diode.is,
      n: model.diode.n,
      rsOhms: model.diode.rs,
    });
  }

  const drivers: DriverStage[] = [];
  if (parts.drivers.length > 0) elements.push({ kind: "vsource", name: "VSUP", node: SUPPLY_NODE, volts: model.supply.volts });
  if (tiedCount > 0) elements.push({ kind: "vsource", name: "VHI", node: TIE_ON_NODE, volts: co.high });
  for (const p of parts.drivers) {
    const o = p.output;
    const stage: DriverStage = { ...p, baseNode: `o${o}`, emitterNode: `e${o}`, collectorNode: `c${o}` };
    drivers.push(stage);
    const base = stage.baseNode;
    if (p.tieOn !== null && p.tieOnOhms !== null) {
      elements.push({ kind: "resistor", name: p.tieOn, role: "tie-on", a: TIE_ON_NODE, b: base, ohms: p.tieOnOhms });
    }
    elements.push({ kind: "resistor", name: p.pullDown, role: "pull-down", a: base, b: GROUND, ohms: p.pullDownOhms });
    const dr = model.driver;
    const emitter = stage.emitterNode;
    const collector = stage.collectorNode;
    elements.push({ kind: "npn", name: p.transistor, collector, base, emitter, isA: dr.is, betaF: dr.betaF, betaR: dr.betaR });
    elements.push({ kind: "resistor", name: p.emitterResistor, role: "emitter", a: emitter, b: GROUND, ohms: p.emitterOhms });
    const st = model.string;
    elements.push({ kind: "string", name: p.display, anode: SUPPLY_NODE, cathode: collector, dies: st.dies, isA: st.is, n: st.n });
  }

  const nodes = [
    ...lineOrder,
    ...sourceOrder,
    ...(drivers.length > 0 ? [SUPPLY_NODE] : []),
    ...(tiedCount > 0 ? [TIE_ON_NODE] : []),
    ...drivers.map((d) => d.collectorNode),
    ...drivers.map((d) => d.emitterNode),
    ...matrix.buses.map((b) => lineNode(b, outputs)),
    ...drivers.map((d) => d.baseNode),
  ];
  return {
    guess: startingGuess(matrix, model, stateIndex, drivers, lineNodes),
    state: matrix.states[stateIndex] as string,
    stateIndex,
    temperatureC: model.temperatureC,
    nodes,
    elements,
    drivers,
    lineNodes,
  };
}

function startingGuess(
  matrix: DiodeMatrix,
  model: ElectricalModel,
  stateIndex: number,
  drivers: readonly DriverStage[],
  lineNodes: Readonly<Record<string, string>>,
): Record<string, number> {
  const co = model.counterOutput;
  const guess: Record<string, number> = { [GROUND]: 0, [SUPPLY_NODE]: model.supply.volts, [TIE_ON_NODE]: co.high };
  const depth = new Map<string, number>();
  const active = matrix.states[stateIndex] as string;
  depth.set(active, 0);
  const next = new Map<string, string[]>();
  for (const d of matrix.diodes) {
    const list = next.get(d.from);
    if (list) list.push(d.to);
    else next.set(d.from, [d.to]);
  }
  const queue = [active];
  while (queue.length > 0) {
    const l = queue.shift() as string;
    for (const t of next.get(l) ?? []) {
      if (!depth.has(t)) {
        depth.set(t, (depth.get(l) ?? 0) + 1);
        queue.push(t);
      }
    }
  }
  matrix.states.forEach((s, k) => (guess[`${lineNodes[s]}_v`] = k === stateIndex ? co.high : co.low));
  for (const [line, node] of Object.entries(lineNodes)) {
    const d = depth.get(line);
    guess[node] = d === undefined ? co.low : co.high - 0.5 * d;
  }
  const vt = thermalVoltage(model.temperatureC);
  const st = model.string;
  for (const dr of drivers) {
    const base = dr.tiedOn ? co.high : (guess[dr.baseNode] ?? co.low);
    guess[dr.baseNode] = base;
    const lit = base - co.low > 0.8;
    guess[dr.emitterNode] = lit ? base - 0.6 : 0;
    const stringA = lit ? st.targetA : 1e-10;
    guess[dr.collectorNode] = model.supply.volts - st.dies * shockleyVoltage(stringA, st.is, st.n, vt);
  }
  return guess;
}
