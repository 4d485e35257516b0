/**
 * Solves the circuit of every counter state of a matrix: the unit of work
 * the budget, the trim and the tolerance corners repeat.
 */
import { circuitFrame, stateCircuit, type Circuit } from "./circuit.ts";
import { DcWorkspace, DEFAULT_DC_SETTINGS, solveDc, type OperatingPoint } from "./dcSolver.ts";
import type { DecodeSpec } from "../spec/decodeSpec.ts";
import type { DiodeMatrix } from "../matrix/matrix.ts";
import type { CircuitModel } from "../matrix/designators.ts";
import { fail, ok, type Result } from "../result/result.ts";

/** One state's circuit and its operating point. */
export interface StateSolution {
  readonly circuit: Circuit;
  readonly op: OperatingPoint;
}

/**
 * The budget could not be worked out: a state's circuit did not converge,
 * or the budget's time ran out before every state was solved.
 */
export interface BudgetFailure {
  readonly kind: "no-convergence" | "time-limit";
  /** The state whose circuit failed, e.g. `S7`. */
  readonly state: string;
  /** Which solve: `nominal`, `lowest supply`, `trim`, `low corner`, `high corner`. */
  readonly during: string;
  readonly message: string;
}

/** Options of a sweep over the states. */
export interface SweepOptions {
  /** Values of the current-setting resistors, ohms, keyed by output (the model's own where absent). */
  readonly design?: ReadonlyMap<string, number>;
  /** `Date.now()` value after which no further state is started. */
  readonly deadlineMs?: number;
  /** Scratch space for the solves, shared by a caller's sweeps one after another. */
  readonly workspace?: DcWorkspace;
  /**
   * How many states to solve, from S0 (default: every one): a budget whose
   * time limit's work cannot check every state checks the first ones
   * (budget/budgetWork.ts). The circuits are the whole matrix's all the same.
   */
  readonly states?: number;
}

/**
 * Solves every state in order and hands each solution to `visit`, keeping
 * none: a caller keeps the figures it needs, so a sweep's memory stays that
 * of one state's circuit. The parts every state shares are built once.
 *
 * @param during names the solve in a failure message
 * @example
 * let most = 0;
 * sweepStates(spec, matrix, project.electrical, "nominal", (s) => (most = Math.max(most, s.op.iterations)));
 */
export function sweepStates(
  spec: DecodeSpec,
  matrix: DiodeMatrix,
  model: CircuitModel,
  during: string,
  visit: (s: StateSolution, k: number) => void,
  options: SweepOptions = {},
): Result<void, BudgetFailure> {
  const deadlineMs = options.deadlineMs ?? Infinity;
  const workspace = options.workspace ?? new DcWorkspace();
  const frame = circuitFrame(spec, matrix, model, options.design);
  const count = Math.min(matrix.states.length, options.states ?? Infinity);
  for (let k = 0; k < count; k++) {
    if (Date.now() > deadlineMs) return fail(timeRanOut(matrix, k, during));
    const circuit = stateCircuit(frame, k);
    const op = solveDc(circuit, circuit.guess, { ...DEFAULT_DC_SETTINGS, deadlineMs }, workspace);
    if (!op.ok && op.error.timeLimit) return fail(timeRanOut(matrix, k, during));
    if (!op.ok) return fail({ kind: "no-convergence", state: op.error.state, during, message: `${during}: ${op.error.message}` });
    visit({ circuit, op: op.value }, k);
  }
  return ok(undefined);
}

function timeRanOut(matrix: DiodeMatrix, k: number, during: string): BudgetFailure {
  const state = matrix.states[k] as string;
  return {
    kind: "time-limit",
    state,
    during,
    message:
      `the budget's time limit ran out during the ${during} solve, at state ${state} of ${matrix.states.length} ` +
      `(every state's circuit is solved several times); give a longer time limit to work it out`,
  };
}

/**
 * Solves every state in order and keeps every circuit and operating point
 * (for tests and small projects; the budget keeps figures instead, see
 * `sweepStates`).
 *
 * @param during names the solve in a failure message
 * @param design optional values of the current-setting resistors, ohms, keyed by output
 * @param deadlineMs optional `Date.now()` value after which no further state is started
 */
export function solveAllStates(
  spec: DecodeSpec,
  matrix: DiodeMatrix,
  model: CircuitModel,
  during: string,
  design?: ReadonlyMap<string, number>,
  deadlineMs: number = Infinity,
): Result<readonly StateSolution[], BudgetFailure> {
  const out: StateSolution[] = [];
  const r = sweepStates(spec, matrix, model, during, (s) => out.push(s), { design, deadlineMs });
  return r.ok ? ok(out) : r;
}

/** Segment current of each driven output in one solved state, amperes. */
export function segmentCurrents(s: StateSolution): Map<string, number> {
  return new Map(s.circuit.drivers.map((d) => [d.output, s.op.currents[d.display] as number]));
}

/** Whether output `o` is lit in state k (tied-on outputs always are). */
export function isLit(spec: DecodeSpec, k: number, o: string): boolean {
  const j = spec.outputs.indexOf(o);
  if (j < 0) return spec.tiedOn.includes(o);
  return spec.lit[k]?.[j] === true;
}
