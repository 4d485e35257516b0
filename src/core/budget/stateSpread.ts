/**
 * Brightness that depends on the state: for each output whose current
 * varies between the states that light it by more than 10 %, what makes it
 * vary, from the solved states.
 *
 * The output line's voltage differs between the dimmest and the brightest
 * state by the active line's sag (for a coded counter, the level of the
 * high line or gate that drives it) (its source resistance shared by the
 * segments lit together) plus the drop along the path (one diode more when
 * the dimmest state reaches it through two); a switch that leaves
 * saturation passes that difference on to its segment.
 */
import type { VerifiedMatrix } from "../matrix/matrix.ts";
import type { DecodeSpec } from "../spec/decodeSpec.ts";
import type { DriverKind } from "../project/project.ts";
import { isLit } from "../circuit/stateSweep.ts";
import { depthsFrom } from "./budgetFigures.ts";
import { orPlane } from "../circuit/counterLines.ts";
import type { StateReading, SweepReading } from "./sweepReading.ts";
import type { BudgetWarning, OutputBudget, SpreadCause } from "./budgetTypes.ts";
import { OUTPUT_SPREAD_PCT } from "./segmentDesign.ts";

export type StateSpreadWarning = Extract<BudgetWarning, { code: "state-spread" }>;

/** A share of the input's change below which a cause is not named. */
const NAMED_SHARE = 0.25;

/**
 * The state-spread findings of a design, one per output above 10 %.
 *
 * @example
 * stateSpreads({ spec, matrix, kind: "current-sink", solutions, outputs: budget.outputs })[0];
 * // { level: "warn", code: "state-spread", output: "1a", spreadPct: 14.2, causes: ["line-sag"], ... }
 */
export function stateSpreads(input: {
  readonly spec: DecodeSpec;
  readonly matrix: VerifiedMatrix;
  readonly kind: DriverKind;
  readonly solutions: SweepReading;
  readonly outputs: Readonly<Record<string, OutputBudget>>;
}): StateSpreadWarning[] {
  const { spec, matrix, kind, solutions } = input;
  const states = solutions.states;
  const index = new Map(states.map((s, k) => [s.state, k]));
  const litCount = (k: number): number => solutions.drivers.filter((d) => isLit(spec, k, d.output)).length;
  const out: StateSpreadWarning[] = [];
  for (const [o, r] of Object.entries(input.outputs)) {
    if (r.tiedOn || r.spreadPct <= OUTPUT_SPREAD_PCT || r.minState === null || r.maxState === null) continue;
    const kMin = index.get(r.minState) as number;
    const kMax = index.get(r.maxState) as number;
    const sMin = states[kMin] as StateReading;
    const sMax = states[kMax] as StateReading;
    const j = solutions.drivers.findIndex((d) => d.output === o);
    if (j < 0) continue;
    const lineV = (s: StateReading): number => drivingNode(matrix, s, o).v;
    const driving = drivingNode(matrix, sMin, o).node;
    const gate = matrix.gates.some((g) => g.ref === driving) ? driving : null;
    const inputV = (s: StateReading): number => s.inputV[j] as number;
    const sagDeltaV = lineV(sMax) - lineV(sMin);
    const inputDeltaV = inputV(sMax) - inputV(sMin);
    const dropDeltaV = inputDeltaV - sagDeltaV;
    const depthMin = depthsFrom(matrix, kMin).get(o) ?? 0;
    const depthMax = depthsFrom(matrix, kMax).get(o) ?? 0;
    const shares: [SpreadCause, number][] = [];
    const sag: SpreadCause = gate === null ? "line-sag" : "gate-sag";
    if (sagDeltaV > NAMED_SHARE * Math.abs(inputDeltaV)) shares.push([sag, sagDeltaV]);
    if (depthMin > depthMax && dropDeltaV > NAMED_SHARE * Math.abs(inputDeltaV)) shares.push(["diode-depth", dropDeltaV]);
    shares.sort((a, b) => b[1] - a[1]);
    const causes: SpreadCause[] = shares.map(([c]) => c);
    const p = sMin.points[j] ?? null;
    if ((kind === "low-side-switch" || kind === "high-side-switch") && p !== null && p.vceV > p.vbeV) causes.unshift("switch-unsaturated");
    if (causes.length === 0) causes.push(sagDeltaV >= dropDeltaV ? sag : "diode-depth");
    out.push({
      level: "warn",
      code: "state-spread",
      output: o,
      spreadPct: r.spreadPct,
      minState: r.minState,
      maxState: r.maxState,
      causes,
      sagDeltaV,
      gate,
      litMin: litCount(kMin),
      litMax: litCount(kMax),
      depthMin,
      depthMax,
    });
  }
  return out;
}

/**
 * The node that drives output `o` in a solved state, and its voltage: the
 * active line of a one-hot counter; for a coded counter the highest of the
 * high stage lines and gates with a path to `o`.
 */
function drivingNode(matrix: VerifiedMatrix, s: StateReading, o: string): { node: string | null; v: number } {
  const next = orPlane(matrix);
  const reaches = (from: string): boolean => {
    const seen = new Set([from]);
    const stack = [from];
    while (stack.length > 0) {
      for (const t of next.get(stack.pop() as string) ?? []) {
        if (t === o) return true;
        if (!seen.has(t)) {
          seen.add(t);
          stack.push(t);
        }
      }
    }
    return false;
  };
  let best: { node: string | null; v: number } = { node: null, v: -Infinity };
  for (const [d, v] of s.highDriverV) {
    if (!reaches(d)) continue;
    if (v > best.v) best = { node: d, v };
  }
  return best;
}
