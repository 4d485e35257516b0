/**
 * Stage "circuit" of the pipeline: verified matrix + electrical model -> one
 * netlist per active state, as plain data.
 *
 * The circuit (source drive), as docs/electrical-model.md describes it:
 * - counter line Sk: a Thevenin source, `counterOutput.high` volts behind
 *   `counterOutput.resistance` ohms when k is the active state, else
 *   `counterOutput.low` volts behind `counterOutput.lowResistance` ohms;
 * - a coded counter's stage lines `Q<i>` and `nQ<i>` instead: the same
 *   sources, high where the state's code makes the line high
 *   (counterLines.ts), and every AND gate node `G<j>` pulled up from the
 *   logic supply through `gatePullUp` ohms, its input diodes (anode at the
 *   gate, cathode at the stage line) and its OR diodes among the matrix
 *   diodes;
 * - matrix diodes anode = `from`, cathode = `to`, Shockley with `diode.is`,
 *   `diode.n` and series `diode.rs`;
 * - every driven output line: `pullDown` ohms to ground (for a high-side
 *   switch, to the segment supply), then the driver stage of `driver.kind`
 *   (driverStage.ts: one builder per kind) with its segment of
 *   `segment.leds` LEDs;
 * - every tied-on output: the same, its line held up from the logic supply
 *   (`logicSupply.volts`, a real rail) through a resistor of
 *   `counterOutput.resistance` ohms (a high-side switch's held down to ground);
 * - never-lit outputs have no driver and are left out;
 * - where outputs are decoded dark, the active-low lines, the pull-ups and
 *   the input networks (polarityCircuit.ts), with the values of
 *   `model.darkNetwork`.
 *
 * Node names are SPICE-safe and lower case: counter line `s0` (stage lines
 * `q0`, `nq0`), its source `s0_v`, gate `g1`, bus `b1`, output line `o1a`; a stage's own nodes carry the output
 * (`b1a` base, `e1a` emitter, `c1a` collector, `k1a` and `a1a` the
 * segment's cathode and anode pins where a resistor sits between); the
 * segment supply `vsup`, the logic supply `vlogic`; ground is `0`. Element
 * names and resistor values come from the designators
 * (`matrix/designators.ts`), so that a netlist and a BOM name the same parts
 * with the same values.
 */
import type { DecodeSpec } from "../spec/decodeSpec.ts";
import { darkSideDiodes, type DiodeMatrix } from "../matrix/matrix.ts";
import type { ElectricalModel } from "../project/project.ts";
import { designators, type CircuitModel, type DriverParts, type PartResistorRole } from "../matrix/designators.ts";
import { addDarkSide, darkStateGuess, lowLineSources, type LowLine } from "./polarityCircuit.ts";
import { GROUND, LOGIC_NODE, SUPPLY_NODE } from "./circuitNodes.ts";
import { driverStage, type StageNodes } from "./driverStage.ts";
import { highDrivers, highLines, orPlane, sourceLines } from "./counterLines.ts";

export { GROUND, LOGIC_NODE, SUPPLY_NODE } from "./circuitNodes.ts";

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
 * A segment: `leds` identical Shockley LEDs in series, each with a series
 * resistance. They carry one current, so each drops a `leds`-th of the
 * segment voltage and the segment behaves exactly like one diode with
 * emission coefficient `leds * n` in series with `leds * rs` (and, with
 * SPICE's GMIN across every junction, GMIN / leds across the junctions).
 */
export interface LedSegment {
  readonly kind: "segment";
  readonly name: string;
  readonly anode: string;
  readonly cathode: string;
  readonly leds: number;
  /** Saturation current per LED, amperes. */
  readonly isA: number;
  readonly n: number;
  /** Series resistance per LED, ohms. */
  readonly rsOhms: number;
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

/** A PNP (the high-side switch): the NPN's parameters, every junction turned round. */
export interface Pnp extends Omit<Npn, "kind"> {
  readonly kind: "pnp";
}

export type CircuitElement = VoltageSource | Resistor | CircuitDiode | LedSegment | Npn | Pnp;

/** One output's driver stage: its parts (from the designators) and the nodes they join. */
export interface DriverStage extends DriverParts, StageNodes {
  /** The output line, the matrix's end of the stage (`o1a`). */
  readonly inputNode: string;
}

export interface Circuit {
  readonly state: string;
  readonly stateIndex: number;
  /** Temperature the saturation currents hold at, degrees Celsius. */
  readonly temperatureC: number;
  /**
   * Every node except ground, in the order the solver eliminates them best:
   * counter lines, sources, supplies, the stages' own nodes, gates, buses, output lines.
   */
  readonly nodes: readonly string[];
  readonly elements: readonly CircuitElement[];
  readonly drivers: readonly DriverStage[];
  /** Circuit node of each matrix line (state or stage line, gate, bus or output name). */
  readonly lineNodes: Readonly<Record<string, string>>;
  /**
   * A starting point for the solver, volts per node: lines the state's high
   * lines and gates reach sit half a volt lower per diode, a low gate a
   * diode drop above the low level, each stage's nodes where a lit
   * (or dark) stage of its kind puts them at the target current. Only a
   * guess; the solver finds the real values.
   */
  readonly guess: Readonly<Record<string, number>>;
}

/** Node of a matrix line: `S3` -> `s3`, `nQ2` -> `nq2`, `G1` -> `g1`, `B1` -> `b1`, output `1a` -> `o1a`. */
export function lineNode(line: string, outputs: ReadonlySet<string>): string {
  return outputs.has(line) ? `o${line}` : line.toLowerCase();
}

/**
 * The parts of a matrix's circuit that every state shares: the matrix
 * diodes, the supplies, the gates' pull-ups and the driver stages, with
 * their nodes. Only the counter lines' sources (high or low) and the
 * starting guess differ from state to state, so a sweep over the states
 * builds this once and `stateCircuit` adds the rest per state.
 */
export interface CircuitFrame {
  readonly matrix: DiodeMatrix;
  readonly model: CircuitModel;
  /** Every element after the counter lines' sources and resistors, in the order a state's circuit lists them. */
  readonly shared: readonly CircuitElement[];
  readonly nodes: readonly string[];
  readonly drivers: readonly DriverStage[];
  readonly lineNodes: Readonly<Record<string, string>>;
  /** The active-low lines a dark decode uses, whose sources differ from state to state; empty when no output is decoded dark. */
  readonly lowLines: readonly LowLine[];
  /** The starting guess of the dark side's own nodes, volts. */
  readonly darkGuess: Readonly<Record<string, number>>;
}

/**
 * The parts every state of a matrix shares (see `CircuitFrame`).
 *
 * @param model the electrical model (a tolerance corner passes a changed copy)
 * @param design optional values of the resistors that set each output's current, ohms, keyed by output (see `designators`)
 * @example
 * const frame = circuitFrame(spec, matrix, project.electrical);
 * const circuits = matrix.states.map((_, k) => stateCircuit(frame, k));
 */
export function circuitFrame(
  spec: DecodeSpec,
  matrix: DiodeMatrix,
  model: CircuitModel,
  design?: ReadonlyMap<string, number>,
): CircuitFrame {
  const outputs = new Set(matrix.outputs);
  const parts = designators(spec, matrix, model, design);
  const tiedCount = parts.drivers.filter((d) => d.tiedOn).length;
  const shared: CircuitElement[] = [];
  const lineNodes: Record<string, string> = {};
  for (const l of [...sourceLines(matrix), ...matrix.buses, ...matrix.outputs]) lineNodes[l] = lineNode(l, outputs);

  for (const g of matrix.gates) lineNodes[g.ref] = lineNode(g.ref, outputs);

  for (const d of matrix.diodes) {
    shared.push({
      kind: "diode",
      name: d.ref,
      anode: lineNode(d.from, outputs),
      cathode: lineNode(d.to, outputs),
      isA: model.diode.is,
      n: model.diode.n,
      rsOhms: model.diode.rs,
    });
  }

  const stage = driverStage(model.driver.kind);
  const usesSupply = parts.drivers.length > 0 && stage.usesSupply;
  if (usesSupply) shared.push({ kind: "vsource", name: "VSUP", node: SUPPLY_NODE, volts: model.supply.volts });
  const usesLogic = (tiedCount > 0 && model.driver.kind !== "high-side-switch") || parts.gates.length > 0;
  if (usesLogic) shared.push({ kind: "vsource", name: "VLOGIC", node: LOGIC_NODE, volts: model.logicSupply.volts });
  for (const g of parts.gates) {
    shared.push({
      kind: "resistor",
      name: g.pullUp.ref,
      role: "gate-pull-up",
      a: LOGIC_NODE,
      b: lineNode(g.gate, outputs),
      ohms: g.pullUp.ohms,
    });
  }
  const drivers: DriverStage[] = [];
  const stageNodes: string[] = [];
  for (const p of parts.drivers) {
    const input = `o${p.output}`;
    // A high-side switch is held on by a line pulled low, and off by its pull-up to the supply.
    const pnp = p.kind === "high-side-switch";
    if (p.tieOn !== null) {
      const [a, b] = pnp ? [input, GROUND] : [LOGIC_NODE, input];
      shared.push({ kind: "resistor", name: p.tieOn.ref, role: "tie-on", a, b, ohms: p.tieOn.ohms });
    }
    const [a, b] = p.pullDown.role === "line-pull-up" ? [SUPPLY_NODE, input] : [input, GROUND];
    shared.push({ kind: "resistor", name: p.pullDown.ref, role: p.pullDown.role, a, b, ohms: p.pullDown.ohms });
    const built = stage.build({ parts: p, model, input });
    shared.push(...built.elements);
    stageNodes.push(...built.ownNodes);
    drivers.push({ ...p, ...built.nodes, inputNode: input });
  }

  const lines = sourceLines(matrix).map((l) => lineNode(l, outputs));
  const nodes = [
    ...lines,
    ...matrix.gates.map((g) => lineNode(g.ref, outputs)),
    ...lines.map((node) => `${node}_v`),
    ...(usesSupply ? [SUPPLY_NODE] : []),
    ...(usesLogic ? [LOGIC_NODE] : []),
    ...stageNodes,
    ...matrix.buses.map((b) => lineNode(b, outputs)),
    ...drivers.map((d) => d.inputNode),
  ];
  return { matrix, model, ...addDarkSide({ shared, nodes, drivers, lineNodes }, spec, matrix, model, parts) };
}

/**
 * The circuit of the state `stateIndex` (0-based) on a frame: the counter
 * lines' sources, high or low as the state sets them, then the frame's
 * shared parts.
 */
export function stateCircuit(frame: CircuitFrame, stateIndex: number): Circuit {
  const { matrix, model, lineNodes } = frame;
  if (!Number.isInteger(stateIndex) || stateIndex < 0 || stateIndex >= matrix.states.length) {
    throw new RangeError(`state index ${stateIndex} is outside 0..${matrix.states.length - 1}`);
  }
  const co = model.counterOutput;
  const high = highLines(matrix, stateIndex);
  const elements: CircuitElement[] = [];
  for (const l of sourceLines(matrix)) {
    const node = lineNodes[l] as string;
    const src = `${node}_v`;
    elements.push({ kind: "vsource", name: `V${l}`, node: src, volts: high.has(l) ? co.high : co.low });
    const ohms = high.has(l) ? co.resistance : co.lowResistance;
    elements.push({ kind: "resistor", name: `R${l}`, role: "counter", a: src, b: node, ohms });
  }
  for (const el of lowLineSources(frame.lowLines, model, stateIndex)) elements.push(el);
  for (const el of frame.shared) elements.push(el);
  return {
    guess: darkStateGuess(frame, model, stateIndex, startingGuess(matrix, model, stateIndex, frame.drivers, lineNodes)),
    state: matrix.states[stateIndex] as string,
    stateIndex,
    temperatureC: model.temperatureC,
    nodes: frame.nodes,
    elements,
    drivers: frame.drivers,
    lineNodes,
  };
}

/**
 * Builds the circuit of the state `stateIndex` (0-based) of a matrix. A
 * sweep over every state builds the frame once instead (`circuitFrame`,
 * `stateCircuit`); the circuits are the same.
 *
 * @param model the electrical model (a tolerance corner passes a changed copy)
 * @param design optional values of the resistors that set each output's current, ohms, keyed by output (see `designators`)
 * @example
 * const c = buildCircuit(spec, matrix, project.electrical, 0);
 * c.elements.find((e) => e.name === "VS0"); // { kind: "vsource", node: "s0_v", volts: 5, ... }
 */
export function buildCircuit(
  spec: DecodeSpec,
  matrix: DiodeMatrix,
  model: CircuitModel,
  stateIndex: number,
  design?: ReadonlyMap<string, number>,
): Circuit {
  if (!Number.isInteger(stateIndex) || stateIndex < 0 || stateIndex >= matrix.states.length) {
    throw new RangeError(`state index ${stateIndex} is outside 0..${matrix.states.length - 1}`);
  }
  return stateCircuit(circuitFrame(spec, matrix, model, design), stateIndex);
}

function startingGuess(
  matrix: DiodeMatrix,
  model: ElectricalModel,
  stateIndex: number,
  drivers: readonly DriverStage[],
  lineNodes: Readonly<Record<string, string>>,
): Record<string, number> {
  const co = model.counterOutput;
  const guess: Record<string, number> = { [GROUND]: 0, [SUPPLY_NODE]: model.supply.volts, [LOGIC_NODE]: model.logicSupply.volts };
  const high = highLines(matrix, stateIndex);
  const start = highDrivers(matrix, stateIndex);
  const depth = new Map<string, number>();
  for (const d of start) depth.set(d, 0);
  const next = orPlane(matrix);
  const queue = [...start];
  while (queue.length > 0) {
    const l = queue.shift() as string;
    for (const t of next.get(l) ?? []) {
      if (!depth.has(t)) {
        depth.set(t, (depth.get(l) ?? 0) + 1);
        queue.push(t);
      }
    }
  }
  for (const l of sourceLines(matrix)) guess[`${lineNodes[l]}_v`] = high.has(l) ? co.high : co.low;
  // A gate held low sits a diode drop above its low input.
  const gates = new Set(matrix.gates.map((g) => g.ref));
  for (const [line, node] of Object.entries(lineNodes)) {
    const d = depth.get(line);
    guess[node] = d !== undefined ? co.high - 0.5 * d : gates.has(line) ? co.low + 0.6 : co.low;
  }
  if (model.driver.kind === "high-side-switch") lowSideGuess(matrix, model, stateIndex, lineNodes, guess);
  const stage = driverStage(model.driver.kind);
  for (const dr of drivers) {
    // A dark-decoded output's driver input (behind its network) starts from its node's guess.
    const inputV = dr.tiedOn ? model.logicSupply.volts : (guess[dr.inputNode] ?? guess[`o${dr.output}`] ?? co.low);
    guess[dr.inputNode] = inputV;
    const lit = inputV - co.low > 0.8;
    Object.assign(guess, stage.guess({ stage: dr, model, inputV, lit }));
  }
  return guess;
}

/**
 * The guess of the active-low side's nodes where a high-side switch drives
 * the segments: each node the active line `nS<k>` reaches sits half a volt
 * above the line's low level per diode, every other node on that side at
 * the segment supply its drivers' resistors pull it up to.
 */
function lowSideGuess(
  matrix: DiodeMatrix,
  model: ElectricalModel,
  stateIndex: number,
  lineNodes: Readonly<Record<string, string>>,
  guess: Record<string, number>,
): void {
  const side = darkSideDiodes(matrix);
  const next = new Map<string, string[]>();
  for (const d of matrix.diodes) {
    if (!side.has(d.ref)) continue;
    next.set(d.from, [...(next.get(d.from) ?? []), d.to]);
    const node = lineNodes[d.to];
    if (node !== undefined) guess[node] = model.supply.volts;
  }
  const start = `nS${stateIndex}`;
  const depth = new Map<string, number>([[start, 0]]);
  const queue = [start];
  while (queue.length > 0) {
    const l = queue.shift() as string;
    for (const t of next.get(l) ?? []) {
      if (depth.has(t)) continue;
      const d = (depth.get(l) ?? 0) + 1;
      depth.set(t, d);
      queue.push(t);
      const node = lineNodes[t];
      if (node !== undefined) guess[node] = model.lowLine.low + 0.5 * d;
    }
  }
}
