/**
 * The design: which value each output's current-setting resistor takes
 * (the emitter resistor of a sink, the series resistor of the other kinds),
 * the project's own or the trim's.
 *
 * Every paper (the parts list of `synth`, the budget, the SPICE decks, the
 * BOM, the drawing, the web app) shows the one design this module settles,
 * so that a builder never sees two values for one resistor.
 *
 * The rule (`auto`, the default), over the states at nominal values, with
 * the target window of the corners (target ±windowPct):
 * 1. never over the rating: no lit segment of the trimmed design runs above
 *    `segment.maxA` (or, where the project's values already do, higher
 *    than they do), at nominal or at the high corner;
 * 2. never a wider spread: the display's spread (over every lit segment
 *    and state, the figure the budget reports as `spreadPct`) is no wider
 *    than with the project's values. An output's own spread over the
 *    states comes from the line's sag and the diode depth, which no
 *    resistor value removes, and grows with the current it is set to; it
 *    is reported (a `state-spread` warning names the cause), not judged;
 * 3. it helps: the segments come nearer the target window (the largest
 *    distance of a lit segment outside it shrinks), or, as near, the
 *    spread or the largest distance from the target shrinks, each by at
 *    least `TRIM_HELPS_PCT` percentage points.
 * The trim centres each output on the target; where that alone breaks rule
 * 2, the outputs at the two ends of the display's range are moved one
 * preferred value towards the middle, a step at a time, until it holds. A
 * trim that still breaks a rule, or does not help, is reported with the
 * reason and not applied. `off` keeps the project's values; `on` applies the
 * centred trim even where it widens a spread or does not help, but never over
 * the rating.
 */
import type { DecodeSpec } from "../spec/decodeSpec.ts";
import { preferredNeighbours, type ESeriesName } from "./eSeries.ts";
import type { DiodeMatrix } from "../matrix/matrix.ts";
import { currentOhmsOf, currentRole, type CircuitModel, type CurrentResistorRole, type DarkNetworkValues } from "../matrix/designators.ts";
import { darkOutputs } from "../matrix/matrix.ts";
import { sizeDarkNetwork, type GhostCheck } from "./ghostCheck.ts";
import type { ElectricalModel, Project } from "../project/project.ts";
import { ok, type Result } from "../result/result.ts";
import type { BudgetFailure } from "../circuit/stateSweep.ts";
import { DcWorkspace } from "../circuit/dcSolver.ts";
import { readSweep, type SweepReading } from "./sweepReading.ts";
import { cornerConditions, cornerModel } from "./corners.ts";
import {
  currentRanges,
  offTargetPct,
  overallSpread,
  trimSegments,
  windowDistancePct,
  type CurrentRange,
  type SegmentTrim,
  type TrimInput,
} from "./segmentTrim.ts";

/** `auto`: the trim where the rule allows it; `off`: the project's values; `on`: the trim regardless (never over the rating). */
export type TrimMode = "auto" | "off" | "on";

export const TRIM_MODES: readonly TrimMode[] = ["auto", "off", "on"];

/** Per-output spread over the states above which the budget warns, percent (a choice of diodeloom). */
export const OUTPUT_SPREAD_PCT = 10;

/**
 * What the trim does to the design, over the states at nominal values:
 * `improves` (the rule holds), `widens-spread` (rule 2 fails),
 * `over-rating` (rule 1 fails), `no-help` (rule 3 fails), or `no-change`
 * (nothing to trim, or the trim gives the project's own values).
 */
export type TrimEffect = "improves" | "widens-spread" | "over-rating" | "no-help" | "no-change";

/** Figures of one set of resistor values, over the states at nominal. */
export interface DesignFigures {
  /** Spread over every lit segment, 100 (max - min) / max, percent. */
  readonly spreadPct: number;
  /** Largest distance of a lit segment from the target current, percent of the target. */
  readonly offTargetPct: number;
  /** Largest distance of a lit segment outside the target window, percent of the target (0 inside). */
  readonly windowDistancePct: number;
}

export interface SegmentDesign {
  readonly mode: TrimMode;
  readonly series: ESeriesName;
  /** Which resistor sets the current: `emitter` for a sink, `series` for the other kinds. */
  readonly role: CurrentResistorRole;
  /** True when the design's values are the trim's. */
  readonly trimmed: boolean;
  /** What the trim does; null when it was not worked out (mode `off` without a budget). */
  readonly effect: TrimEffect | null;
  /** The current-setting resistor of every driven output as the design uses it, ohms. */
  readonly ohms: ReadonlyMap<string, number>;
  /** The dark-decoded outputs' input network as sized (ghostCheck.ts); null or absent when none is decoded dark or it was not sized. */
  readonly network?: DarkNetworkValues | null;
}

/** The model a design's circuits are built from: the project's, with the design's input network. */
export function designModel(e: ElectricalModel, d: Pick<SegmentDesign, "network">): CircuitModel {
  return d.network === null || d.network === undefined ? e : { ...e, darkNetwork: d.network };
}

/**
 * The design with the project's own values, the trim not worked out:
 * turned off (`mode` off), or not to be had (no budget).
 */
export function projectDesign(
  model: ElectricalModel,
  matrix: DiodeMatrix,
  options: { readonly mode: TrimMode; readonly series: ESeriesName } = { mode: "auto", series: "E24" },
): SegmentDesign {
  const outputs = [...matrix.outputs, ...matrix.tiedOn];
  const ohms = new Map(outputs.map((o) => [o, currentOhmsOf(model, o)]));
  return {
    mode: options.mode,
    series: options.series,
    role: currentRole(model.driver.kind),
    trimmed: false,
    effect: null,
    ohms,
    network: null,
  };
}

/** The figures of a solved design. */
export function designFigures(ranges: ReadonlyMap<string, CurrentRange>, targetA: number, windowPct: number): DesignFigures {
  return {
    spreadPct: overallSpread(ranges),
    offTargetPct: offTargetPct(ranges, targetA),
    windowDistancePct: windowDistancePct(ranges, targetA, windowPct),
  };
}

/** A hair of rounding that does not count as a change, percentage points. */
const EPS_PCT = 1e-9;
/**
 * The least gain, percentage points, that makes a trim help (rule 3): a
 * smaller one is no change a builder could see or measure (a 1 % resistor
 * moves a segment's current by about 1 %). Our own rule, common practice,
 * no source. Without it a trim that moved the farthest segment by 2e-6 %
 * at nominal counted as help and was applied, while it took the high
 * corner from 11.05 to 19.78 mA (0-9 dark through dividers at depth 3).
 */
export const TRIM_HELPS_PCT = 0.05;

/** Whether the trim keeps the display's spread (rule 2). */
export function keepsSpreads(before: DesignFigures, after: DesignFigures): boolean {
  return after.spreadPct <= before.spreadPct + EPS_PCT;
}

/**
 * How a trim compares with the project's values under the rule.
 *
 * @param overRating the trim runs a segment over its rating at nominal or the high corner (and higher than the project's values do)
 * @example
 * trimEffect({ spreadPct: 0.6, offTargetPct: 40, windowDistancePct: 20 }, { spreadPct: 0.5, offTargetPct: 3, windowDistancePct: 0 }, { sameValues: false, overRating: false }); // "improves"
 */
export function trimEffect(
  before: DesignFigures,
  after: DesignFigures,
  given: { readonly sameValues: boolean; readonly overRating: boolean },
): TrimEffect {
  if (given.sameValues) return "no-change";
  if (given.overRating) return "over-rating";
  if (!keepsSpreads(before, after)) return "widens-spread";
  const nearer = after.windowDistancePct < before.windowDistancePct - TRIM_HELPS_PCT;
  const asNear = after.windowDistancePct <= before.windowDistancePct + EPS_PCT;
  const better = after.spreadPct < before.spreadPct - TRIM_HELPS_PCT || after.offTargetPct < before.offTargetPct - TRIM_HELPS_PCT;
  return nearer || (asNear && better) ? "improves" : "no-help";
}

/** Whether a mode applies a trim of this effect. */
export function appliesTrim(mode: TrimMode, effect: TrimEffect): boolean {
  if (mode === "on") return effect !== "no-change" && effect !== "over-rating";
  return mode === "auto" && effect === "improves";
}

/** The design with everything the budget needs to go on from it. */
export interface SettledDesign {
  readonly design: SegmentDesign;
  /** The project's values, every state solved at nominal. */
  readonly nominal: SweepReading;
  /** The design's values, every state solved at nominal (the same as `nominal` when untrimmed). */
  readonly solutions: SweepReading;
  /** The trim as worked out (centred on the target), shown beside the design. */
  readonly trim: SegmentTrim;
  /** The values the rule judged last: the applied ones, else the candidate that came nearest. */
  readonly judged: ReadonlyMap<string, number>;
  readonly before: DesignFigures;
  readonly after: DesignFigures;
  /** The sizing of the dark-decoded outputs' network, at the project's values; null when none is decoded dark. */
  readonly darkSizing: GhostCheck | null;
}

/** Options of `settleDesign`. */
export interface DesignOptions {
  readonly series: ESeriesName;
  readonly mode: TrimMode;
  /** The target window, percent (the corners'; default 20). */
  readonly windowPct?: number;
  /** `Date.now()` value after which no further state is solved (see `BudgetOptions.deadlineMs`). */
  readonly deadlineMs?: number;
  /** Scratch space of the solves, shared with the caller's other sweeps. */
  readonly workspace?: DcWorkspace;
  /** How many states each sweep solves, from S0 (default: every one; see `SweepOptions.states`). */
  readonly states?: number;
}

/** Most steps towards the middle the rule tries before it calls a trim spread-widening. */
const MAX_STEPS = 6;

/** One set of values the rule judges, solved at nominal. */
interface Candidate {
  readonly values: ReadonlyMap<string, number>;
  readonly solutions: SweepReading;
  readonly figures: DesignFigures;
  readonly effect: TrimEffect;
}

/**
 * Works out the trim and settles the design. The rule judges, in turn, the
 * trim centred output by output (and its steps towards the middle), and,
 * where the project gives every output one value, that value moved as one
 * to the preferred value that centres the whole display on the target; the
 * design takes the one that satisfies the rule and comes nearest the target
 * window, then has the narrower spread.
 *
 * @example
 * const d = settleDesign(project, spec, matrix, { series: "E24", mode: "auto" });
 * if (d.ok) d.value.design.trimmed; // true when the trim improves the design
 */
export function settleDesign(
  project: Project,
  spec: DecodeSpec,
  matrix: DiodeMatrix,
  options: DesignOptions,
): Result<SettledDesign, BudgetFailure> {
  const windowPct = options.windowPct ?? 20;
  let darkSizing: GhostCheck | null = null;
  if (darkOutputs(matrix).length > 0) {
    const g = sizeDarkNetwork(project, spec, matrix, { windowPct, deadlineMs: options.deadlineMs });
    if (!g.ok) {
      const kind = g.error.kind === "time-limit" ? "time-limit" : "no-convergence";
      return { ok: false, error: { kind, state: "", during: "ghost check", message: g.error.message } };
    }
    darkSizing = g.value;
  }
  const network = darkSizing?.values ?? null;
  const e: CircuitModel = designModel(project.electrical, { network });
  const target = e.segment.targetA;
  const role = currentRole(e.driver.kind);
  const workspace = options.workspace ?? new DcWorkspace();
  const sweep = (model: ElectricalModel, during: string, design?: ReadonlyMap<string, number>): Result<SweepReading, BudgetFailure> =>
    readSweep(spec, matrix, model, during, { design, deadlineMs: options.deadlineMs, workspace, states: options.states });
  const nominal = sweep(e, "nominal");
  if (!nominal.ok) return nominal;
  const trimInput = {
    spec,
    matrix,
    model: e,
    nominal: nominal.value,
    series: options.series,
    deadlineMs: options.deadlineMs,
    workspace,
    states: options.states,
  };
  const trim = trimSegments(trimInput);
  if (!trim.ok) return trim;
  const own = projectDesign(e, matrix, options).ohms;
  const driven = [...own.keys()];
  const figures = (sols: SweepReading): DesignFigures => designFigures(currentRanges(spec, sols), target, windowPct);
  const before = figures(nominal.value);
  const same = (values: ReadonlyMap<string, number>): boolean => [...own].every(([o, ohms]) => values.get(o) === ohms);
  const full = (values: ReadonlyMap<string, number>): Map<string, number> =>
    new Map([...own].map(([o, ohms]) => [o, values.get(o) ?? ohms]));
  const nominalPeak = (sols: SweepReading): number => Math.max(0, ...[...currentRanges(spec, sols).values()].map((r) => r.maxA));
  const highPeak = (values: ReadonlyMap<string, number> | undefined): Result<number, BudgetFailure> => {
    const sol = sweep(cornerModel(e, cornerConditions(e)[1], driven, values), "high corner");
    return sol.ok ? ok(nominalPeak(sol.value)) : sol;
  };
  let beforePeak: number | null = null;
  /** Rule 1: the candidate's peak, at nominal and the high corner, over the rating and over the project's own peak. */
  const overRating = (values: ReadonlyMap<string, number>, sols: SweepReading): Result<boolean, BudgetFailure> => {
    const peak = highPeak(values);
    if (!peak.ok) return peak;
    const after = Math.max(peak.value, nominalPeak(sols));
    if (!(after > e.segment.maxA)) return ok(false);
    if (beforePeak === null) {
      const p = highPeak(undefined);
      if (!p.ok) return p;
      beforePeak = Math.max(p.value, nominalPeak(nominal.value));
    }
    return ok(after > beforePeak);
  };
  const judge = (values: ReadonlyMap<string, number>, sols: SweepReading): Result<Candidate, BudgetFailure> => {
    const f = figures(sols);
    if (same(values)) return ok({ values, solutions: sols, figures: f, effect: "no-change" });
    const over = overRating(values, sols);
    if (!over.ok) return over;
    return ok({ values, solutions: sols, figures: f, effect: trimEffect(before, f, { sameValues: false, overRating: over.value }) });
  };

  const centred = judge(full(trim.value.ohms), trim.value.solutions);
  if (!centred.ok) return centred;
  const settled = (c: Candidate, trimmed: boolean): SettledDesign => ({
    design: { mode: options.mode, series: options.series, role, trimmed, effect: c.effect, ohms: trimmed ? c.values : own, network },
    nominal: nominal.value,
    solutions: trimmed ? c.solutions : nominal.value,
    trim: trim.value,
    judged: c.values,
    before,
    after: c.figures,
    darkSizing,
  });
  if (options.mode !== "auto") return ok(settled(centred.value, appliesTrim(options.mode, centred.value.effect)));

  const candidates: Candidate[] = [];
  // The centred trim, stepped towards the middle while the display's spread is what fails.
  let c = centred.value;
  for (let step = 0; step < MAX_STEPS && c.effect === "widens-spread"; step++) {
    const moved = stepTowardsMiddle(currentRanges(spec, c.solutions), c.values, trim.value, options.series);
    if (moved === null) break;
    const sol = sweep(e, "trim", moved);
    if (!sol.ok) return sol;
    const next = judge(moved, sol.value);
    if (!next.ok) return next;
    if (!(next.value.figures.spreadPct < c.figures.spreadPct)) break;
    c = next.value;
  }
  candidates.push(c);
  const values = new Set(own.values());
  if (values.size === 1 && c.effect !== "improves") {
    const uniform = uniformCandidate(trimInput, [...values][0] as number, driven);
    if (!uniform.ok) return uniform;
    if (uniform.value !== null) {
      const u = judge(uniform.value.values, uniform.value.solutions);
      if (!u.ok) return u;
      candidates.push(u.value);
    }
  }
  const improving = candidates.filter((x) => x.effect === "improves");
  if (improving.length === 0) return ok(settled(c, false));
  const best = improving.reduce((a, x) =>
    x.figures.windowDistancePct < a.figures.windowDistancePct - EPS_PCT ||
    (Math.abs(x.figures.windowDistancePct - a.figures.windowDistancePct) <= EPS_PCT && x.figures.spreadPct < a.figures.spreadPct)
      ? x
      : a,
  );
  return ok(settled(best, true));
}

/**
 * Every output's resistor moved as one, from the project's common value to
 * the preferred value that centres the display's whole range on the
 * target (I ~ 1/R, two rounds, then the nearer of the two neighbours), or
 * null when that is the project's own value.
 */
function uniformCandidate(
  input: TrimInput & { readonly workspace: DcWorkspace },
  common: number,
  outputs: readonly string[],
): Result<{ readonly values: Map<string, number>; readonly solutions: SweepReading } | null, BudgetFailure> {
  const { spec, matrix, model, series } = input;
  const target = model.segment.targetA;
  const sweep = (design: ReadonlyMap<string, number>): Result<SweepReading, BudgetFailure> =>
    readSweep(spec, matrix, model, "trim", { design, deadlineMs: input.deadlineMs, workspace: input.workspace, states: input.states });
  const middle = (sols: SweepReading): number => {
    const rs = [...currentRanges(spec, sols).values()];
    return rs.length === 0 ? 0 : (Math.min(...rs.map((r) => r.minA)) + Math.max(...rs.map((r) => r.maxA))) / 2;
  };
  const all = (ohms: number): Map<string, number> => new Map(outputs.map((o) => [o, ohms]));
  const m0 = middle(input.nominal);
  if (!(m0 > target * 1e-6)) return ok(null);
  const r1 = Math.min(10e6, Math.max(1, (common * m0) / target));
  const s1 = sweep(all(r1));
  if (!s1.ok) return s1;
  const m1 = middle(s1.value);
  const ideal = m1 > target * 1e-6 ? Math.min(10e6, Math.max(1, (r1 * m1) / target)) : r1;
  const [lo, hi] = preferredNeighbours(ideal, series);
  let best: { values: Map<string, number>; solutions: SweepReading; distance: number } | null = null;
  for (const ohms of lo === hi ? [lo] : [lo, hi]) {
    if (ohms === common) continue;
    const sol = sweep(all(ohms));
    if (!sol.ok) return sol;
    const distance = Math.abs(middle(sol.value) - target);
    if (best === null || distance < best.distance) best = { values: all(ohms), solutions: sol.value, distance };
  }
  return ok(best === null ? null : { values: best.values, solutions: best.solutions });
}

/**
 * One step towards the middle: the output with the highest lit current
 * takes the next larger preferred value and the one with the lowest the
 * next smaller (at most one preferred value from the trim's own), or null
 * when neither can move.
 */
function stepTowardsMiddle(
  ranges: ReadonlyMap<string, CurrentRange>,
  values: ReadonlyMap<string, number>,
  trim: SegmentTrim,
  series: ESeriesName,
): Map<string, number> | null {
  const rs = [...ranges].filter(([o]) => trim.outputs[o] !== undefined);
  if (rs.length < 2) return null;
  const highest = rs.reduce((a, c) => (c[1].maxA > a[1].maxA ? c : a))[0];
  const lowest = rs.reduce((a, c) => (c[1].minA < a[1].minA ? c : a))[0];
  const next = new Map(values);
  let moved = false;
  const shift = (o: string, up: boolean): void => {
    const now = values.get(o);
    const centred = trim.outputs[o]?.ohms;
    if (now === undefined || centred === undefined) return;
    const to = preferredNeighbours(up ? now * 1.0001 : now * 0.9999, series)[up ? 1 : 0];
    const limit = preferredNeighbours(up ? centred * 1.0001 : centred * 0.9999, series)[up ? 1 : 0];
    if (up ? to > limit : to < limit) return;
    next.set(o, to);
    moved = true;
  };
  shift(highest, true);
  if (lowest !== highest) shift(lowest, false);
  return moved ? next : null;
}

/** The resistor's name in words, for the notes. */
function resistorWords(d: SegmentDesign): string {
  return d.role === "emitter" ? "Emitter resistors" : "Series resistors";
}

/**
 * The design as a builder reads it, one sentence without figures, for the
 * parts list, the BOM, the decks and the reports.
 *
 * @example
 * designNote(design); // "Series resistors: the E24 trim, applied because it brings the segments nearer the target without widening a spread."
 */
export function designNote(d: SegmentDesign): string {
  const what = resistorWords(d);
  if (d.trimmed) {
    if (d.mode === "on" && d.effect !== "improves")
      return `${what}: the ${d.series} trim, applied on request; it ${DOES[d.effect ?? "no-change"]}.`;
    return `${what}: the ${d.series} trim, applied because it ${DOES.improves}.`;
  }
  if (d.mode === "off") return `${what} as in the project (the trim is turned off).`;
  if (d.effect === null) return `${what} as in the project (the trim could not be worked out).`;
  if (d.effect === "no-change") return `${what} as in the project (the trim would change nothing).`;
  return `${what} as in the project: the ${d.series} trim is not applied because it ${WOULD[d.effect]}.`;
}

const DOES: Readonly<Record<TrimEffect, string>> = {
  improves: "brings the segments nearer the target without widening a spread",
  "widens-spread": "widens the brightness spread",
  "over-rating": "runs a segment over its rating",
  "no-help": "does not bring the segments nearer the target",
  "no-change": "changes nothing",
};

const WOULD: Readonly<Record<TrimEffect, string>> = {
  improves: "was not asked for",
  "widens-spread": "would widen the brightness spread",
  "over-rating": "would run a segment over its rating at the high corner",
  "no-help": "would not bring the segments nearer the target",
  "no-change": "would change nothing",
};

/**
 * Where the design's values come from, as a short phrase for a BOM line or
 * a table heading.
 *
 * @example
 * designSource(design); // "trimmed by the budget (E24)" or "as in the project (the trim would widen the spread)"
 */
export function designSource(d: SegmentDesign): string {
  if (d.trimmed) return `trimmed by the budget (${d.series})`;
  if (d.mode === "off") return "as in the project (the trim is turned off)";
  if (d.effect === null) return "as in the project (the trim could not be worked out)";
  if (d.effect === "widens-spread") return "as in the project (the trim would widen the spread)";
  if (d.effect === "over-rating") return "as in the project (the trim would exceed the segment rating)";
  if (d.effect === "no-help") return "as in the project (the trim would not bring it nearer the target)";
  return "as in the project";
}
