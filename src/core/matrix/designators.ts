/**
 * Designators: the one place that numbers the parts of a build and gives
 * every resistor its value. The matrix, the circuit builder, the parts
 * count, the BOM, the wiring list, the drawing, the SPICE decks and the
 * budget all read this table, so a part has one name and one value in
 * every paper.
 *
 * Numbering (the usual class letters, common practice: D diode, Q
 * transistor, R resistor, DS display or lamp):
 * - D1.. the matrix diodes, in assembly order (`buildMatrix` orders them and
 *   names each with `diodeRef`);
 * - per driven output, in display order (the cell's segment order, position
 *   by position): its driver Q<i>, emitter resistor R<i> and string DS<i>;
 * - then the pull-downs of the matrix-driven outputs, the tie-on resistors,
 *   and the pull-downs of the tied-on outputs, continuing the R numbers.
 *
 * Values: an emitter resistor takes the design's value (a trim, when one
 * is applied), else the project's per-output override, else its default;
 * a pull-down is `pullDown`; a tie-on resistor equals the counter's source
 * resistance, so a tied-on base sits where a lit one sits.
 */
import type { Diode, DiodeMatrix } from "./matrix.ts";
import type { DecodeSpec } from "../spec/decodeSpec.ts";
import type { ElectricalModel } from "../project/project.ts";

export type PartResistorRole = "emitter" | "pull-down" | "tie-on";

/** The parts around one driven output. */
export interface DriverParts {
  readonly output: string;
  readonly tiedOn: boolean;
  /** The NPN driver, `Q1`... */
  readonly transistor: string;
  /** Its emitter resistor, `R1`... */
  readonly emitterResistor: string;
  /** Ohms. */
  readonly emitterOhms: number;
  /** The segment's LED string, `DS1`... */
  readonly display: string;
  readonly pullDown: string;
  /** Ohms. */
  readonly pullDownOhms: number;
  /** Resistor from the counter's high level to the base of a tied-on output; null when matrix-driven. */
  readonly tieOn: string | null;
  /** Ohms; null when matrix-driven. */
  readonly tieOnOhms: number | null;
}

export interface ResistorPart {
  readonly ref: string;
  readonly role: PartResistorRole;
  /** The output whose driver it belongs to. */
  readonly output: string;
  /** Ohms. */
  readonly ohms: number;
}

export interface Designators {
  /** The matrix diodes, D1.. in assembly order. */
  readonly diodes: readonly Diode[];
  /** One entry per driven or tied-on output, in display order. */
  readonly drivers: readonly DriverParts[];
  /** Every resistor of the build, in R-number order. */
  readonly resistors: readonly ResistorPart[];
}

/** Designator of the diode at `index` (0-based) in assembly order: `D1`... */
export function diodeRef(index: number): string {
  return `D${index + 1}`;
}

/**
 * Emitter resistor of a driven output, ohms: the design's value (`chosen`,
 * e.g. a trim) first, then the project's per-output override, then the
 * default.
 */
export function emitterOhmsOf(model: ElectricalModel, output: string, chosen?: ReadonlyMap<string, number>): number {
  return chosen?.get(output) ?? model.driver.emitterResistors[output] ?? model.driver.emitterResistor;
}

/**
 * Numbers every part of a build and gives every resistor its value.
 *
 * @param model the electrical model whose resistor values apply (a tolerance corner passes a changed copy)
 * @param emitterOhms emitter resistor values of the design, ohms, keyed by output (a trim); others as in `model`
 * @example
 * const parts = designators(spec, matrix, project.electrical);
 * parts.drivers[0]; // { output: "1a", transistor: "Q1", emitterResistor: "R1", emitterOhms: 10000, display: "DS1", pullDown: "R8", ... }
 */
export function designators(
  spec: DecodeSpec,
  matrix: DiodeMatrix,
  model: ElectricalModel,
  emitterOhms?: ReadonlyMap<string, number>,
): Designators {
  const tied = new Set(matrix.tiedOn);
  const drivenSet = new Set([...matrix.outputs, ...matrix.tiedOn]);
  const driven = spec.allOutputs.filter((o) => drivenSet.has(o));
  let r = driven.length;
  const next = (): string => `R${++r}`;
  const pullDownOf = new Map<string, string>();
  for (const o of matrix.outputs) pullDownOf.set(o, next());
  const tieOnOf = new Map<string, string>();
  for (const o of matrix.tiedOn) tieOnOf.set(o, next());
  for (const o of matrix.tiedOn) pullDownOf.set(o, next());

  const tieOnOhms = model.counterOutput.resistance;
  const drivers = driven.map((o, i): DriverParts => {
    const pullDown = pullDownOf.get(o);
    if (pullDown === undefined) throw new Error(`bug: no pull-down designator for ${o}`);
    return {
      output: o,
      tiedOn: tied.has(o),
      transistor: `Q${i + 1}`,
      emitterResistor: `R${i + 1}`,
      emitterOhms: emitterOhmsOf(model, o, emitterOhms),
      display: `DS${i + 1}`,
      pullDown,
      pullDownOhms: model.pullDown,
      tieOn: tieOnOf.get(o) ?? null,
      tieOnOhms: tied.has(o) ? tieOnOhms : null,
    };
  });

  const resistors: ResistorPart[] = [];
  for (const d of drivers) resistors.push({ ref: d.emitterResistor, role: "emitter", output: d.output, ohms: d.emitterOhms });
  for (const d of drivers) resistors.push({ ref: d.pullDown, role: "pull-down", output: d.output, ohms: d.pullDownOhms });
  for (const d of drivers) if (d.tieOn !== null) resistors.push({ ref: d.tieOn, role: "tie-on", output: d.output, ohms: tieOnOhms });
  resistors.sort((a, b) => refNumber(a.ref) - refNumber(b.ref));
  return { diodes: matrix.diodes, drivers, resistors };
}

function refNumber(ref: string): number {
  return Number(ref.replace(/^[A-Z]+/, ""));
}
