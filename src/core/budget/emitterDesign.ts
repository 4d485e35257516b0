/**
 * Which emitter resistors the design uses: the project's own, or the trim.
 *
 * Every paper (the parts list of `synth`, the budget, the SPICE decks, the
 * BOM, the web app) shows the one design this module settles, so that a
 * builder never sees two values for one resistor.
 *
 * By default (`auto`) the trim is applied only where it makes the design
 * better and nothing worse: its brightness spread over every lit string no
 * wider, its worst distance from the target current no larger, and one of
 * the two smaller. A trim that would widen the spread (it can: the trim
 * centres each output on the target one by one, and rounding to preferred
 * values can leave the outputs less even than equal resistors did) is
 * reported, never applied by default. `off` keeps the project's values (the
 * untrimmed design); `on` applies the trim whatever it does.
 */
import type { DecodeSpec } from "../spec/decodeSpec.ts";
import type { ESeriesName } from "./eSeries.ts";
import type { DiodeMatrix } from "../matrix/matrix.ts";
import { emitterOhmsOf } from "../matrix/designators.ts";
import type { ElectricalModel, Project } from "../project/project.ts";
import { ok, type Result } from "../result/result.ts";
import { solveAllStates, type BudgetFailure, type StateSolution } from "../circuit/stateSweep.ts";
import { currentRanges, offTargetPct, overallSpread, trimEmitters, type CurrentRange, type EmitterTrim } from "./emitterTrim.ts";

/** `auto`: the trim where it improves the design; `off`: the project's values; `on`: the trim regardless. */
export type TrimMode = "auto" | "off" | "on";

export const TRIM_MODES: readonly TrimMode[] = ["auto", "off", "on"];

/**
 * What the trim does to the design, over the states at nominal values:
 * `improves` (spread and distance from the target no worse, one of them
 * better), `widens-spread`, `moves-off-target` (the worst string ends up
 * further from the target), or `no-change` (nothing to trim, or the trim
 * gives the project's own values).
 */
export type TrimEffect = "improves" | "widens-spread" | "moves-off-target" | "no-change";

/** Spread and distance from the target of one set of emitter resistors. */
export interface DesignFigures {
  /** Spread over every lit string, 100 (max - min) / max, percent. */
  readonly spreadPct: number;
  /** Largest distance of a lit string from the target current, percent of the target. */
  readonly offTargetPct: number;
}

export interface EmitterDesign {
  readonly mode: TrimMode;
  readonly series: ESeriesName;
  /** True when the design's emitter resistors are the trim's. */
  readonly trimmed: boolean;
  /** What the trim does; null when it was not worked out (mode `off` without a budget). */
  readonly effect: TrimEffect | null;
  /** Emitter resistor of every driven output as the design uses it, ohms. */
  readonly emitterOhms: ReadonlyMap<string, number>;
}

/**
 * The design with the project's own emitter resistors, the trim not worked
 * out: turned off (`mode` off), or not to be had (no budget).
 */
export function projectDesign(
  model: ElectricalModel,
  matrix: DiodeMatrix,
  options: { readonly mode: TrimMode; readonly series: ESeriesName } = { mode: "auto", series: "E24" },
): EmitterDesign {
  const outputs = [...matrix.outputs, ...matrix.tiedOn];
  const emitterOhms = new Map(outputs.map((o) => [o, emitterOhmsOf(model, o)]));
  return { mode: options.mode, series: options.series, trimmed: false, effect: null, emitterOhms };
}

/** The spread and distance from the target of a solved design. */
export function designFigures(ranges: ReadonlyMap<string, CurrentRange>, targetA: number): DesignFigures {
  return { spreadPct: overallSpread(ranges), offTargetPct: offTargetPct(ranges, targetA) };
}

/** How a trim compares with the project's values (see TrimEffect). */
export function trimEffect(before: DesignFigures, after: DesignFigures, sameValues: boolean): TrimEffect {
  if (sameValues) return "no-change";
  if (after.spreadPct > before.spreadPct) return "widens-spread";
  if (after.offTargetPct > before.offTargetPct) return "moves-off-target";
  if (after.spreadPct < before.spreadPct || after.offTargetPct < before.offTargetPct) return "improves";
  return "no-change";
}

/** Whether a mode applies a trim of this effect. */
export function appliesTrim(mode: TrimMode, effect: TrimEffect): boolean {
  return mode === "on" ? effect !== "no-change" : mode === "auto" && effect === "improves";
}

/** The emitter design with everything the budget needs to go on from it. */
export interface SettledDesign {
  readonly design: EmitterDesign;
  /** The project's values, every state solved at nominal. */
  readonly nominal: readonly StateSolution[];
  /** The design's values, every state solved at nominal (the same as `nominal` when untrimmed). */
  readonly solutions: readonly StateSolution[];
  readonly trim: EmitterTrim;
  readonly before: DesignFigures;
  readonly after: DesignFigures;
}

/**
 * Works out the trim and settles the design.
 *
 * @example
 * const d = settleDesign(project, spec, matrix, { series: "E24", mode: "auto" });
 * if (d.ok) d.value.design.trimmed; // true when the trim improves the design
 */
export function settleDesign(
  project: Project,
  spec: DecodeSpec,
  matrix: DiodeMatrix,
  options: { readonly series: ESeriesName; readonly mode: TrimMode },
): Result<SettledDesign, BudgetFailure> {
  const e = project.electrical;
  const nominal = solveAllStates(spec, matrix, e, "nominal");
  if (!nominal.ok) return nominal;
  const trim = trimEmitters({ spec, matrix, model: e, nominal: nominal.value, series: options.series });
  if (!trim.ok) return trim;
  const target = e.string.targetA;
  const before = designFigures(currentRanges(spec, nominal.value), target);
  const after = designFigures(currentRanges(spec, trim.value.solutions), target);
  const own = projectDesign(e, matrix, options).emitterOhms;
  const same = [...own].every(([o, ohms]) => (trim.value.ohms.get(o) ?? ohms) === ohms);
  const effect = trimEffect(before, after, same);
  const trimmed = appliesTrim(options.mode, effect);
  const emitterOhms = trimmed ? new Map([...own].map(([o, ohms]) => [o, trim.value.ohms.get(o) ?? ohms])) : own;
  return ok({
    design: { mode: options.mode, series: options.series, trimmed, effect, emitterOhms },
    nominal: nominal.value,
    solutions: trimmed ? trim.value.solutions : nominal.value,
    trim: trim.value,
    before,
    after,
  });
}

/**
 * The design as a builder reads it, one sentence without figures, for the
 * parts list, the BOM, the decks and the reports.
 *
 * @example
 * designNote(design); // "Emitter resistors: the E24 trim, applied because it narrows the spread or brings the strings nearer the target, and worsens neither."
 */
export function designNote(d: EmitterDesign): string {
  if (d.trimmed) {
    if (d.mode === "on" && d.effect !== "improves")
      return `Emitter resistors: the ${d.series} trim, applied on request; it ${DOES[d.effect ?? "no-change"]}.`;
    return `Emitter resistors: the ${d.series} trim, applied because it ${DOES.improves}.`;
  }
  if (d.mode === "off") return "Emitter resistors as in the project (the trim is turned off).";
  if (d.effect === null) return "Emitter resistors as in the project (the trim could not be worked out).";
  if (d.effect === "no-change") return "Emitter resistors as in the project (the trim would change nothing).";
  return `Emitter resistors as in the project: the ${d.series} trim is not applied because it ${WOULD[d.effect]}.`;
}

const DOES: Readonly<Record<TrimEffect, string>> = {
  improves: "narrows the spread or brings the strings nearer the target, and worsens neither",
  "widens-spread": "widens the brightness spread",
  "moves-off-target": "moves the strings further from the target",
  "no-change": "changes nothing",
};

const WOULD: Readonly<Record<TrimEffect, string>> = {
  improves: "was not asked for",
  "widens-spread": "would widen the brightness spread",
  "moves-off-target": "would move the strings further from the target",
  "no-change": "would change nothing",
};

/**
 * Where the design's emitter values come from, as a short phrase for a BOM
 * line or a table heading.
 *
 * @example
 * designSource(design); // "trimmed by the budget (E24)" or "as in the project (the trim would widen the spread)"
 */
export function designSource(d: EmitterDesign): string {
  if (d.trimmed) return `trimmed by the budget (${d.series})`;
  if (d.mode === "off") return "as in the project (the trim is turned off)";
  if (d.effect === null) return "as in the project (the trim could not be worked out)";
  if (d.effect === "widens-spread") return "as in the project (the trim would widen the spread)";
  if (d.effect === "moves-off-target") return "as in the project (the trim would move strings off the target)";
  return "as in the project";
}
