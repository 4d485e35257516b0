/**
 * The trim: per output, the preferred value of the resistor that sets its
 * current (the emitter resistor of a sink, the series resistor of a switch,
 * a follower or direct drive) that brings its segment current nearest the
 * target, and the figures the design rule (segmentDesign.ts) judges it by.
 *
 * An output reached through two diodes sits a diode drop lower than one
 * reached through one, so at one resistor value its segment runs dimmer.
 * The trim gives each output its own value: the ideal resistance is found by
 * scaling with the current (I ~ 1/R at a fixed voltage across it) and
 * re-solving once, then the two preferred values around it are tried on
 * the real circuit and the one whose current range is centred nearest the
 * target wins. "Centred" uses the middle of the output's range over the
 * states that light it, so that the worst deviation is smallest.
 */
import { currentOhmsOf } from "../matrix/designators.ts";
import type { DecodeSpec } from "../spec/decodeSpec.ts";
import { preferredNeighbours, type ESeriesName } from "./eSeries.ts";
import type { DiodeMatrix } from "../matrix/matrix.ts";
import type { ElectricalModel } from "../project/project.ts";
import { ok, type Result } from "../result/result.ts";
import { isLit, type BudgetFailure } from "../circuit/stateSweep.ts";
import type { DcWorkspace } from "../circuit/dcSolver.ts";
import { readSweep, type SweepReading } from "./sweepReading.ts";

/** Range of one output's segment current over the states that light it. */
export interface CurrentRange {
  /** Lowest lit segment current, amperes. */
  readonly minA: number;
  /** Highest lit segment current, amperes. */
  readonly maxA: number;
  /** 100 (max - min) / max: how much dimmer the dimmest state is, percent. */
  readonly spreadPct: number;
}

export interface TrimmedOutput extends CurrentRange {
  /** The chosen preferred value, ohms. */
  readonly ohms: number;
  /** The exact value that would centre the range on the target, ohms. */
  readonly idealOhms: number;
}

export interface SegmentTrim {
  readonly series: ESeriesName;
  /** Per output the trim could size (an output whose segment does not light cannot be trimmed). */
  readonly outputs: Readonly<Record<string, TrimmedOutput>>;
  /** The trimmed design's reading (every state at nominal). */
  readonly solutions: SweepReading;
  /** The chosen values, ohms, keyed by output. */
  readonly ohms: ReadonlyMap<string, number>;
}

/** Current ranges per driven output over the states that light it. */
export function currentRanges(spec: DecodeSpec, sweep: SweepReading): Map<string, CurrentRange> {
  const lo = new Map<string, number>();
  const hi = new Map<string, number>();
  sweep.states.forEach((s, k) => {
    sweep.drivers.forEach((d, j) => {
      if (!isLit(spec, k, d.output)) return;
      const i = s.segmentA[j] as number;
      lo.set(d.output, Math.min(lo.get(d.output) ?? Infinity, i));
      hi.set(d.output, Math.max(hi.get(d.output) ?? -Infinity, i));
    });
  });
  const out = new Map<string, CurrentRange>();
  for (const [o, minA] of lo) {
    const maxA = hi.get(o) as number;
    out.set(o, { minA, maxA, spreadPct: spreadPct(minA, maxA) });
  }
  return out;
}

/** 100 (max - min) / max, percent; 0 when nothing flows. */
export function spreadPct(minA: number, maxA: number): number {
  return maxA > 0 ? (100 * (maxA - minA)) / maxA : 0;
}

/** Spread over all lit segments of all outputs (the display's spread), percent. */
export function overallSpread(ranges: ReadonlyMap<string, CurrentRange>): number {
  const rs = [...ranges.values()];
  if (rs.length === 0) return 0;
  return spreadPct(Math.min(...rs.map((r) => r.minA)), Math.max(...rs.map((r) => r.maxA)));
}

/**
 * Largest distance of any lit segment from the target current, percent of
 * the target: 100 max |I - target| / target. 0 when nothing is lit.
 */
export function offTargetPct(ranges: ReadonlyMap<string, CurrentRange>, targetA: number): number {
  let worst = 0;
  for (const r of ranges.values()) worst = Math.max(worst, Math.abs(r.minA - targetA), Math.abs(r.maxA - targetA));
  return (100 * worst) / targetA;
}

/**
 * Largest distance of any lit segment outside the target window
 * target (1 ± windowPct/100), percent of the target; 0 when every lit
 * segment is inside.
 *
 * @example
 * windowDistancePct(new Map([["1a", { minA: 7e-3, maxA: 9e-3, spreadPct: 22 }]]), 10e-3, 20); // 10
 */
export function windowDistancePct(ranges: ReadonlyMap<string, CurrentRange>, targetA: number, windowPct: number): number {
  const lo = targetA * (1 - windowPct / 100);
  const hi = targetA * (1 + windowPct / 100);
  let worst = 0;
  for (const r of ranges.values()) worst = Math.max(worst, lo - r.minA, r.maxA - hi);
  return (100 * worst) / targetA;
}

const mid = (r: CurrentRange): number => (r.minA + r.maxA) / 2;

/** Resistances the trim may propose, ohms: a schema-valid resistor. */
const OHMS_MIN = 1;
const OHMS_MAX = 10e6;

/** What the trim works from. */
export interface TrimInput {
  readonly spec: DecodeSpec;
  readonly matrix: DiodeMatrix;
  readonly model: ElectricalModel;
  /** Every state solved with the model's own resistors. */
  readonly nominal: SweepReading;
  readonly series: ESeriesName;
  /** `Date.now()` value after which no further state is solved. */
  readonly deadlineMs?: number;
  /** Scratch space of the solves, shared with the caller's other sweeps. */
  readonly workspace?: DcWorkspace;
  /** How many states each sweep solves, from S0 (default: every one; see `SweepOptions.states`). */
  readonly states?: number;
}

/**
 * Scales each output's resistor so that the middle of its range would sit
 * on the target (I ~ 1/R); an output whose segment carries nothing keeps its
 * value, since no resistor would light it.
 */
function scaled(before: ReadonlyMap<string, number>, ranges: ReadonlyMap<string, CurrentRange>, targetA: number): Map<string, number> {
  const out = new Map<string, number>();
  for (const [o, ohms] of before) {
    const r = ranges.get(o);
    const x = r && mid(r) > targetA * 1e-6 ? (ohms * mid(r)) / targetA : ohms;
    out.set(o, Math.min(OHMS_MAX, Math.max(OHMS_MIN, x)));
  }
  return out;
}

/**
 * Works out the trim from the nominal solution.
 *
 * @example
 * const t = trimSegments({ spec, matrix, model: project.electrical, nominal, series: "E24" });
 * if (t.ok) t.value.ohms.get("1a"); // 300
 */
export function trimSegments(input: TrimInput): Result<SegmentTrim, BudgetFailure> {
  const { spec, matrix, model, nominal, series } = input;
  const target = model.segment.targetA;
  const before = currentRanges(spec, nominal);
  // Outputs whose segment lights at all; one that stays dark has nothing to centre.
  const outputs = [...before.keys()].filter((o) => mid(before.get(o) as CurrentRange) > target * 1e-6);
  const own = new Map(outputs.map((o) => [o, currentOhmsOf(model, o)]));
  // Two rounds of I ~ 1/R scaling, the second on a fresh solve.
  const ideal0 = scaled(own, before, target);
  const sweep = (design: ReadonlyMap<string, number>): Result<Map<string, CurrentRange>, BudgetFailure> => {
    const r = readSweep(spec, matrix, model, "trim", {
      design,
      deadlineMs: input.deadlineMs,
      workspace: input.workspace,
      states: input.states,
    });
    return r.ok ? ok(currentRanges(spec, r.value)) : r;
  };
  const round = sweep(ideal0);
  if (!round.ok) return round;
  const ideal = scaled(ideal0, round.value, target);

  const lower = new Map(outputs.map((o) => [o, preferredNeighbours(ideal.get(o) as number, series)[0]]));
  const upper = new Map(outputs.map((o) => [o, preferredNeighbours(ideal.get(o) as number, series)[1]]));
  const atLower = sweep(lower);
  if (!atLower.ok) return atLower;
  const atUpper = sweep(upper);
  if (!atUpper.ok) return atUpper;
  const rl = atLower.value;
  const ru = atUpper.value;
  const chosen = new Map<string, number>();
  for (const o of outputs) {
    const dl = Math.abs(mid(rl.get(o) as CurrentRange) - target);
    const du = Math.abs(mid(ru.get(o) as CurrentRange) - target);
    chosen.set(o, dl <= du ? (lower.get(o) as number) : (upper.get(o) as number));
  }
  const final = readSweep(spec, matrix, model, "trim", {
    design: chosen,
    deadlineMs: input.deadlineMs,
    workspace: input.workspace,
    states: input.states,
  });
  if (!final.ok) return final;
  const after = currentRanges(spec, final.value);
  const trimmed: Record<string, TrimmedOutput> = {};
  for (const o of outputs) {
    trimmed[o] = { ohms: chosen.get(o) as number, idealOhms: ideal.get(o) as number, ...(after.get(o) as CurrentRange) };
  }
  return ok({ series, outputs: trimmed, solutions: final.value, ohms: chosen });
}
