/**
 * The budget's figures, part by part: each function reads one sweep of a
 * design over the states (sweepReading.ts) and gives the worst cases a
 * builder checks against the ratings. SI throughout.
 */
import type { CornerConditions } from "./corners.ts";
import type { DecodeSpec } from "../spec/decodeSpec.ts";
import { currentRanges } from "./segmentTrim.ts";
import type { VerifiedMatrix } from "../matrix/matrix.ts";
import type { Project } from "../project/project.ts";
import type { DriverStage } from "../circuit/circuit.ts";
import { isLit } from "../circuit/stateSweep.ts";
import { allSourceLines, highDrivers, orPlane, sourceLines } from "../circuit/counterLines.ts";
import type { SweepReading } from "./sweepReading.ts";
import type {
  CornerBudget,
  CounterLineBudget,
  DiodeBudget,
  DriverBudget,
  GateBudget,
  OutputBudget,
  OutputInState,
  StageResistorBudget,
  StateBudget,
  SupplyBudget,
  UnlitFigure,
} from "./budgetTypes.ts";

/** Per state: what the counter's high lines source, what the supplies give, and every segment. */
export function stateBudgets(spec: DecodeSpec, sweep: SweepReading): StateBudget[] {
  return sweep.states.map((s, k) => {
    const outputs: Record<string, OutputInState> = {};
    sweep.drivers.forEach((d, j) => {
      outputs[d.output] = {
        lit: isLit(spec, k, d.output),
        segmentA: s.segmentA[j] as number,
        inputV: s.inputV[j] as number,
        driver: s.points[j] ?? null,
      };
    });
    return {
      state: s.state,
      text: spec.texts[k] ?? "",
      sourceCurrentA: s.highSourceA,
      supplyCurrentA: s.supplyA,
      logicCurrentA: s.logicA,
      solver: { method: s.method, iterations: s.iterations },
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
  // matrix.lines adds a one-hot counter's active-low lines, from which dark-decoded outputs are reached.
  for (const s of new Set([...sourceLines(matrix), ...matrix.lines, ...matrix.gates.map((g) => g.ref)])) walk(s, 0);
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
export function outputBudgets(spec: DecodeSpec, matrix: VerifiedMatrix, sweep: SweepReading): Record<string, OutputBudget> {
  const ranges = currentRanges(spec, sweep);
  const lengths = pathLengths(matrix);
  const out: Record<string, OutputBudget> = {};
  sweep.drivers.forEach((d, j) => {
    let offMaxA = 0;
    let offMaxState: string | null = null;
    let minState: string | null = null;
    let maxState: string | null = null;
    const r = ranges.get(d.output) ?? { minA: 0, maxA: 0, spreadPct: 0 };
    sweep.states.forEach((s, k) => {
      const i = s.segmentA[j] as number;
      if (!isLit(spec, k, d.output)) {
        if (offMaxState === null || i > offMaxA) [offMaxA, offMaxState] = [i, s.state];
        return;
      }
      if (minState === null && i === r.minA) minState = s.state;
      if (maxState === null && i === r.maxA) maxState = s.state;
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
  });
  return out;
}

/** Per matrix diode: its largest forward current and reverse voltage, with its ratings. */
export function diodeBudgets(project: Project, matrix: VerifiedMatrix, sweep: SweepReading): Record<string, DiodeBudget> {
  const out: Record<string, DiodeBudget> = {};
  for (const d of matrix.diodes) {
    const w = sweep.diodes.get(d.ref);
    if (!w) throw new Error(`bug: the sweep did not read diode ${d.ref}`);
    out[d.ref] = {
      from: d.from,
      to: d.to,
      maxCurrentA: w.maxCurrentA,
      maxReverseV: w.maxReverseV,
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
export function counterBudgets(project: Project, matrix: VerifiedMatrix, sweep: SweepReading): Record<string, CounterLineBudget> {
  if (project.electrical.driver.kind === "high-side-switch") return lowLineBudgets(project, matrix, sweep);
  const co = project.electrical.counterOutput;
  const out: Record<string, CounterLineBudget> = {};
  // A line no diode meets is not in the sweep and carries nothing: the budget lists it at 0 mA beside the
  // lines that carry current, but where no diode meets any of them (a sink-drive ring counter, which has none
  // that sources; a complementary one with every output decoded dark) there is nothing to list.
  const lines = sourceLines(matrix).length === 0 ? [] : allSourceLines(matrix);
  for (const l of lines) {
    const { source, sink } = sweep.counterLines.get(l) ?? { source: null, sink: null };
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

/**
 * A high-side switch's counter lines: the active-low lines `nS<k>` its
 * matrix uses (the only lines its diodes meet), each with what it sinks in
 * its own state (every base current, line pull-up and sneak current of the
 * outputs it pulls down) against `lowLine.maxCurrentA`. An idle line only
 * takes the leakage the supply pushes past the held-off switches.
 */
function lowLineBudgets(project: Project, matrix: VerifiedMatrix, sweep: SweepReading): Record<string, CounterLineBudget> {
  const ll = project.electrical.lowLine;
  const used = new Set(matrix.diodes.map((d) => d.from));
  const out: Record<string, CounterLineBudget> = {};
  matrix.states.forEach((_, k) => {
    const line = `nS${k}`;
    if (!used.has(line)) return;
    const s = sweep.states[k];
    out[line] = {
      sourceCurrentA: 0,
      sourceState: null,
      lineV: ll.high,
      sagV: 0,
      sinkCurrentA: s?.lowLineSinkA ?? 0,
      sinkState: s?.state ?? null,
      ratedA: ll.maxCurrentA,
    };
  });
  return out;
}

/** Per AND gate of a coded counter's decoder: its node's levels over the used codes and its pull-up's largest current. */
export function gateBudgets(matrix: VerifiedMatrix, sweep: SweepReading): Record<string, GateBudget> {
  const out: Record<string, GateBudget> = {};
  for (const g of matrix.gates) {
    const w = sweep.gates.get(g.ref);
    if (!w) throw new Error(`bug: the sweep did not read gate ${g.ref}`);
    out[g.ref] = { inputs: [...g.inputs], pullUp: w.pullUp, lowMaxV: w.lowMaxV, highMinV: w.highMinV, maxPullUpA: w.maxPullUpA };
  }
  return out;
}

/** The largest current and power a supply gives over the states. */
function supplyFigures(volts: number, currents: readonly number[]): SupplyBudget {
  const maxCurrentA = Math.max(0, ...currents);
  return { volts, maxCurrentA, maxPowerW: maxCurrentA * volts };
}

/** The segment supply: what `VSUP` gives over the states. */
export function segmentSupply(project: Project, sweep: SweepReading): SupplyBudget {
  return supplyFigures(
    project.electrical.supply.volts,
    sweep.states.map((s) => s.supplyA),
  );
}

/**
 * The logic supply: the counter's high lines at their high level plus what
 * the tied-on outputs and the gates' pull-ups draw from the rail, in the
 * worst state.
 */
export function logicSupply(project: Project, sweep: SweepReading): SupplyBudget {
  const e = project.electrical;
  const power = sweep.states.map((s) => s.highSourceA * e.counterOutput.high + s.logicA * e.logicSupply.volts);
  const current = sweep.states.map((s) => s.highSourceA + s.logicA);
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
  /** A lit state where its base-collector junction is not forward-biased: it works in its active region, not saturated. */
  active: boolean;
}

/** Base current below which a lit switch counts as off, amperes (GMIN-level leakage, not drive). */
const NO_BASE_A = 1e-9;

/** Vce, dissipation, collector current and, over the lit states, collector-base headroom and forced beta of each driver. */
function driverFigures(spec: DecodeSpec, sweep: SweepReading): Map<string, DriverFigures> {
  const out = new Map<string, DriverFigures>();
  sweep.states.forEach((s, k) => {
    sweep.drivers.forEach((d, j) => {
      const p = s.points[j] ?? null;
      const f = out.get(d.output) ?? {
        maxVceV: 0,
        maxPowerW: 0,
        maxCollectorA: 0,
        headroomV: Infinity,
        forcedBeta: 0,
        off: false,
        active: false,
      };
      if (p !== null) {
        f.maxVceV = Math.max(f.maxVceV, p.vceV);
        f.maxPowerW = Math.max(f.maxPowerW, p.vceV * p.icA + p.vbeV * p.ibA);
        f.maxCollectorA = Math.max(f.maxCollectorA, p.icA);
        if (isLit(spec, k, d.output)) {
          f.headroomV = Math.min(f.headroomV, p.vceV - p.vbeV);
          if (p.ibA > NO_BASE_A) f.forcedBeta = Math.max(f.forcedBeta, p.icA / p.ibA);
          else f.off = true;
          // Vbc = Vbe - Vce (a PNP's Vcb = Veb - Vec, its point being measured the other way round).
          if (!(p.vbeV - p.vceV > 0)) f.active = true;
        }
      }
      out.set(d.output, f);
    });
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
  nominal: SweepReading,
  lowSupply: SweepReading,
  lowCorner: SweepReading,
): Record<string, DriverBudget> {
  const e = project.electrical;
  const kind = e.driver.kind;
  const nom = driverFigures(spec, nominal);
  const low = driverFigures(spec, lowSupply);
  const weak = driverFigures(spec, lowCorner);
  const out: Record<string, DriverBudget> = {};
  for (const d of nominal.drivers) {
    const n = nom.get(d.output) as DriverFigures;
    const w = weak.get(d.output) as DriverFigures;
    const isSwitch = kind === "low-side-switch" || kind === "high-side-switch";
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
      // Judged on the junction, not on forcedBeta < betaMin: the low corner's transistor has beta betaMin, and in
      // the Ebers-Moll model Ic/Ib < beta exactly when the base-collector junction is forward-biased; but the
      // solver's GMIN across each junction (1e-12 S, as in SPICE) adds GMIN (Vbe + Vbc) to Ib, which puts
      // Ic/Ib a part in 1e9 below beta in the active region wherever Vce < 2 Vbe: a switch out of saturation
      // (Vce above 1 V, its current set by its base current times beta) read as one just saturated.
      saturated: isSwitch ? !w.off && !w.active : null,
      ratedVceV: e.driver.maxVceV,
      ratedPowerW: e.driver.maxPowerW,
      ratedCollectorA: e.driver.maxCollectorA,
    };
  }
  return out;
}

/** The segment currents and driver figures of one tolerance corner. */
export function cornerBudget(project: Project, spec: DecodeSpec, conditions: CornerConditions, sweep: SweepReading): CornerBudget {
  const kind = project.electrical.driver.kind;
  const ranges = currentRanges(spec, sweep);
  const figures = [...driverFigures(spec, sweep).values()];
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
    maxForcedBeta: kind === "low-side-switch" || kind === "high-side-switch" ? Math.max(0, ...figures.map((f) => f.forcedBeta)) : null,
    maxVceV: Math.max(0, ...figures.map((f) => f.maxVceV)),
    maxPowerW: Math.max(0, ...figures.map((f) => f.maxPowerW)),
  };
}

/**
 * The largest current of a segment its state leaves dark, over the sweep's
 * states and outputs (the first state and output where it is reached), or
 * null when every output is lit in every state.
 */
export function worstUnlit(spec: DecodeSpec, sweep: Pick<SweepReading, "drivers" | "states">): UnlitFigure | null {
  let worst: UnlitFigure | null = null;
  for (const s of sweep.states)
    sweep.drivers.forEach((d, j) => {
      if (isLit(spec, s.stateIndex, d.output)) return;
      const currentA = s.segmentA[j] as number;
      if (worst === null || currentA > worst.currentA) worst = { output: d.output, state: s.state, currentA };
    });
  return worst;
}
