/**
 * The ghost check of a decoder with dark-decoded outputs, and the sizing of
 * their pull-ups.
 *
 * For every state, at the nominal values and at both tolerance corners
 * (corners.ts), the circuit of polarityCircuit.ts is solved and checked:
 * every unlit segment's current stays below the ghost limit
 * (`ghostFraction` x `segment.targetA`), every lit segment carries at least
 * half its target, and each active-low line sinks no more than
 * `lowLine.maxCurrentA`. The pull-up is the E24 value from 1 kOhm to
 * 100 kOhm that passes with the most drive (the smallest), and the check
 * says which limit stops a smaller one.
 */
import type { DecodeSpec } from "../spec/decodeSpec.ts";
import { darkOutputs, type DiodeMatrix } from "../matrix/matrix.ts";
import type { Project } from "../project/project.ts";
import { fail, ok, type Result } from "../result/result.ts";
import { buildPolarityCircuit, type DarkNetworkValues } from "../circuit/polarityCircuit.ts";
import { DcWorkspace, DEFAULT_DC_SETTINGS, solveDc } from "../circuit/dcSolver.ts";
import { isLit } from "../circuit/stateSweep.ts";
import { cornerConditions, cornerModel } from "./corners.ts";
import { E24 } from "./eSeries.ts";

/** A lit segment below this fraction of its target fails the check (it would look dim). */
export const LIT_FLOOR_FRACTION = 0.5;

/** One figure of the check: where it is worst. */
export interface GhostFigure {
  readonly output: string;
  readonly state: string;
  /** `nominal`, `low` or `high`. */
  readonly corner: string;
  /** Amperes. */
  readonly currentA: number;
}

export interface GhostCheck {
  readonly values: DarkNetworkValues;
  /** The ghost limit, amperes. */
  readonly ghostLimitA: number;
  /** The largest unlit current of a dark-decoded output's segment. */
  readonly worstUnlit: GhostFigure;
  /** The smallest lit current of a dark-decoded output's segment. */
  readonly weakestLit: GhostFigure;
  /** The most an active-low line sinks (`output` names the line). */
  readonly mostSunk: GhostFigure;
  /** True when every limit holds. */
  readonly passes: boolean;
  /** Which limit stops a smaller pull-up (or why none passes). */
  readonly binding: string;
}

export interface GhostFailure {
  readonly kind: "no-convergence" | "not-dark";
  readonly message: string;
}

/** The pull-up values tried, ohms: E24 from 1 kOhm to 100 kOhm, ascending. */
export function pullUpCandidates(): number[] {
  const out: number[] = [];
  for (const scale of [100, 1000]) for (const v of E24) out.push(v * scale);
  out.push(100_000);
  return out;
}

/**
 * Sizes the pull-ups and runs the check.
 *
 * @example
 * const g = ghostCheck(project, spec, matrix);
 * if (g.ok) g.value.worstUnlit.currentA; // amperes, below g.value.ghostLimitA
 */
export function ghostCheck(project: Project, spec: DecodeSpec, matrix: DiodeMatrix): Result<GhostCheck, GhostFailure> {
  if (darkOutputs(matrix).length === 0) return fail({ kind: "not-dark", message: "no output is decoded dark" });
  const shiftDiodes = spec.polarity.darkInput === "divider" ? 0 : (spec.polarity.inputDiodes ?? 0);
  const candidates = pullUpCandidates();
  let previous: GhostCheck | null = null;
  for (const pullUpOhms of candidates) {
    // A divider's upper resistor matches the pull-up: it halves the node's level at the bleed's own value at most.
    const values: DarkNetworkValues = {
      pullUpOhms,
      shiftDiodes,
      dividerOhms: spec.polarity.darkInput === "divider" ? pullUpOhms : null,
    };
    const r = checkWith(project, spec, matrix, values);
    if (!r.ok) return r;
    if (r.value.passes) {
      const binding = previous === null ? "the smallest value tried (1 kΩ) passes" : `a smaller pull-up fails: ${previous.binding}`;
      return ok({ ...r.value, binding });
    }
    previous = r.value;
  }
  return ok(previous as GhostCheck);
}

/** The check with given values; `binding` names the first limit broken, if any. */
export function checkWith(
  project: Project,
  spec: DecodeSpec,
  matrix: DiodeMatrix,
  values: DarkNetworkValues,
): Result<GhostCheck, GhostFailure> {
  const e = project.electrical;
  const ghostLimitA = e.ghostFraction * e.segment.targetA;
  const dark = darkOutputs(matrix);
  const models = [
    { name: "nominal", model: e },
    ...cornerConditions(e).map((c) => ({ name: c.name, model: cornerModel(e, c, matrix.outputs) })),
  ];
  let worstUnlit: GhostFigure = { output: "", state: "", corner: "", currentA: -Infinity };
  let weakestLit: GhostFigure = { output: "", state: "", corner: "", currentA: Infinity };
  let mostSunk: GhostFigure = { output: "", state: "", corner: "", currentA: -Infinity };
  const workspace = new DcWorkspace();
  for (const { name, model } of models) {
    for (let k = 0; k < matrix.states.length; k++) {
      const circuit = buildPolarityCircuit(spec, matrix, model, k, values);
      const op = solveDc(circuit, circuit.guess, DEFAULT_DC_SETTINGS, workspace);
      if (!op.ok) return fail({ kind: "no-convergence", message: `${name}: ${op.error.message}` });
      const state = matrix.states[k] as string;
      for (const d of circuit.drivers) {
        if (!dark.includes(d.output)) continue;
        const a = op.value.currents[d.display] ?? 0;
        if (isLit(spec, k, d.output)) {
          if (a < weakestLit.currentA) weakestLit = { output: d.output, state, corner: name, currentA: a };
        } else if (a > worstUnlit.currentA) worstUnlit = { output: d.output, state, corner: name, currentA: a };
      }
      const line = spec.polarity.activeLow[k];
      const sunk = line === undefined ? undefined : op.value.currents[`R${line}`];
      if (line !== undefined && sunk !== undefined && -sunk > mostSunk.currentA)
        mostSunk = { output: line, state, corner: name, currentA: -sunk };
    }
  }
  const broken: string[] = [];
  if (worstUnlit.currentA > ghostLimitA)
    broken.push(`the ghost limit (${worstUnlit.output} unlit in ${worstUnlit.state} at the ${worstUnlit.corner} corner)`);
  if (mostSunk.currentA > e.lowLine.maxCurrentA) broken.push(`the low line's rating (${mostSunk.output} at the ${mostSunk.corner} corner)`);
  if (weakestLit.currentA < LIT_FLOOR_FRACTION * e.segment.targetA)
    broken.push(`half the target current (${weakestLit.output} lit in ${weakestLit.state} at the ${weakestLit.corner} corner)`);
  return ok({
    values,
    ghostLimitA,
    worstUnlit,
    weakestLit,
    mostSunk,
    passes: broken.length === 0,
    binding: broken.length === 0 ? "every limit holds" : broken.join("; "),
  });
}
