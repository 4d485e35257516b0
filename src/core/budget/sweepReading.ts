/**
 * What the budget reads of a sweep over the counter states: per state, each
 * driven output's segment current, line voltage and transistor point, and
 * what the counter lines and supplies give; over the states, each matrix
 * diode's, counter line's and gate's worst case. The budget's figures
 * (budgetFigures.ts), the trim and the design rule work from these alone.
 *
 * A sweep keeps this reading and lets each state's circuit and operating
 * point go as soon as it is read, so the budget's memory grows with the
 * answer (states times outputs, plus the parts), not with every node and
 * element of every state of every sweep. The values are the operating
 * points' own, taken in the same order, so the figures are the same as if
 * the solutions had been kept.
 */
import type { DcMethod } from "../circuit/dcSolver.ts";
import type { DiodeMatrix } from "../matrix/matrix.ts";
import type { DriverStage } from "../circuit/circuit.ts";
import type { CircuitModel } from "../matrix/designators.ts";
import type { DecodeSpec } from "../spec/decodeSpec.ts";
import { ok, type Result } from "../result/result.ts";
import { highDrivers, highGates, highLines, sourceLines } from "../circuit/counterLines.ts";
import { sweepStates, type BudgetFailure, type StateSolution, type SweepOptions } from "../circuit/stateSweep.ts";
import type { DriverPoint } from "./budgetTypes.ts";

/** What the budget reads of one solved state. */
export interface StateReading {
  /** The state, `S<k>`. */
  readonly state: string;
  readonly stateIndex: number;
  readonly method: DcMethod;
  readonly iterations: number;
  /** Per driver of the sweep (`SweepReading.drivers` order): the segment's current, amperes. */
  readonly segmentA: Float64Array;
  /** Per driver: its output line's voltage, volts. */
  readonly inputV: Float64Array;
  /** Per driver: its transistor's operating point; null for direct drive. */
  readonly points: readonly (DriverPoint | null)[];
  /** What the counter's high lines source together, amperes (summed in `highLines` order). */
  readonly highSourceA: number;
  /** What the segment supply gives, amperes (0 where the circuit has none). */
  readonly supplyA: number;
  /** What the logic supply gives, amperes (0 where the circuit has none). */
  readonly logicA: number;
  /** The voltage of each node that drives the OR plane high in this state (`highDrivers` order), volts. */
  readonly highDriverV: ReadonlyMap<string, number>;
  /** What the state's active-low line `nS<k>` sinks, amperes; 0 where the circuit has none (no output decoded dark from it). */
  readonly lowLineSinkA: number;
}

/** A matrix diode's worst case over the states. */
export interface DiodeReading {
  /** Largest forward current, amperes (0 at least). */
  readonly maxCurrentA: number;
  /** Largest reverse voltage, cathode minus anode, volts (0 at least). */
  readonly maxReverseV: number;
}

/** A counter line's worst cases over the states. */
export interface LineReading {
  /** The most it sources while high, its voltage then and the (first) state; null when it is never high. */
  readonly source: { readonly a: number; readonly v: number; readonly state: string } | null;
  /** The most it sinks while low (negative when it sources even then) and the (first) state; null when it is never low. */
  readonly sink: { readonly a: number; readonly state: string } | null;
}

/** An AND gate's levels and its pull-up's largest current over the states. */
export interface GateReading {
  readonly pullUp: { readonly ref: string; readonly ohms: number };
  readonly lowMaxV: number | null;
  readonly highMinV: number | null;
  readonly maxPullUpA: number;
}

/** The reading of one sweep over every state. */
export interface SweepReading {
  /** The driver stages, the same in every state of the sweep. */
  readonly drivers: readonly DriverStage[];
  readonly states: readonly StateReading[];
  /** Per matrix diode, by reference. */
  readonly diodes: ReadonlyMap<string, DiodeReading>;
  /** Per counter line (`sourceLines` order). */
  readonly counterLines: ReadonlyMap<string, LineReading>;
  /** Per AND gate of a coded counter's decoder. */
  readonly gates: ReadonlyMap<string, GateReading>;
}

/** The operating point of a stage's transistor in one solved state; null for direct drive. */
export function driverPoint(s: StateSolution, d: DriverStage): DriverPoint | null {
  if (d.transistor === null || d.baseNode === null || d.collectorNode === null) return null;
  const t = s.op.transistors[d.transistor];
  if (!t) throw new Error(`bug: no currents for ${d.transistor}`);
  const v = s.op.voltages;
  const ve = d.emitterNode === null ? 0 : (v[d.emitterNode] as number);
  // A PNP's junction voltages measured the other way (Veb, Vec), as its currents are (dcSolver.ts).
  const sign = d.kind === "high-side-switch" ? -1 : 1;
  return {
    vbeV: sign * ((v[d.baseNode] as number) - ve),
    vceV: sign * ((v[d.collectorNode] as number) - ve),
    icA: t.icA,
    ibA: t.ibA,
  };
}

/** Reads one solved state. */
export function readState(matrix: DiodeMatrix, s: StateSolution): StateReading {
  const { circuit, op } = s;
  const drivers = circuit.drivers;
  const segmentA = new Float64Array(drivers.length);
  const inputV = new Float64Array(drivers.length);
  const points: (DriverPoint | null)[] = [];
  drivers.forEach((d, j) => {
    segmentA[j] = op.currents[d.display] as number;
    inputV[j] = op.voltages[d.inputNode] as number;
    points.push(driverPoint(s, d));
  });
  let highSourceA = 0;
  // A high line no diode meets has no source in the circuit (sourceLines): it sources nothing.
  for (const l of highLines(matrix, circuit.stateIndex)) highSourceA += op.currents[`V${l}`] ?? 0;
  const highDriverV = new Map<string, number>();
  for (const d of highDrivers(matrix, circuit.stateIndex)) {
    const node = circuit.lineNodes[d];
    if (node !== undefined) highDriverV.set(d, op.voltages[node] as number);
  }
  return {
    state: circuit.state,
    stateIndex: circuit.stateIndex,
    method: op.method,
    iterations: op.iterations,
    segmentA,
    inputV,
    points,
    highSourceA,
    supplyA: op.currents["VSUP"] ?? 0,
    logicA: op.currents["VLOGIC"] ?? 0,
    highDriverV,
    // The state S<k>'s active-low line is nS<k>; its resistor's current runs from the source to the line, so the line sinks its negative.
    lowLineSinkA: Math.max(0, -(op.currents[`Rn${circuit.state}`] ?? 0)),
  };
}

/**
 * The worst cases over the states, gathered one state at a time in state
 * order (the first state sets up the parts: every state's circuit has the
 * same diodes, lines and gates between the same nodes).
 */
class WorstCases {
  readonly diodes = new Map<string, { maxCurrentA: number; maxReverseV: number }>();
  readonly lines = new Map<string, { source: LineReading["source"]; sink: LineReading["sink"] }>();
  readonly gates = new Map<
    string,
    { pullUp: GateReading["pullUp"]; lowMaxV: number | null; highMinV: number | null; maxPullUpA: number }
  >();
  #diodeNodes: { ref: string; anode: string; cathode: string }[] | null = null;
  #gateNodes: { ref: string; node: string; pullUp: GateReading["pullUp"] }[] = [];

  constructor(readonly matrix: DiodeMatrix) {}

  #setUp(s: StateSolution): { ref: string; anode: string; cathode: string }[] {
    const byName = new Map(s.circuit.elements.map((x) => [x.name, x]));
    const diodes = this.matrix.diodes.map((d) => {
      const el = byName.get(d.ref);
      if (!el || el.kind !== "diode") throw new Error(`bug: circuit lacks diode ${d.ref}`);
      this.diodes.set(d.ref, { maxCurrentA: 0, maxReverseV: 0 });
      return { ref: d.ref, anode: el.anode, cathode: el.cathode };
    });
    const pullUps = new Map<string, { ref: string; ohms: number }>();
    for (const el of s.circuit.elements) {
      if (el.kind === "resistor" && el.role === "gate-pull-up") pullUps.set(el.b, { ref: el.name, ohms: el.ohms });
    }
    this.#gateNodes = this.matrix.gates.map((g) => {
      const node = s.circuit.lineNodes[g.ref] as string;
      const pullUp = pullUps.get(node);
      if (pullUp === undefined) throw new Error(`bug: circuit lacks the pull-up of ${g.ref}`);
      this.gates.set(g.ref, { pullUp, lowMaxV: null, highMinV: null, maxPullUpA: 0 });
      return { ref: g.ref, node, pullUp };
    });
    for (const l of sourceLines(this.matrix)) this.lines.set(l, { source: null, sink: null });
    return diodes;
  }

  add(s: StateSolution): void {
    this.#diodeNodes ??= this.#setUp(s);
    const { op, circuit } = s;
    const v = op.voltages;
    for (const d of this.#diodeNodes) {
      const w = this.diodes.get(d.ref) as { maxCurrentA: number; maxReverseV: number };
      w.maxCurrentA = Math.max(w.maxCurrentA, op.currents[d.ref] as number);
      w.maxReverseV = Math.max(w.maxReverseV, (v[d.cathode] as number) - (v[d.anode] as number));
    }
    const high = highLines(this.matrix, circuit.stateIndex);
    for (const [l, w] of this.lines) {
      const a = op.currents[`V${l}`] as number;
      const lineV = v[circuit.lineNodes[l] as string] as number;
      if (high.has(l)) {
        if (w.source === null || a > w.source.a) w.source = { a, v: lineV, state: circuit.state };
      } else if (w.sink === null || -a > w.sink.a) w.sink = { a: -a, state: circuit.state };
    }
    const gatesHigh = highGates(this.matrix, circuit.stateIndex);
    for (const g of this.#gateNodes) {
      const w = this.gates.get(g.ref) as { lowMaxV: number | null; highMinV: number | null; maxPullUpA: number };
      const gv = v[g.node] as number;
      w.maxPullUpA = Math.max(w.maxPullUpA, op.currents[g.pullUp.ref] as number);
      if (gatesHigh.has(g.ref)) w.highMinV = w.highMinV === null ? gv : Math.min(w.highMinV, gv);
      else w.lowMaxV = w.lowMaxV === null ? gv : Math.max(w.lowMaxV, gv);
    }
  }
}

/**
 * Solves every state (see `sweepStates`) and keeps the reading.
 *
 * @param during names the solve in a failure message
 * @example
 * const r = readSweep(spec, matrix, project.electrical, "nominal");
 * if (r.ok) r.value.states[0]?.segmentA[0]; // the first driver's segment current in S0, amperes
 */
export function readSweep(
  spec: DecodeSpec,
  matrix: DiodeMatrix,
  model: CircuitModel,
  during: string,
  options: SweepOptions = {},
): Result<SweepReading, BudgetFailure> {
  const states: StateReading[] = [];
  const worst = new WorstCases(matrix);
  let drivers: readonly DriverStage[] = [];
  const swept = sweepStates(
    spec,
    matrix,
    model,
    during,
    (s, k) => {
      if (k === 0) drivers = s.circuit.drivers;
      states.push(readState(matrix, s));
      worst.add(s);
    },
    options,
  );
  if (!swept.ok) return swept;
  return ok({ drivers, states, diodes: worst.diodes, counterLines: worst.lines, gates: worst.gates });
}
