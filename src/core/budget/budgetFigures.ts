/**
 * The budget's figures, part by part: each function reads the solved states
 * of one design and gives the worst cases a builder checks against the
 * ratings. SI throughout.
 */
import type { CornerConditions } from "./corners.ts";
import type { DecodeSpec } from "../spec/decodeSpec.ts";
import { currentRanges } from "./segmentTrim.ts";
import type { VerifiedMatrix } from "../matrix/matrix.ts";
import type { Project } from "../project/project.ts";
import type { DriverStage } from "../circuit/circuit.ts";
import { isLit, type StateSolution } from "../circuit/stateSweep.ts";
import { highDrivers, highGates, highLines, orPlane, sourceLines } from "../circuit/counterLines.ts";
import type {
  CornerBudget,
  CounterLineBudget,
  DiodeBudget,
  DriverBudget,
  DriverPoint,
  GateBudget,
  OutputBudget,
  OutputInState,
  StageResistorBudget,
  StateBudget,
  SupplyBudget,
} from "./budgetTypes.ts";

/** The operating point of a stage's transistor in one solved state; null for direct drive. */
export function driverPoint(s: StateSolution, d: DriverStage): DriverPoint | null {
  if (d.transistor === null || d.baseNode === null || d.collectorNode === null) return null;
  const t = s.op.transistors[d.transistor];
  if (!t) throw new Error(`bug: no currents for ${d.transistor}`);
  const v = s.op.voltages;
  const ve = d.emitterNode === null ? 0 : (v[d.emitterNode] as number);
  return { vbeV: (v[d.baseNode] as number) - ve, vceV: (v[d.collectorNode] as number) - ve, icA: t.icA, ibA: t.ibA };
}

/** What the counter's high lines source together in one solved state (the active line of a one-hot counter), amperes. */
function highLinesSourceA(matrix: VerifiedMatrix, s: StateSolution): number {
  let sum = 0;
  for (const l of highLines(matrix, s.circuit.stateIndex)) sum += s.op.currents[`V${l}`] as number;
  return sum;
}

/** Per state: what the counter's high lines source, what the supplies give, and every segment. */
export function stateBudgets(spec: DecodeSpec, matrix: VerifiedMatrix, sols: readonly StateSolution[]): StateBudget[] {
  return sols.map((s, k) => {
    const outputs: Record<string, OutputInState> = {};
    for (const d of s.circuit.drivers) {
      outputs[d.output] = {
        lit: isLit(spec, k, d.output),
        segmentA: s.op.currents[d.display] as number,
        inputV: s.op.voltages[d.inputNode] as number,
        driver: driverPoint(s, d),
      };
    }
    return {
      state: s.circuit.state,
      text: spec.texts[k] ?? "",
      sourceCurrentA: highLinesSourceA(matrix, s),
      supplyCurrentA: s.op.currents["VSUP"] ?? 0,
      logicCurrentA: s.op.currents["VLOGIC"] ?? 0,
      solver: { method: s.op.method, iterations: s.op.iterations },
      outputs,
    };
  });
}

/** Every path length, in diodes, from a counter line or an AND gate to each line (a gate's input diodes are on no path). */
function pathLengths(matrix: VerifiedMatrix): Map<string, Set<number>> {
  const next = orPlane(matrix);
  const lengths = new Map<string, Set<number>>();
  const walk = (line: string, depth: number): void => {
    for (const t of next.get(line) ?? []) {
      const set = lengths.get(t) ?? new Set<number>();
      if (set.has(depth + 1)) continue;
      set.add(depth + 1);
      lengths.set(t, set);
      walk(t, depth + 1);
    }
  };
  for (const s of [...sourceLines(matrix), ...matrix.gates.map((g) => g.ref)]) walk(s, 0);
  return lengths;
}

/**
 * The fewest diodes from the nodes that drive the OR plane high in state
 * `k` (the state's line, or a coded counter's high stage lines and gates)
 * to each line they reach: the depth at which that state drives it.
 */
export function depthsFrom(matrix: VerifiedMatrix, k: number): Map<string, number> {
  const next = orPlane(matrix);
  const start = [...highDrivers(matrix, k)];
  const depth = new Map<string, number>(start.map((s) => [s, 0]));
  const queue = [...start];
  while (queue.length > 0) {
    const l = queue.shift() as string;
    for (const t of next.get(l) ?? []) {
      if (depth.has(t)) continue;
      depth.set(t, (depth.get(l) ?? 0) + 1);
      queue.push(t);
    }
  }
  return depth;
}

/** Per output: its current range when lit (and in which states), its largest current when unlit, and its path lengths. */
export function outputBudgets(spec: DecodeSpec, matrix: VerifiedMatrix, sols: readonly StateSolution[]): Record<string, OutputBudget> {
  const ranges = currentRanges(spec, sols);
  const lengths = pathLengths(matrix);
  const out: Record<string, OutputBudget> = {};
  for (const d of sols[0]?.circuit.drivers ?? []) {
    let offMaxA = 0;
    let offMaxState: string | null = null;
    let minState: string | null = null;
    let maxState: string | null = null;
    const r = ranges.get(d.output) ?? { minA: 0, maxA: 0, spreadPct: 0 };
    sols.forEach((s, k) => {
      const i = s.op.currents[d.display] as number;
      if (!isLit(spec, k, d.output)) {
        if (offMaxState === null || i > offMaxA) [offMaxA, offMaxState] = [i, s.circuit.state];
        return;
      }
      if (minState === null && i === r.minA) minState = s.circuit.state;
      if (maxState === null && i === r.maxA) maxState = s.circuit.state;
    });
    out[d.output] = {
      ...r,
      offMaxA,
      offMaxState,
      minState,
      maxState,
      pathLengths: [...(lengths.get(d.output) ?? [])].sort((a, b) => a - b),
      tiedOn: d.tiedOn,
    };
  }
  return out;
}

/** Per matrix diode: its largest forward current and reverse voltage, with its ratings. */
export function diodeBudgets(project: Project, matrix: VerifiedMatrix, sols: readonly StateSolution[]): Record<string, DiodeBudget> {
  const out: Record<string, DiodeBudget> = {};
  // Every state's circuit has the same diodes between the same nodes.
  const byName = new Map((sols[0]?.circuit.elements ?? []).map((x) => [x.name, x]));
  for (const d of matrix.diodes) {
    let maxCurrentA = 0;
    let maxReverseV = 0;
    const el = byName.get(d.ref);
    if (!el || el.kind !== "diode") throw new Error(`bug: circuit lacks diode ${d.ref}`);
    for (const s of sols) {
      maxCurrentA = Math.max(maxCurrentA, s.op.currents[d.ref] as number);
      maxReverseV = Math.max(maxReverseV, (s.op.voltages[el.cathode] as number) - (s.op.voltages[el.anode] as number));
    }
    out[d.ref] = {
      from: d.from,
      to: d.to,
      maxCurrentA,
      maxReverseV,
      ratedCurrentA: project.electrical.diode.maxForwardA,
      ratedReverseV: project.electrical.diode.maxReverseV,
    };
  }
  return out;
}

/**
 * Per counter line (a one-hot counter's state line, a coded counter's stage
 * line): the most it sources while high and how far it then sags, and the
 * most it sinks while low (a coded counter's low line takes the pull-up
 * current of every gate it holds low).
 */
export function counterBudgets(
  project: Project,
  matrix: VerifiedMatrix,
  sols: readonly StateSolution[],
): Record<string, CounterLineBudget> {
  const co = project.electrical.counterOutput;
  const out: Record<string, CounterLineBudget> = {};
  for (const l of sourceLines(matrix)) {
    let source: { a: number; v: number; state: string } | null = null;
    let sink: { a: number; state: string } | null = null;
    for (const s of sols) {
      const a = s.op.currents[`V${l}`] as number;
      const v = s.op.voltages[s.circuit.lineNodes[l] as string] as number;
      if (highLines(matrix, s.circuit.stateIndex).has(l)) {
        if (source === null || a > source.a) source = { a, v, state: s.circuit.state };
      } else if (sink === null || -a > sink.a) sink = { a: -a, state: s.circuit.state };
    }
    out[l] = {
      sourceCurrentA: source?.a ?? 0,
      sourceState: source?.state ?? null,
      lineV: source?.v ?? co.high,
      sagV: source === null ? 0 : co.high - source.v,
      sinkCurrentA: Math.max(0, sink?.a ?? 0),
      sinkState: sink?.state ?? null,
      ratedA: co.maxCurrentA,
    };
  }
  return out;
}

/** Per AND gate of a coded counter's decoder: its node's levels over the used codes and its pull-up's largest current. */
export function gateBudgets(matrix: VerifiedMatrix, sols: readonly StateSolution[]): Record<string, GateBudget> {
  const out: Record<string, GateBudget> = {};
  const pullUps = new Map<string, { ref: string; ohms: number }>();
  for (const el of sols[0]?.circuit.elements ?? []) {
    if (el.kind === "resistor" && el.role === "gate-pull-up") pullUps.set(el.b, { ref: el.name, ohms: el.ohms });
  }
  for (const g of matrix.gates) {
    const node = sols[0]?.circuit.lineNodes[g.ref] as string;
    const pullUp = pullUps.get(node);
    if (pullUp === undefined) throw new Error(`bug: circuit lacks the pull-up of ${g.ref}`);
    let lowMaxV: number | null = null;
    let highMinV: number | null = null;
    let maxPullUpA = 0;
    for (const s of sols) {
      const v = s.op.voltages[node] as number;
      maxPullUpA = Math.max(maxPullUpA, s.op.currents[pullUp.ref] as number);
      if (highGates(matrix, s.circuit.stateIndex).has(g.ref)) highMinV = highMinV === null ? v : Math.min(highMinV, v);
      else lowMaxV = lowMaxV === null ? v : Math.max(lowMaxV, v);
    }
    out[g.ref] = { inputs: [...g.inputs], pullUp, lowMaxV, highMinV, maxPullUpA };
  }
  return out;
}

/** The largest current and power a supply gives over the states. */
function supplyFigures(volts: number, currents: readonly number[]): SupplyBudget {
  const maxCurrentA = Math.max(0, ...currents);
  return { volts, maxCurrentA, maxPowerW: maxCurrentA * volts };
}

/** The segment supply: what `VSUP` gives over the states. */
export function segmentSupply(project: Project, sols: readonly StateSolution[]): SupplyBudget {
  return supplyFigures(
    project.electrical.supply.volts,
    sols.map((s) => s.op.currents["VSUP"] ?? 0),
  );
}

/**
 * The logic supply: the counter's high lines at their high level plus what
 * the tied-on outputs and the gates' pull-ups draw from the rail, in the
 * worst state.
 */
export function logicSupply(project: Project, matrix: VerifiedMatrix, sols: readonly StateSolution[]): SupplyBudget {
  const e = project.electrical;
  const power = sols.map((s) => highLinesSourceA(matrix, s) * e.counterOutput.high + (s.op.currents["VLOGIC"] ?? 0) * e.logicSupply.volts);
  const current = sols.map((s) => highLinesSourceA(matrix, s) + (s.op.currents["VLOGIC"] ?? 0));
  return { volts: e.logicSupply.volts, maxCurrentA: Math.max(0, ...current), maxPowerW: Math.max(0, ...power) };
}

interface DriverFigures {
  maxVceV: number;
  maxPowerW: number;
  maxCollectorA: number;
  headroomV: number;
  forcedBeta: number;
  /** A lit state where the transistor takes no base current: it is off, not a switch closed. */
  off: boolean;
}

/** Base current below which a lit switch counts as off, amperes (GMIN-level leakage, not drive). */
const NO_BASE_A = 1e-9;

/** Vce, dissipation, collector current and, over the lit states, collector-base headroom and forced beta of each driver. */
function driverFigures(spec: DecodeSpec, sols: readonly StateSolution[]): Map<string, DriverFigures> {
  const out = new Map<string, DriverFigures>();
  sols.forEach((s, k) => {
    for (const d of s.circuit.drivers) {
      const p = driverPoint(s, d);
      const f = out.get(d.output) ?? { maxVceV: 0, maxPowerW: 0, maxCollectorA: 0, headroomV: Infinity, forcedBeta: 0, off: false };
      if (p !== null) {
        f.maxVceV = Math.max(f.maxVceV, p.vceV);
        f.maxPowerW = Math.max(f.maxPowerW, p.vceV * p.icA + p.vbeV * p.ibA);
        f.maxCollectorA = Math.max(f.maxCollectorA, p.icA);
        if (isLit(spec, k, d.output)) {
          f.headroomV = Math.min(f.headroomV, p.vceV - p.vbeV);
          if (p.ibA > NO_BASE_A) f.forcedBeta = Math.max(f.forcedBeta, p.icA / p.ibA);
          else f.off = true;
        }
      }
      out.set(d.output, f);
    }
  });
  return out;
}

/** The stage's resistors as the budget lists them, the current-setting one first. */
function stageResistors(d: DriverStage): StageResistorBudget[] {
  const list = [d.current, d.emitter === null ? null : d.series, d.base, d.baseEmitter, d.pullDown, d.tieOn];
  return list.filter((x): x is NonNullable<typeof x> => x !== null).map((x) => ({ ref: x.ref, role: x.role, ohms: x.ohms }));
}

/** Per driver: Vce, dissipation and collector current over the states, a sink's or follower's headroom at the lowest supply, a switch's forced beta at the low corner, with its ratings. */
export function driverBudgets(
  project: Project,
  spec: DecodeSpec,
  nominal: readonly StateSolution[],
  lowSupply: readonly StateSolution[],
  lowCorner: readonly StateSolution[],
): Record<string, DriverBudget> {
  const e = project.electrical;
  const kind = e.driver.kind;
  const nom = driverFigures(spec, nominal);
  const low = driverFigures(spec, lowSupply);
  const weak = driverFigures(spec, lowCorner);
  const out: Record<string, DriverBudget> = {};
  for (const d of nominal[0]?.circuit.drivers ?? []) {
    const n = nom.get(d.output) as DriverFigures;
    const w = weak.get(d.output) as DriverFigures;
    const isSwitch = kind === "low-side-switch";
    const headroom = (low.get(d.output) as DriverFigures).headroomV;
    out[d.output] = {
      transistor: d.transistor,
      currentResistor: { ref: d.current.ref, role: d.current.role, ohms: d.current.ohms },
      resistors: stageResistors(d),
      maxVceV: n.maxVceV,
      maxPowerW: n.maxPowerW,
      maxCollectorA: n.maxCollectorA,
      headroomV: (kind === "current-sink" || kind === "emitter-follower") && Number.isFinite(headroom) ? headroom : null,
      forcedBeta: isSwitch && !w.off ? w.forcedBeta : null,
      saturated: isSwitch ? !w.off && w.forcedBeta < e.tolerance.betaMin : null,
      ratedVceV: e.driver.maxVceV,
      ratedPowerW: e.driver.maxPowerW,
      ratedCollectorA: e.driver.maxCollectorA,
    };
  }
  return out;
}

/** The segment currents and driver figures of one tolerance corner. */
export function cornerBudget(
  project: Project,
  spec: DecodeSpec,
  conditions: CornerConditions,
  sols: readonly StateSolution[],
): CornerBudget {
  const kind = project.electrical.driver.kind;
  const ranges = currentRanges(spec, sols);
  const figures = [...driverFigures(spec, sols).values()];
  const rs = [...ranges.values()];
  const lit = figures.filter((f) => Number.isFinite(f.headroomV));
  return {
    conditions,
    minCurrentA: rs.length > 0 ? Math.min(...rs.map((r) => r.minA)) : 0,
    maxCurrentA: rs.length > 0 ? Math.max(...rs.map((r) => r.maxA)) : 0,
    outputs: Object.fromEntries(ranges),
    // No lit driver, nothing to saturate: 0 keeps the JSON finite.
    minHeadroomV:
      kind === "current-sink" || kind === "emitter-follower" ? (lit.length > 0 ? Math.min(...lit.map((f) => f.headroomV)) : 0) : null,
    maxForcedBeta: kind === "low-side-switch" ? Math.max(0, ...figures.map((f) => f.forcedBeta)) : null,
    maxVceV: Math.max(0, ...figures.map((f) => f.maxVceV)),
    maxPowerW: Math.max(0, ...figures.map((f) => f.maxPowerW)),
  };
}
