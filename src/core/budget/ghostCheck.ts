/**
 * The ghost check of a decoder with dark-decoded outputs, and the sizing of
 * their input network.
 *
 * For every state, at the nominal values and at both tolerance corners
 * (corners.ts, which scale the pull-up and the divider with the other
 * resistors in a segment's path), the circuit (circuit.ts with the dark side
 * of polarityCircuit.ts) is solved and checked against four limits:
 * - `ghost`: every unlit segment of a dark-decoded output carries at most
 *   the ghost limit (`ghostFraction` x `segment.targetA`);
 * - `line-sink`: each active-low line sinks at most `lowLine.maxCurrentA`;
 * - `lit-low` and `lit-high`: every lit segment of a dark-decoded output is
 *   within the budget's target window (target ± windowPct, the same window
 *   the budget's corners judge every segment by).
 *
 * Sizing (`sizeDarkNetwork`): the pull-up is an E24 value from 1 kΩ to
 * 100 kΩ. With level-shift diodes (as many as the spec's level-shift
 * arithmetic asks for) it is the smallest that passes (the one with the
 * most drive), or, where that leaves less than 20 % to the ghost limit or
 * the active-low line's rating, the first value up that leaves 20 % and
 * still passes (`PULL_UP_ROOM`). With a divider (an upper resistor from the node to the
 * driver's input, a lower one from there to ground in place of the
 * pull-down): the smallest pull-up that keeps the active-low lines within
 * their rating and the next two; for each, every E6 lower resistor from
 * 1 kΩ up with the smallest E24 upper resistor (1 kΩ to 1 MΩ, by bisection:
 * a larger one only pulls the driver's input lower) that keeps the dark
 * limits, and of those the one that leaves the lit segments the most
 * current, then up the series for the same room (`roomSteps`: the pull-up,
 * and where the ghost limit is short the upper resistor). The result says
 * which limit stops a smaller value. Where no
 * value keeps every limit, the sizing keeps the dark limits first (a ghost
 * is a wrong digit, a dim segment only a dim one) and says which limit is
 * broken.
 *
 * The search solves, at each step, only the states where the figures that
 * matter were worst (the unlit currents and the line's sink at the high
 * corner, the lit ones at the low corner); a value is taken only after the
 * full check of every state at every corner passes, and a full check that
 * finds a limit broken in another state adds that state to the watched ones.
 */
import type { DecodeSpec } from "../spec/decodeSpec.ts";
import { darkOutputs, type DiodeMatrix } from "../matrix/matrix.ts";
import { estimatedDarkNetwork, type CircuitModel, type DarkNetworkValues } from "../matrix/designators.ts";
import type { Project } from "../project/project.ts";
import { fail, ok, type Result } from "../result/result.ts";
import { isLit, type BudgetFailure } from "../circuit/stateSweep.ts";
import { circuitFrame, stateCircuit } from "../circuit/circuit.ts";
import { readSweep, readState, type StateReading, type SweepReading } from "./sweepReading.ts";
import { DcWorkspace, DEFAULT_DC_SETTINGS, solveDc } from "../circuit/dcSolver.ts";
import { cornerConditions, cornerModel } from "./corners.ts";
import { E24 } from "./eSeries.ts";

/** One figure of the check: where it is worst. */
export interface GhostFigure {
  /** The output (for `mostSunk`: the active-low line). */
  readonly output: string;
  readonly state: string;
  /** `nominal`, `low` or `high`. */
  readonly corner: string;
  /** Amperes. */
  readonly currentA: number;
}

/** The limits a dark-decoded output's network is held to. */
export type DarkLimit = "ghost" | "line-sink" | "lit-low" | "lit-high";

/** Per state and corner, the worst figures. */
export interface DarkStateFigures {
  readonly state: string;
  readonly corner: string;
  /** Largest unlit segment current of a dark-decoded output and its output; null when every such output is lit. */
  readonly worstUnlit: { readonly output: string; readonly currentA: number } | null;
  /** Smallest lit segment current of a dark-decoded output; null when none is lit. */
  readonly weakestLit: { readonly output: string; readonly currentA: number } | null;
  /** What the state's active-low line sinks, amperes (0 when the matrix does not use it). */
  readonly lineSinkA: number;
}

/** What every limit of the check came to: the ghost check's own result and the budget's `dark` section share these. */
export interface DarkFigures {
  /** The ghost limit, amperes. */
  readonly ghostLimitA: number;
  /** The lit window, amperes: target ± the window, as the corners judge every segment. */
  readonly litWindowA: readonly [number, number];
  /** The active-low line's rating, amperes. */
  readonly lineRatedA: number;
  /** The largest unlit current of a dark-decoded output's segment. */
  readonly worstUnlit: GhostFigure;
  /** The smallest lit current of a dark-decoded output's segment. */
  readonly weakestLit: GhostFigure;
  /** The largest lit current of a dark-decoded output's segment. */
  readonly strongestLit: GhostFigure;
  /** The most an active-low line sinks (`output` names the line). */
  readonly mostSunk: GhostFigure;
  /** Every state at every corner (nominal, low, high). */
  readonly states: readonly DarkStateFigures[];
  /** The limits broken, in the order of `DarkLimit`; empty when every one holds. */
  readonly broken: readonly DarkLimit[];
  /** True when every limit holds. */
  readonly passes: boolean;
}

export interface GhostCheck extends DarkFigures {
  readonly values: DarkNetworkValues;
  readonly windowPct: number;
  /** Each broken limit and where, in words. */
  readonly why: Readonly<Partial<Record<DarkLimit, string>>>;
  /** Which limit stops a smaller value (or which is broken), in words. */
  readonly binding: string;
}

export interface GhostFailure {
  readonly kind: "no-convergence" | "time-limit" | "not-dark";
  readonly message: string;
}

/** The budget's default target window, percent (budgetTypes.ts `BudgetOptions.windowPct`). */
const DEFAULT_WINDOW_PCT = 20;

/** The pull-up values tried, ohms: E24 from 1 kOhm to 100 kOhm, ascending. */
export function pullUpCandidates(): number[] {
  return e24From(1000, 100_000);
}

/** The divider's upper resistors tried, ohms: E24 from 1 kOhm to 1 MOhm, ascending. */
export function dividerCandidates(): number[] {
  return e24From(1000, 1_000_000);
}

function e24From(lowOhms: number, highOhms: number): number[] {
  const out: number[] = [];
  for (let scale = lowOhms / 10; scale * 10 < highOhms; scale *= 10) for (const v of E24) out.push(v * scale);
  out.push(highOhms);
  return out;
}

/** Options of the check and the sizing. */
export interface GhostOptions {
  /** The target window, percent (default 20, the budget's). */
  readonly windowPct?: number;
  /** `Date.now()` value after which no further state is solved. */
  readonly deadlineMs?: number;
  /** The current-setting resistors of the design, ohms, by output (a trim). */
  readonly design?: ReadonlyMap<string, number>;
}

/** One corner's model, by name. */
type CornerName = "nominal" | "low" | "high";

/**
 * The states each quick check solves: at the high corner those where the
 * unlit currents and the line's sink are largest, at the low corner those
 * where the lit currents are smallest. A full check that finds a limit
 * broken elsewhere adds its state.
 */
interface Watched {
  readonly high: Set<number>;
  readonly low: Set<number>;
}

/** How many states of each kind the quick checks watch after the first full check. */
const WATCHED_PER_FIGURE = 3;

/** What the sizing works with: the project, the options, the states it watches and a count of the solves. */
class Sizer {
  readonly watched: Watched = { high: new Set(), low: new Set() };
  readonly workspace = new DcWorkspace();
  constructor(
    readonly project: Project,
    readonly spec: DecodeSpec,
    readonly matrix: DiodeMatrix,
    readonly options: GhostOptions,
  ) {}

  /** The full check; it adds the states where it finds the figures that matter to the watched ones. */
  full(values: DarkNetworkValues): Result<GhostCheck, GhostFailure> {
    const r = checkWith(this.project, this.spec, this.matrix, values, this.options);
    if (!r.ok) return r;
    this.watch(r.value);
    return r;
  }

  private watch(g: GhostCheck): void {
    const index = new Map(this.spec.states.map((s, k) => [s, k]));
    const top = (corner: string, key: (s: DarkStateFigures) => number): number[] =>
      g.states
        .filter((s) => s.corner === corner)
        .map((s) => ({ k: index.get(s.state) as number, v: key(s) }))
        .filter((x) => Number.isFinite(x.v))
        .sort((a, b) => b.v - a.v)
        .slice(0, WATCHED_PER_FIGURE)
        .map((x) => x.k);
    for (const k of top("high", (s) => s.worstUnlit?.currentA ?? -Infinity)) this.watched.high.add(k);
    for (const k of top("high", (s) => s.lineSinkA)) this.watched.high.add(k);
    for (const k of top("low", (s) => -(s.weakestLit?.currentA ?? Infinity))) this.watched.low.add(k);
    for (const f of [g.worstUnlit, g.mostSunk, g.weakestLit, g.strongestLit]) {
      const k = index.get(f.state);
      if (k === undefined) continue;
      if (f.corner === "low") this.watched.low.add(k);
      else this.watched.high.add(k);
    }
  }

  /** The check on the watched states only: the high corner for the dark limits, the low corner for the lit one. */
  quick(values: DarkNetworkValues): Result<GhostCheck, GhostFailure> {
    const e: CircuitModel = { ...this.project.electrical, darkNetwork: values };
    const [low, high] = cornerConditions(e);
    const driven = [...this.matrix.outputs, ...this.matrix.tiedOn];
    const solved: { name: CornerName; reading: Pick<SweepReading, "drivers" | "states"> }[] = [];
    for (const [name, c, states] of [
      ["high", high, this.watched.high],
      ["low", low, this.watched.low],
    ] as const) {
      // The corner's model has the design's resistors written out, scaled by the corner (as the budget's corners).
      const frame = circuitFrame(this.spec, this.matrix, cornerModel(e, c, driven, this.options.design));
      const readings: StateReading[] = [];
      for (const k of [...states].sort((a, b) => a - b)) {
        if (Date.now() > (this.options.deadlineMs ?? Infinity)) return fail(ghostTimeLimit());
        const circuit = stateCircuit(frame, k);
        const op = solveDc(circuit, circuit.guess, { ...DEFAULT_DC_SETTINGS, deadlineMs: this.options.deadlineMs }, this.workspace);
        if (!op.ok && op.error.timeLimit) return fail(ghostTimeLimit());
        if (!op.ok) return fail({ kind: "no-convergence", message: `${name} corner ghost check: ${op.error.message}` });
        readings.push(readState(this.matrix, { circuit, op: op.value }));
      }
      solved.push({ name, reading: { drivers: frame.drivers, states: readings } });
    }
    return ok(darkFigures(this.project, this.spec, this.matrix, values, solved, this.options.windowPct ?? DEFAULT_WINDOW_PCT));
  }

  /**
   * The check at `values`: quick, and where that passes, full; a full check
   * that fails watches more states, and the quick one runs again.
   */
  passes(values: DarkNetworkValues): Result<{ readonly check: GhostCheck; readonly full: boolean }, GhostFailure> {
    for (;;) {
      const q = this.quick(values);
      if (!q.ok) return q;
      if (!q.value.passes) return ok({ check: q.value, full: false });
      const before = this.watched.high.size + this.watched.low.size;
      const f = this.full(values);
      if (!f.ok) return f;
      if (f.value.passes || this.watched.high.size + this.watched.low.size === before) return ok({ check: f.value, full: true });
    }
  }
}

const darkHolds = (g: GhostCheck): boolean => !g.broken.includes("ghost") && !g.broken.includes("line-sink");

/**
 * Sizes the input network and runs the check.
 *
 * @example
 * const g = sizeDarkNetwork(project, spec, matrix);
 * if (g.ok) g.value.worstUnlit.currentA; // amperes, below g.value.ghostLimitA
 */
export function sizeDarkNetwork(
  project: Project,
  spec: DecodeSpec,
  matrix: DiodeMatrix,
  options: GhostOptions = {},
): Result<GhostCheck, GhostFailure> {
  if (darkOutputs(matrix).length === 0) return fail({ kind: "not-dark", message: "no output is decoded dark" });
  const sizer = new Sizer(project, spec, matrix, options);
  const first = sizer.full(estimatedDarkNetwork(spec, project.electrical));
  if (!first.ok) return first;
  return spec.polarity.darkInput === "divider" ? sizeDivider(sizer) : sizePullUp(sizer, spec.polarity.inputDiodes ?? 0);
}

/**
 * The room a pull-up should leave to the ghost limit and to the active-low
 * line's rating, as a share of each: the corners already hold the parts'
 * spread, so this is what is left for a part off its datasheet (common
 * practice, no source).
 */
export const PULL_UP_ROOM = 0.2;

/** The smaller of the shares left to the ghost limit and to the line's rating: both grow with the pull-up. */
export function pullUpRoom(g: RoomFigures): number {
  const room = rooms(g);
  return Math.min(room.ghost, room.lineSink);
}

/** Room left to the ghost limit and to the line's rating, each as a share of its limit. */
function rooms(g: RoomFigures): { readonly ghost: number; readonly lineSink: number } {
  return { ghost: (g.ghostLimitA - g.worstUnlit.currentA) / g.ghostLimitA, lineSink: (g.lineRatedA - g.mostSunk.currentA) / g.lineRatedA };
}

/** The figures the room is worked out from (a `GhostCheck`, or the budget's `dark` section). */
export type RoomFigures = Pick<GhostCheck, "ghostLimitA" | "worstUnlit" | "lineRatedA" | "mostSunk">;

/** The next value of an ascending series above `ohms`, or null at its top. */
function nextUp(series: readonly number[], ohms: number): number | null {
  return series.find((v) => v > ohms) ?? null;
}

/**
 * One step up the E24 series from sized values that leave less than
 * `PULL_UP_ROOM` to the ghost limit or the line's rating: the values to
 * try, in order (the sizing takes the first that keeps every limit); empty
 * at the top of the series or when the room is there.
 *
 * The next pull-up raises both rooms (the line sinks less, and a
 * pulled-down node sits lower with less current). With a divider, where
 * the ghost limit is short, the next upper resistor too (it pulls an unlit
 * output's driver input lower): tried first where the line's room is
 * there, after the pull-up where it is short too.
 */
export function roomSteps(values: DarkNetworkValues, g: RoomFigures): DarkNetworkValues[] {
  const room = rooms(g);
  if (Math.min(room.ghost, room.lineSink) >= PULL_UP_ROOM) return [];
  const pullUp = nextUp(pullUpCandidates(), values.pullUpOhms);
  const upper = values.dividerOhms === null || room.ghost >= PULL_UP_ROOM ? null : nextUp(dividerCandidates(), values.dividerOhms);
  const steps = [
    ...(pullUp === null ? [] : [{ ...values, pullUpOhms: pullUp }]),
    ...(upper === null ? [] : [{ ...values, dividerOhms: upper }]),
  ];
  // The line's room short: the pull-up first, as it raises both; the ghost limit's alone: the divider first.
  return room.lineSink < PULL_UP_ROOM ? steps : steps.reverse();
}

/**
 * From the smallest values that keep every limit, up the series
 * (`roomSteps`) while the values leave less than `PULL_UP_ROOM` to the
 * ghost limit or the line's rating and a step keeps every limit: larger
 * values only take a little drive from the lit segments. A solve the clock
 * cuts keeps the last values. Returns the check of the values taken, the
 * smallest's own when no step keeps every limit.
 */
function upForRoom(sizer: Sizer, smallest: GhostCheck): GhostCheck {
  let chosen = smallest;
  for (;;) {
    let next: GhostCheck | null = null;
    for (const values of roomSteps(chosen.values, chosen)) {
      const r = sizer.passes(values);
      if (!r.ok) return chosen;
      if (r.value.check.passes) {
        next = r.value.check;
        break;
      }
    }
    if (next === null) return chosen;
    chosen = next;
  }
}

const share = (x: number): string => `${(100 * x).toFixed(1)} %`;

/**
 * Level-shift diodes: the smallest pull-up that keeps every limit (the one
 * with the most drive), then up the series for room (`upForRoom`).
 */
function sizePullUp(sizer: Sizer, shiftDiodes: number): Result<GhostCheck, GhostFailure> {
  let previous: GhostCheck | null = null;
  let fallback: GhostCheck | null = null;
  for (const pullUpOhms of pullUpCandidates()) {
    const r = sizer.passes({ pullUpOhms, shiftDiodes, dividerOhms: null, dividerLowerOhms: null });
    if (!r.ok) return r;
    const g = r.value.check;
    if (g.passes) {
      const smallest =
        previous === null ? "every limit holds at the smallest pull-up tried (1 kΩ)" : `a smaller pull-up breaks ${previous.binding}`;
      const chosen = upForRoom(sizer, g);
      if (chosen === g) return ok({ ...g, binding: smallest });
      const binding =
        `a smaller pull-up leaves less than ${share(PULL_UP_ROOM)} to the ghost limit or the active-low line's rating ` +
        `(${g.values.pullUpOhms / 1000} kΩ, the smallest that keeps every limit, leaves ${share(pullUpRoom(g))}; ${smallest})`;
      return ok({ ...chosen, binding });
    }
    if (fallback === null && darkHolds(g)) fallback = g;
    previous = g;
  }
  return nonePasses(sizer, fallback ?? (previous as GhostCheck), "pull-up");
}

/** Where no value keeps every limit: the full check of the best one, saying so. */
function nonePasses(sizer: Sizer, best: GhostCheck, what: string): Result<GhostCheck, GhostFailure> {
  const f = checkWith(sizer.project, sizer.spec, sizer.matrix, best.values, sizer.options);
  if (!f.ok) return f;
  return ok({
    ...f.value,
    binding: `no ${what} tried keeps every limit; the dark limits kept with the most lit current: ${f.value.binding}`,
  });
}

/** A divider's values in words: `4.7 kΩ pull-ups over 12 kΩ upper resistors`. */
function dividerText(v: DarkNetworkValues): string {
  return `${v.pullUpOhms / 1000} kΩ pull-ups over ${(v.dividerOhms as number) / 1000} kΩ upper resistors`;
}

/** The divider's lower resistors tried, ohms: E6 from 1 kOhm to 100 kOhm. */
export function dividerLowerCandidates(): number[] {
  return e24From(1000, 100_000).filter((v) => [10, 15, 22, 33, 47, 68].includes(Number(String(v).slice(0, 2))));
}

/** Pull-ups tried above the smallest that keeps the line within its rating (a larger one only takes drive away). */
const DIVIDER_PULL_UP_STEPS = 3;

/**
 * A divider: the smallest pull-up that keeps the active-low lines within
 * their rating (with the divider out of the way, where the line sinks the
 * most) and the next few; for each, every lower resistor with the smallest
 * upper resistor that keeps the dark limits, and of those the one that gives
 * the lit segments the most current.
 */
function sizeDivider(sizer: Sizer): Result<GhostCheck, GhostFailure> {
  const pullUps = pullUpCandidates();
  const open = 1e9;
  const sinkHolds = (pullUpOhms: number): Result<GhostCheck, GhostFailure> =>
    sizer.quick({ pullUpOhms, shiftDiodes: 0, dividerOhms: open, dividerLowerOhms: open });
  // Bisection for the smallest pull-up the line's rating allows.
  let lo = 0;
  let hi = pullUps.length - 1;
  let belowSink: GhostCheck | null = null;
  while (lo < hi) {
    const mid = Math.floor((lo + hi) / 2);
    const r = sinkHolds(pullUps[mid] as number);
    if (!r.ok) return r;
    if (r.value.broken.includes("line-sink")) {
      belowSink = r.value;
      lo = mid + 1;
    } else hi = mid;
  }
  const uppers = dividerCandidates();
  let best: { check: GhostCheck; why: string } | null = null;
  for (let step = 0; step < DIVIDER_PULL_UP_STEPS && lo + step < pullUps.length; step++) {
    const pullUpOhms = pullUps[lo + step] as number;
    let bestHere: { check: GhostCheck; why: string } | null = null;
    let floor = 0;
    let falling = 0;
    for (const lowerOhms of dividerLowerCandidates()) {
      const at = (i: number): DarkNetworkValues => ({
        pullUpOhms,
        shiftDiodes: 0,
        dividerOhms: uppers[i] as number,
        dividerLowerOhms: lowerOhms,
      });
      // The smallest upper resistor that keeps the dark limits; it only grows with the lower one.
      let a = floor;
      let b = uppers.length;
      let dark: GhostCheck | null = null;
      let below: GhostCheck | null = null;
      while (a < b) {
        const mid = Math.floor((a + b) / 2);
        const r = sizer.quick(at(mid));
        if (!r.ok) return r;
        if (darkHolds(r.value)) {
          dark = r.value;
          b = mid;
        } else {
          below = r.value;
          a = mid + 1;
        }
      }
      if (dark === null) break;
      floor = a;
      const why = below === null ? "" : [below.why.ghost, below.why["line-sink"]].filter((x) => x !== undefined).join("; ");
      if (bestHere === null || dark.weakestLit.currentA > bestHere.check.weakestLit.currentA) {
        bestHere = { check: dark, why };
        falling = 0;
      } else if (++falling >= 2) break;
    }
    if (bestHere === null) continue;
    if (best === null || bestHere.check.weakestLit.currentA > best.check.weakestLit.currentA) best = bestHere;
    if (bestHere.check.passes) {
      const r = sizer.passes(bestHere.check.values);
      if (!r.ok) return r;
      if (r.value.check.passes) {
        const v = r.value.check.values;
        const pullUpWhy =
          step === 0
            ? belowSink === null
              ? "the smallest tried"
              : `a smaller one breaks ${belowSink.why["line-sink"] ?? belowSink.binding}`
            : "a smaller one leaves the lit segments less current at the smallest divider that keeps them dark";
        const sized =
          `pull-up: ${pullUpWhy}; divider: ${bestHere.why === "" ? "the smallest upper resistor tried" : `a smaller upper resistor breaks ${bestHere.why}`}; ` +
          `its lower resistor (${(v.dividerLowerOhms as number) / 1000} kΩ) is the one that leaves the lit segments the most current`;
        const smallest = r.value.check;
        const chosen = upForRoom(sizer, smallest);
        if (chosen === smallest) return ok({ ...smallest, binding: sized });
        const c = chosen.values;
        const binding =
          `${sized}; then up the series, as ${dividerText(v)}, the smallest that keep every limit, leave ${share(pullUpRoom(smallest))} ` +
          `to the ghost limit or the active-low line's rating, less than ${share(PULL_UP_ROOM)}: ` +
          `${dividerText(c)} leave ${share(pullUpRoom(chosen))}${pullUpRoom(chosen) < PULL_UP_ROOM ? " (no value further up keeps every limit)" : ""}`;
        return ok({ ...chosen, binding });
      }
    }
  }
  if (best === null) {
    const r = sinkHolds(pullUps[pullUps.length - 1] as number);
    if (!r.ok) return r;
    return nonePasses(sizer, r.value, "pull-up and divider");
  }
  return nonePasses(sizer, best.check, "pull-up and divider");
}

/**
 * The check with given values: every state solved at the nominal values and
 * both corners. `binding` names the limits broken, if any.
 */
export function checkWith(
  project: Project,
  spec: DecodeSpec,
  matrix: DiodeMatrix,
  values: DarkNetworkValues,
  options: GhostOptions = {},
): Result<GhostCheck, GhostFailure> {
  const e: CircuitModel = { ...project.electrical, darkNetwork: values };
  const driven = [...matrix.outputs, ...matrix.tiedOn];
  const runs: { name: string; model: CircuitModel }[] = [
    { name: "nominal", model: e },
    ...cornerConditions(e).map((c) => ({ name: c.name, model: cornerModel(e, c, driven, options.design) })),
  ];
  const solved: { name: string; reading: SweepReading }[] = [];
  const workspace = new DcWorkspace();
  for (const { name, model } of runs) {
    const during = `${name === "nominal" ? "nominal" : `${name} corner`} ghost check`;
    // A corner's model has the design's resistors written out, scaled by the corner: only the nominal run takes them as given.
    const design = name === "nominal" ? options.design : undefined;
    const sweep = readSweep(spec, matrix, model, during, { design, deadlineMs: options.deadlineMs, workspace });
    if (!sweep.ok) return fail(failureOf(sweep.error));
    solved.push({ name, reading: sweep.value });
  }
  return ok(darkFigures(project, spec, matrix, values, solved, options.windowPct ?? DEFAULT_WINDOW_PCT));
}

function failureOf(f: BudgetFailure): GhostFailure {
  return { kind: f.kind, message: f.message };
}

/**
 * The check's figures from states already solved and read (the budget's
 * own sweeps at nominal and the two corners, with the network's values in
 * their model).
 *
 * @param solved per corner (`nominal`, `low`, `high`), the states read
 */
export function darkFigures(
  project: Project,
  spec: DecodeSpec,
  matrix: DiodeMatrix,
  values: DarkNetworkValues,
  solved: readonly { readonly name: string; readonly reading: Pick<SweepReading, "drivers" | "states"> }[],
  windowPct: number,
): GhostCheck {
  const e = project.electrical;
  const ghostLimitA = e.ghostFraction * e.segment.targetA;
  const litWindowA = [e.segment.targetA * (1 - windowPct / 100), e.segment.targetA * (1 + windowPct / 100)] as const;
  const dark = new Set(darkOutputs(matrix));
  const none = (currentA: number): GhostFigure => ({ output: "", state: "", corner: "", currentA });
  let worstUnlit = none(0);
  let weakestLit = none(Infinity);
  let strongestLit = none(0);
  let mostSunk = none(0);
  const states: DarkStateFigures[] = [];
  for (const { name, reading } of solved) {
    for (const s of reading.states) {
      const k = s.stateIndex;
      const state = s.state;
      let unlit: { output: string; currentA: number } | null = null;
      let lit: { output: string; currentA: number } | null = null;
      for (const [j, d] of reading.drivers.entries()) {
        if (!dark.has(d.output)) continue;
        const a = s.segmentA[j] ?? 0;
        if (isLit(spec, k, d.output)) {
          if (lit === null || a < lit.currentA) lit = { output: d.output, currentA: a };
          if (a < weakestLit.currentA) weakestLit = { output: d.output, state, corner: name, currentA: a };
          if (a > strongestLit.currentA) strongestLit = { output: d.output, state, corner: name, currentA: a };
        } else {
          if (unlit === null || a > unlit.currentA) unlit = { output: d.output, currentA: a };
          if (a > worstUnlit.currentA) worstUnlit = { output: d.output, state, corner: name, currentA: a };
        }
      }
      const line = spec.polarity.activeLow[k];
      const lineSinkA = s.lowLineSinkA;
      if (line !== undefined && lineSinkA > mostSunk.currentA) mostSunk = { output: line, state, corner: name, currentA: lineSinkA };
      states.push({ state, corner: name, worstUnlit: unlit, weakestLit: lit, lineSinkA });
    }
  }
  const broken: DarkLimit[] = [];
  const why: Partial<Record<DarkLimit, string>> = {};
  const words: string[] = [];
  const breaks = (limit: DarkLimit, text: string): void => {
    broken.push(limit);
    why[limit] = text;
    words.push(text);
  };
  const at = (f: GhostFigure): string =>
    `${f.output} in ${f.state} at ${f.corner === "nominal" ? "the nominal values" : `the ${f.corner} corner`}`;
  if (worstUnlit.currentA > ghostLimitA) breaks("ghost", `the ghost limit (${at(worstUnlit)}, unlit)`);
  if (mostSunk.currentA > e.lowLine.maxCurrentA) breaks("line-sink", `the active-low line's rating (${at(mostSunk)})`);
  if (Number.isFinite(weakestLit.currentA) && weakestLit.currentA < litWindowA[0])
    breaks("lit-low", `the lit window's lower end (${at(weakestLit)}, lit)`);
  if (strongestLit.currentA > litWindowA[1]) breaks("lit-high", `the lit window's upper end (${at(strongestLit)}, lit)`);
  return {
    values,
    ghostLimitA,
    litWindowA,
    windowPct,
    lineRatedA: e.lowLine.maxCurrentA,
    worstUnlit,
    weakestLit: Number.isFinite(weakestLit.currentA) ? weakestLit : none(0),
    strongestLit,
    mostSunk,
    states,
    broken,
    why,
    passes: broken.length === 0,
    binding: broken.length === 0 ? "every limit holds" : words.join("; "),
  };
}

function ghostTimeLimit(): GhostFailure {
  return { kind: "time-limit", message: `the time limit ran out while the ghost check sized the pull-ups; give a longer time limit` };
}
