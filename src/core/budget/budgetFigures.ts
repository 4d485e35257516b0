/**
 * The budget's figures, part by part: each function reads the solved states
 * of one design and gives the worst cases a builder checks against the
 * ratings. SI throughout.
 */
import type { CornerConditions } from "./corners.ts";
import type { DecodeSpec } from "../spec/decodeSpec.ts";
import { currentRanges } from "./emitterTrim.ts";
import type { VerifiedMatrix } from "../matrix/matrix.ts";
import type { Project } from "../project/project.ts";
import { isLit, type StateSolution } from "../circuit/stateSweep.ts";
import type {
  CornerBudget,
  CounterLineBudget,
  DiodeBudget,
  DriverBudget,
  OutputBudget,
  OutputInState,
  StateBudget,
} from "./budgetTypes.ts";

/** Per state: what the active line sources, what the supply gives, and every string. */
export function stateBudgets(spec: DecodeSpec, sols: readonly StateSolution[]): StateBudget[] {
  return sols.map((s, k) => {
    const outputs: Record<string, OutputInState> = {};
    for (const d of s.circuit.drivers) {
      outputs[d.output] = {
        lit: isLit(spec, k, d.output),
        baseV: s.op.voltages[d.baseNode] as number,
        stringCurrentA: s.op.currents[d.display] as number,
      };
    }
    return {
      state: s.circuit.state,
      text: spec.texts[k] ?? "",
      sourceCurrentA: s.op.currents[`V${s.circuit.state}`] as number,
      supplyCurrentA: s.op.currents["VSUP"] ?? 0,
      solver: { method: s.op.method, iterations: s.op.iterations },
      outputs,
    };
  });
}

/** Every path length, in diodes, from a counter line to each line. */
function pathLengths(matrix: VerifiedMatrix): Map<string, Set<number>> {
  const next = new Map<string, string[]>();
  for (const d of matrix.diodes) next.set(d.from, [...(next.get(d.from) ?? []), d.to]);
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
  for (const s of matrix.states) walk(s, 0);
  return lengths;
}

/** Per output: its current range when lit, its leakage when not, and its path lengths. */
export function outputBudgets(spec: DecodeSpec, matrix: VerifiedMatrix, sols: readonly StateSolution[]): Record<string, OutputBudget> {
  const ranges = currentRanges(spec, sols);
  const lengths = pathLengths(matrix);
  const out: Record<string, OutputBudget> = {};
  for (const d of sols[0]?.circuit.drivers ?? []) {
    let offMaxA = 0;
    sols.forEach((s, k) => {
      if (!isLit(spec, k, d.output)) offMaxA = Math.max(offMaxA, s.op.currents[d.display] as number);
    });
    const r = ranges.get(d.output) ?? { minA: 0, maxA: 0, spreadPct: 0 };
    out[d.output] = {
      ...r,
      offMaxA,
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

/** Per counter line, when its state is active: what it sources and how far it sags. */
export function counterBudgets(project: Project, sols: readonly StateSolution[]): Record<string, CounterLineBudget> {
  const out: Record<string, CounterLineBudget> = {};
  for (const s of sols) {
    const st = s.circuit.state;
    const v = s.op.voltages[s.circuit.lineNodes[st] as string] as number;
    out[st] = { sourceCurrentA: s.op.currents[`V${st}`] as number, lineV: v, sagV: project.electrical.counterOutput.high - v };
  }
  return out;
}

interface DriverFigures {
  maxVceV: number;
  maxPowerW: number;
  headroomV: number;
}

/** Vce, dissipation and (over lit states) collector-base headroom of each driver. */
function driverFigures(spec: DecodeSpec, sols: readonly StateSolution[]): Map<string, DriverFigures> {
  const out = new Map<string, DriverFigures>();
  sols.forEach((s, k) => {
    for (const d of s.circuit.drivers) {
      const v = s.op.voltages;
      const t = s.op.transistors[d.transistor];
      if (!t) throw new Error(`bug: no currents for ${d.transistor}`);
      const vc = v[d.collectorNode] as number;
      const vb = v[d.baseNode] as number;
      const ve = v[d.emitterNode] as number;
      const f = out.get(d.output) ?? { maxVceV: -Infinity, maxPowerW: 0, headroomV: Infinity };
      f.maxVceV = Math.max(f.maxVceV, vc - ve);
      f.maxPowerW = Math.max(f.maxPowerW, (vc - ve) * t.icA + (vb - ve) * t.ibA);
      if (isLit(spec, k, d.output)) f.headroomV = Math.min(f.headroomV, vc - vb);
      out.set(d.output, f);
    }
  });
  return out;
}

/** Per driver: Vce and dissipation over the states, headroom at the lowest supply, with its ratings. */
export function driverBudgets(
  project: Project,
  spec: DecodeSpec,
  nominal: readonly StateSolution[],
  lowSupply: readonly StateSolution[],
): Record<string, DriverBudget> {
  const nom = driverFigures(spec, nominal);
  const low = driverFigures(spec, lowSupply);
  const out: Record<string, DriverBudget> = {};
  for (const d of nominal[0]?.circuit.drivers ?? []) {
    const n = nom.get(d.output) as DriverFigures;
    out[d.output] = {
      transistor: d.transistor,
      emitterResistor: d.emitterResistor,
      emitterOhms: d.emitterOhms,
      maxVceV: n.maxVceV,
      maxPowerW: n.maxPowerW,
      headroomV: (low.get(d.output) as DriverFigures).headroomV,
      ratedVceV: project.electrical.driver.maxVceV,
      ratedPowerW: project.electrical.driver.maxPowerW,
    };
  }
  return out;
}

/** The string currents and driver figures of one tolerance corner. */
export function cornerBudget(spec: DecodeSpec, conditions: CornerConditions, sols: readonly StateSolution[]): CornerBudget {
  const ranges = currentRanges(spec, sols);
  const figures = [...driverFigures(spec, sols).values()];
  const rs = [...ranges.values()];
  return {
    conditions,
    minCurrentA: rs.length > 0 ? Math.min(...rs.map((r) => r.minA)) : 0,
    maxCurrentA: rs.length > 0 ? Math.max(...rs.map((r) => r.maxA)) : 0,
    outputs: Object.fromEntries(ranges),
    // No driver, nothing to saturate: 0 keeps the JSON finite.
    minHeadroomV: figures.length > 0 ? Math.min(...figures.map((f) => f.headroomV)) : 0,
    maxVceV: figures.length > 0 ? Math.max(...figures.map((f) => f.maxVceV)) : 0,
    maxPowerW: figures.length > 0 ? Math.max(...figures.map((f) => f.maxPowerW)) : 0,
  };
}
