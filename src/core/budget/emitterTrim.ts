/**
 * Emitter-resistor trim: per output, the preferred value that brings its
 * string current nearest the target.
 *
 * An output reached through two diodes sits a diode drop lower at its base
 * than one reached through one, so at one emitter resistor its string runs
 * dimmer. The trim gives each output its own value: the ideal resistance is
 * found by scaling with the current (I ~ 1/Re at a fixed emitter voltage)
 * and re-solving once, then the two preferred values around it are tried
 * on the real circuit and the one whose current range is centred nearest
 * the target wins. "Centred" uses the middle of the output's range over the
 * states that light it, so that the worst deviation is smallest.
 */
import { emitterOhmsOf } from "../matrix/designators.ts";
import type { DecodeSpec } from "../spec/decodeSpec.ts";
import { preferredNeighbours, type ESeriesName } from "./eSeries.ts";
import type { DiodeMatrix } from "../matrix/matrix.ts";
import type { ElectricalModel } from "../project/project.ts";
import { ok, type Result } from "../result/result.ts";
import { isLit, solveAllStates, type BudgetFailure, type StateSolution } from "../circuit/stateSweep.ts";

/** Range of one output's string current over the states that light it. */
export interface CurrentRange {
  /** Lowest lit string current, amperes. */
  readonly minA: number;
  /** Highest lit string current, amperes. */
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

export interface EmitterTrim {
  readonly series: ESeriesName;
  readonly outputs: Readonly<Record<string, TrimmedOutput>>;
  /** Spread over every lit string of the display, before and after the trim, percent. */
  readonly spreadPctBefore: number;
  readonly spreadPct: number;
  /** The trimmed design's operating points (every state). */
  readonly solutions: readonly StateSolution[];
  /** The chosen values, ohms, keyed by output. */
  readonly ohms: ReadonlyMap<string, number>;
}

/** Current ranges per driven output over the states that light it. */
export function currentRanges(spec: DecodeSpec, solutions: readonly StateSolution[]): Map<string, CurrentRange> {
  const lo = new Map<string, number>();
  const hi = new Map<string, number>();
  solutions.forEach((s, k) => {
    for (const d of s.circuit.drivers) {
      if (!isLit(spec, k, d.output)) continue;
      const i = s.op.currents[d.display] as number;
      lo.set(d.output, Math.min(lo.get(d.output) ?? Infinity, i));
      hi.set(d.output, Math.max(hi.get(d.output) ?? -Infinity, i));
    }
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

/** Spread over all lit strings of all outputs, percent. */
export function overallSpread(ranges: ReadonlyMap<string, CurrentRange>): number {
  const rs = [...ranges.values()];
  if (rs.length === 0) return 0;
  return spreadPct(Math.min(...rs.map((r) => r.minA)), Math.max(...rs.map((r) => r.maxA)));
}

/**
 * Largest distance of any lit string from the target current, percent of
 * the target: 100 max |I - target| / target. 0 when nothing is lit.
 */
export function offTargetPct(ranges: ReadonlyMap<string, CurrentRange>, targetA: number): number {
  let worst = 0;
  for (const r of ranges.values()) worst = Math.max(worst, Math.abs(r.minA - targetA), Math.abs(r.maxA - targetA));
  return (100 * worst) / targetA;
}

const mid = (r: CurrentRange): number => (r.minA + r.maxA) / 2;

/** What the trim works from. */
export interface TrimInput {
  readonly spec: DecodeSpec;
  readonly matrix: DiodeMatrix;
  readonly model: ElectricalModel;
  /** Every state solved with the model's own emitter resistors. */
  readonly nominal: readonly StateSolution[];
  readonly series: ESeriesName;
}

/**
 * Works out the trim from the nominal solution.
 *
 * @example
 * const t = trimEmitters({ spec, matrix, model: project.electrical, nominal, series: "E24" });
 * if (t.ok) t.value.ohms.get("1a"); // 6200
 */
export function trimEmitters(input: TrimInput): Result<EmitterTrim, BudgetFailure> {
  const { spec, matrix, model, nominal, series } = input;
  const target = model.string.targetA;
  const before = currentRanges(spec, nominal);
  const outputs = [...before.keys()];
  // Two rounds of I ~ 1/Re scaling, the second on a fresh solve.
  const ideal0 = new Map(outputs.map((o) => [o, (emitterOhmsOf(model, o) * mid(before.get(o) as CurrentRange)) / target]));
  const round = solveAllStates(spec, matrix, model, "trim", ideal0);
  if (!round.ok) return round;
  const r1 = currentRanges(spec, round.value);
  const ideal = new Map(outputs.map((o) => [o, ((ideal0.get(o) as number) * mid(r1.get(o) as CurrentRange)) / target]));

  const lower = new Map(outputs.map((o) => [o, preferredNeighbours(ideal.get(o) as number, series)[0]]));
  const upper = new Map(outputs.map((o) => [o, preferredNeighbours(ideal.get(o) as number, series)[1]]));
  const atLower = solveAllStates(spec, matrix, model, "trim", lower);
  if (!atLower.ok) return atLower;
  const atUpper = solveAllStates(spec, matrix, model, "trim", upper);
  if (!atUpper.ok) return atUpper;
  const rl = currentRanges(spec, atLower.value);
  const ru = currentRanges(spec, atUpper.value);
  const chosen = new Map<string, number>();
  for (const o of outputs) {
    const dl = Math.abs(mid(rl.get(o) as CurrentRange) - target);
    const du = Math.abs(mid(ru.get(o) as CurrentRange) - target);
    chosen.set(o, dl <= du ? (lower.get(o) as number) : (upper.get(o) as number));
  }
  const final = solveAllStates(spec, matrix, model, "trim", chosen);
  if (!final.ok) return final;
  const after = currentRanges(spec, final.value);
  const trimmed: Record<string, TrimmedOutput> = {};
  for (const o of outputs) {
    trimmed[o] = { ohms: chosen.get(o) as number, idealOhms: ideal.get(o) as number, ...(after.get(o) as CurrentRange) };
  }
  if (outputs.length === 0) return ok({ series, outputs: {}, spreadPctBefore: 0, spreadPct: 0, solutions: final.value, ohms: chosen });
  return ok({
    series,
    outputs: trimmed,
    spreadPctBefore: overallSpread(before),
    spreadPct: overallSpread(after),
    solutions: final.value,
    ohms: chosen,
  });
}
