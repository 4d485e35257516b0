/**
 * Stage "budget" of the pipeline: verified matrix + electrical model -> what
 * every part carries in every state (`diodeloom/budget@1`).
 *
 * Solves the circuit of every counter state (nominal values), again at the
 * lowest supply (for the drivers' headroom), works out the emitter-resistor
 * trim, and solves the trimmed design at the two tolerance corners. All
 * values are SI: volts, amperes, watts, ohms.
 */
import { cornerConditions, cornerModel, type CornerConditions } from "./corners.ts";
import type { DecodeSpec } from "../spec/decodeSpec.ts";
import { currentRanges, overallSpread, trimEmitters, type CurrentRange } from "./emitterTrim.ts";
import type { ESeriesName } from "./eSeries.ts";
import type { VerifiedMatrix } from "../matrix/matrix.ts";
import type { DcMethod } from "../circuit/dcSolver.ts";
import type { Project } from "../project/project.ts";
import { ok, type Result } from "../result/result.ts";
import { safetyCautions, type WarningLevel } from "./safety.ts";
import { isLit, solveAllStates, type BudgetFailure, type StateSolution } from "../circuit/stateSweep.ts";

export type { BudgetFailure } from "../circuit/stateSweep.ts";

export const BUDGET_SCHEMA = "diodeloom/budget@1";

export interface BudgetOptions {
  /** Preferred-value series of the trim (default E24). */
  readonly series?: ESeriesName;
  /**
   * How far from `string.targetA` a string may run at a tolerance corner and
   * still count as meeting the target, percent (default 20, a choice of
   * diodeloom: a difference the eye accepts between neighbouring segments).
   */
  readonly windowPct?: number;
}

export interface OutputInState {
  readonly lit: boolean;
  /** Volts. */
  readonly baseVoltage: number;
  /** Amperes. */
  readonly stringCurrent: number;
}

export interface StateBudget {
  readonly state: string;
  readonly text: string;
  /** Current the active counter line sources, amperes. */
  readonly sourceCurrent: number;
  /** Current drawn from the string supply, amperes. */
  readonly supplyCurrent: number;
  readonly solver: { readonly method: DcMethod; readonly iterations: number };
  readonly outputs: Readonly<Record<string, OutputInState>>;
}

export interface OutputBudget extends CurrentRange {
  /** Largest string current in a state that does not light the output (leakage), amperes. */
  readonly offMax: number;
  /** Diodes on the paths from the counter lines to this output (empty when tied on). */
  readonly depths: readonly number[];
  readonly tiedOn: boolean;
}

export interface DiodeBudget {
  readonly from: string;
  readonly to: string;
  /** Largest forward current, amperes. */
  readonly maxCurrent: number;
  /** Largest reverse voltage, volts. */
  readonly maxReverse: number;
  readonly ratedCurrent: number;
  readonly ratedReverse: number;
}

export interface CounterLineBudget {
  /** Current the line sources when its state is active, amperes. */
  readonly sourceCurrent: number;
  /** Line voltage when active, volts. */
  readonly lineVoltage: number;
  /** How far the active line falls below its open-circuit `high`, volts. */
  readonly sag: number;
}

export interface DriverBudget {
  readonly transistor: string;
  readonly emitterResistor: string;
  readonly emitterOhms: number;
  /** Largest collector-emitter voltage over the states, volts. */
  readonly maxVce: number;
  /** Largest dissipation Vce Ic + Vbe Ib, watts. */
  readonly maxPower: number;
  /**
   * Smallest collector-base voltage over the lit states at the lowest supply,
   * volts: how far the driver is from the edge of saturation (Vcb = 0).
   */
  readonly headroom: number;
  readonly ratedVce: number;
  readonly ratedPower: number;
}

export interface CornerBudget {
  readonly conditions: CornerConditions;
  /** Lowest and highest lit string current of any output, amperes. */
  readonly minCurrent: number;
  readonly maxCurrent: number;
  readonly outputs: Readonly<Record<string, CurrentRange>>;
  /** Smallest collector-base headroom of a lit driver, volts (0 when there is no driver). */
  readonly minHeadroom: number;
  /** Largest driver Vce and dissipation, volts and watts. */
  readonly maxVce: number;
  readonly maxPower: number;
}

export interface BudgetWarning {
  readonly level: WarningLevel;
  readonly code: string;
  readonly message: string;
}

export interface TrimBudget {
  readonly series: ESeriesName;
  readonly outputs: Readonly<Record<string, { readonly ohms: number; readonly idealOhms: number } & CurrentRange>>;
  readonly spreadPctBefore: number;
  readonly spreadPct: number;
}

export interface Budget {
  readonly schema: typeof BUDGET_SCHEMA;
  readonly title: string;
  readonly temperatureC: number;
  readonly targetCurrent: number;
  readonly states: readonly StateBudget[];
  readonly outputs: Readonly<Record<string, OutputBudget>>;
  /** Spread over every lit string, percent. */
  readonly spreadPct: number;
  readonly diodes: Readonly<Record<string, DiodeBudget>>;
  readonly counterLines: Readonly<Record<string, CounterLineBudget>>;
  readonly drivers: Readonly<Record<string, DriverBudget>>;
  readonly supply: { readonly volts: number; readonly maxCurrent: number; readonly maxPower: number };
  readonly trim: TrimBudget;
  readonly corners: {
    readonly windowPct: number;
    readonly meetsTarget: boolean;
    readonly low: CornerBudget;
    readonly high: CornerBudget;
  };
  readonly warnings: readonly BudgetWarning[];
}

/**
 * Works out the current and voltage budget of a verified matrix.
 *
 * @example
 * const b = solveBudget(project, spec, matrix);
 * if (b.ok) b.value.outputs["1a"]; // { min: 1.24e-4, max: 1.31e-4, spreadPct: 5.4, ... }
 */
export function solveBudget(
  project: Project,
  spec: DecodeSpec,
  matrix: VerifiedMatrix,
  options: BudgetOptions = {},
): Result<Budget, BudgetFailure> {
  const e = project.electrical;
  const series = options.series ?? "E24";
  const windowPct = options.windowPct ?? 20;
  if (!(windowPct > 0 && windowPct < 100)) throw new RangeError(`windowPct must be between 0 and 100, got ${windowPct}`);

  const nominal = solveAllStates(spec, matrix, e, "nominal");
  if (!nominal.ok) return nominal;
  const lowSupply = solveAllStates(spec, matrix, { ...e, supply: { ...e.supply, volts: e.supply.minVolts } }, "lowest supply");
  if (!lowSupply.ok) return lowSupply;
  const trim = trimEmitters(spec, matrix, e, nominal.value, series);
  if (!trim.ok) return trim;

  const driven = nominal.value[0]?.circuit.drivers.map((d) => d.output) ?? [];
  const corners: CornerBudget[] = [];
  for (const c of cornerConditions(e)) {
    const sol = solveAllStates(spec, matrix, cornerModel(e, c, driven, trim.value.ohms), `${c.name} corner`);
    if (!sol.ok) return sol;
    corners.push(cornerBudget(spec, c, sol.value));
  }
  const [low, high] = corners as [CornerBudget, CornerBudget];

  const states = stateBudgets(spec, nominal.value);
  const outputs = outputBudgets(spec, matrix, nominal.value);
  const diodes = diodeBudgets(project, matrix, nominal.value);
  const counterLines = counterBudgets(project, nominal.value);
  const drivers = driverBudgets(project, spec, nominal.value, lowSupply.value);
  const maxSupplyA = Math.max(0, ...states.map((s) => s.supplyCurrent));
  const supply = { volts: e.supply.volts, maxCurrent: maxSupplyA, maxPower: maxSupplyA * e.supply.volts };
  const target = e.string.targetA;
  const w = windowPct / 100;
  const meetsTarget =
    driven.length === 0 ||
    (low.minCurrent >= target * (1 - w) && high.maxCurrent <= target * (1 + w) && high.maxCurrent <= e.string.maxA && low.minHeadroom > 0);
  const spreadPct = overallSpread(currentRanges(spec, nominal.value));

  const budget: Omit<Budget, "warnings"> = {
    schema: BUDGET_SCHEMA,
    title: project.title,
    temperatureC: e.temperatureC,
    targetCurrent: target,
    states,
    outputs,
    spreadPct,
    diodes,
    counterLines,
    drivers,
    supply,
    trim: {
      series,
      outputs: trim.value.outputs,
      spreadPctBefore: trim.value.spreadPctBefore,
      spreadPct: trim.value.spreadPct,
    },
    corners: { windowPct, meetsTarget, low, high },
  };
  return ok({ ...budget, warnings: budgetWarnings(project, budget) });
}

function stateBudgets(spec: DecodeSpec, sols: readonly StateSolution[]): StateBudget[] {
  return sols.map((s, k) => {
    const outputs: Record<string, OutputInState> = {};
    for (const d of s.circuit.drivers) {
      outputs[d.output] = {
        lit: isLit(spec, k, d.output),
        baseVoltage: s.op.voltages[d.baseNode] as number,
        stringCurrent: s.op.currents[d.display] as number,
      };
    }
    return {
      state: s.circuit.state,
      text: spec.texts[k] ?? "",
      sourceCurrent: s.op.currents[`V${s.circuit.state}`] as number,
      supplyCurrent: s.op.currents["VSUP"] ?? 0,
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

function outputBudgets(spec: DecodeSpec, matrix: VerifiedMatrix, sols: readonly StateSolution[]): Record<string, OutputBudget> {
  const ranges = currentRanges(spec, sols);
  const lengths = pathLengths(matrix);
  const out: Record<string, OutputBudget> = {};
  for (const d of sols[0]?.circuit.drivers ?? []) {
    let offMax = 0;
    sols.forEach((s, k) => {
      if (!isLit(spec, k, d.output)) offMax = Math.max(offMax, s.op.currents[d.display] as number);
    });
    const r = ranges.get(d.output) ?? { min: 0, max: 0, spreadPct: 0 };
    out[d.output] = {
      ...r,
      offMax,
      depths: [...(lengths.get(d.output) ?? [])].sort((a, b) => a - b),
      tiedOn: d.tiedOn,
    };
  }
  return out;
}

function diodeBudgets(project: Project, matrix: VerifiedMatrix, sols: readonly StateSolution[]): Record<string, DiodeBudget> {
  const out: Record<string, DiodeBudget> = {};
  // Every state's circuit has the same diodes between the same nodes.
  const byName = new Map((sols[0]?.circuit.elements ?? []).map((x) => [x.name, x]));
  for (const d of matrix.diodes) {
    let maxCurrent = 0;
    let maxReverse = 0;
    const el = byName.get(d.ref);
    if (!el || el.kind !== "diode") throw new Error(`bug: circuit lacks diode ${d.ref}`);
    for (const s of sols) {
      maxCurrent = Math.max(maxCurrent, s.op.currents[d.ref] as number);
      maxReverse = Math.max(maxReverse, (s.op.voltages[el.cathode] as number) - (s.op.voltages[el.anode] as number));
    }
    out[d.ref] = {
      from: d.from,
      to: d.to,
      maxCurrent,
      maxReverse,
      ratedCurrent: project.electrical.diode.maxForwardA,
      ratedReverse: project.electrical.diode.maxReverseV,
    };
  }
  return out;
}

function counterBudgets(project: Project, sols: readonly StateSolution[]): Record<string, CounterLineBudget> {
  const out: Record<string, CounterLineBudget> = {};
  for (const s of sols) {
    const st = s.circuit.state;
    const v = s.op.voltages[s.circuit.lineNodes[st] as string] as number;
    out[st] = { sourceCurrent: s.op.currents[`V${st}`] as number, lineVoltage: v, sag: project.electrical.counterOutput.high - v };
  }
  return out;
}

interface DriverFigures {
  maxVce: number;
  maxPower: number;
  headroom: number;
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
      const f = out.get(d.output) ?? { maxVce: -Infinity, maxPower: 0, headroom: Infinity };
      f.maxVce = Math.max(f.maxVce, vc - ve);
      f.maxPower = Math.max(f.maxPower, (vc - ve) * t.icA + (vb - ve) * t.ibA);
      if (isLit(spec, k, d.output)) f.headroom = Math.min(f.headroom, vc - vb);
      out.set(d.output, f);
    }
  });
  return out;
}

function driverBudgets(
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
      maxVce: n.maxVce,
      maxPower: n.maxPower,
      headroom: (low.get(d.output) as DriverFigures).headroom,
      ratedVce: project.electrical.driver.maxVceV,
      ratedPower: project.electrical.driver.maxPowerW,
    };
  }
  return out;
}

function cornerBudget(spec: DecodeSpec, conditions: CornerConditions, sols: readonly StateSolution[]): CornerBudget {
  const ranges = currentRanges(spec, sols);
  const figures = [...driverFigures(spec, sols).values()];
  const rs = [...ranges.values()];
  return {
    conditions,
    minCurrent: rs.length > 0 ? Math.min(...rs.map((r) => r.min)) : 0,
    maxCurrent: rs.length > 0 ? Math.max(...rs.map((r) => r.max)) : 0,
    outputs: Object.fromEntries(ranges),
    // No driver, nothing to saturate: 0 keeps the JSON finite.
    minHeadroom: figures.length > 0 ? Math.min(...figures.map((f) => f.headroom)) : 0,
    maxVce: figures.length > 0 ? Math.max(...figures.map((f) => f.maxVce)) : 0,
    maxPower: figures.length > 0 ? Math.max(...figures.map((f) => f.maxPower)) : 0,
  };
}

const ua = (a: number): string => `${(a * 1e6).toFixed(1)} µA`;
const ma = (a: number): string => `${(a * 1e3).toFixed(2)} mA`;
const volts = (v: number): string => `${v.toFixed(2)} V`;

/**
 * The findings, most severe first. Thresholds are the parts' own ratings
 * from the project; the 10 % spread note is a choice of diodeloom.
 */
function budgetWarnings(project: Project, b: Omit<Budget, "warnings">): BudgetWarning[] {
  const e = project.electrical;
  const w: BudgetWarning[] = [];
  for (const c of safetyCautions([e.supply.volts, e.supply.minVolts, e.supply.maxVolts])) w.push(c);
  for (const [ref, d] of Object.entries(b.diodes)) {
    if (d.maxCurrent > d.ratedCurrent) {
      w.push({
        level: "warn",
        code: "diode-current",
        message: `${ref} (${d.from} -> ${d.to}) carries ${ma(d.maxCurrent)}, over its ${ma(d.ratedCurrent)} rating`,
      });
    }
    if (d.maxReverse > d.ratedReverse) {
      w.push({
        level: "warn",
        code: "diode-reverse",
        message: `${ref} (${d.from} -> ${d.to}) sees ${volts(d.maxReverse)} reverse, over its ${volts(d.ratedReverse)} rating`,
      });
    }
  }
  const hi = b.corners.high;
  const lo = b.corners.low;
  for (const [o, d] of Object.entries(b.drivers)) {
    const vce = Math.max(d.maxVce, hi.maxVce);
    if (vce > d.ratedVce)
      w.push({
        level: "warn",
        code: "driver-vce",
        message: `driver ${d.transistor} (${o}) sees up to ${volts(vce)} Vce, over its ${volts(d.ratedVce)} rating`,
      });
    const p = Math.max(d.maxPower, hi.maxPower);
    if (p > d.ratedPower)
      w.push({
        level: "warn",
        code: "driver-power",
        message: `driver ${d.transistor} (${o}) dissipates up to ${(p * 1e3).toFixed(1)} mW, over its ${(d.ratedPower * 1e3).toFixed(0)} mW rating`,
      });
    if (d.headroom <= 0) {
      w.push({
        level: "warn",
        code: "driver-saturation",
        message: `driver ${d.transistor} (${o}) saturates at the lowest supply (${volts(e.supply.minVolts)}): its collector is ${volts(-d.headroom)} below its base; raise the supply or use fewer dies`,
      });
    }
  }
  if (Object.keys(b.drivers).length > 0 && lo.minHeadroom <= 0 && Object.values(b.drivers).every((d) => d.headroom > 0)) {
    w.push({
      level: "warn",
      code: "corner-saturation",
      message: `at the low corner a driver saturates (collector ${volts(-lo.minHeadroom)} below its base); allow more supply headroom`,
    });
  }
  const maxA = Math.max(0, ...Object.values(b.outputs).map((o) => o.max), hi.maxCurrent);
  if (maxA > e.string.maxA)
    w.push({ level: "warn", code: "string-current", message: `a string carries up to ${ma(maxA)}, over its ${ma(e.string.maxA)} rating` });
  const windowLow = e.string.targetA * (1 - b.corners.windowPct / 100);
  for (const [o, r] of Object.entries(b.outputs)) {
    if (r.max > 0 && r.min < windowLow) {
      const t = b.trim.outputs[o];
      const fix = t ? `; the ${b.trim.series} trim (${t.ohms} Ω emitter resistor) brings it to ${ua(t.min)}-${ua(t.max)}` : "";
      w.push({
        level: "warn",
        code: "dim-segment",
        message: `${o} runs as low as ${ua(r.min)}, more than ${b.corners.windowPct} % under the ${ua(e.string.targetA)} target${fix}`,
      });
    }
  }
  if (!b.corners.meetsTarget) {
    w.push({
      level: "warn",
      code: "corner-target",
      message:
        `over the tolerance corners the strings run from ${ua(lo.minCurrent)} to ${ua(hi.maxCurrent)}, ` +
        `outside ±${b.corners.windowPct} % of the ${ua(e.string.targetA)} target (or over the rating, or saturating)`,
    });
  }
  if (b.spreadPct > 10) {
    w.push({
      level: "info",
      code: "brightness-spread",
      message: `string currents spread by ${b.spreadPct.toFixed(1)} % over the states; the ${b.trim.series} emitter trim brings it to ${b.trim.spreadPct.toFixed(1)} %`,
    });
  }
  const sags = Object.entries(b.counterLines);
  if (sags.length > 0) {
    const [line, worst] = sags.reduce((a, c) => (c[1].sag > a[1].sag ? c : a));
    w.push({
      level: "info",
      code: "counter-sag",
      message: `the counter sags most in ${line}: ${volts(worst.sag)} below its high level while sourcing ${ua(worst.sourceCurrent)}`,
    });
  }
  const order: Record<WarningLevel, number> = { danger: 0, warn: 1, info: 2 };
  return w.sort((a, c) => order[a.level] - order[c.level]);
}
