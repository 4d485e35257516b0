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
 *   by position): its driver Q<i> (none for direct drive), the resistor that
 *   sets its current R<i> (the emitter resistor of a sink, the series
 *   resistor of the other kinds) and its segment DS<i>;
 * - then, continuing the R numbers, block by block in output order: base
 *   resistors, base-emitter resistors, a sink's collector resistors, the
 *   pull-downs of the matrix-driven outputs, the tie-on resistors, and the
 *   pull-downs of the tied-on outputs;
 * - then, continuing the R numbers, the pull-up of every AND gate of a coded
 *   counter's decoder, in gate order (`G1` first);
 * - last, for the dark-decoded outputs (in output order): their pull-ups
 *   from the logic supply, continuing the R numbers, then their dividers'
 *   upper resistors; their level-shift diodes continue the D numbers after
 *   the matrix's, output by output from the node towards the driver.
 *
 * An instrument of several decoders numbers each decoder's parts as above
 * and puts the decoder's number (1-based, in file order) in front of every
 * designator: `1D1`.., `2R3`, `3DS7`, so that they are unique across the
 * instrument whatever the number of parts (`withRefPrefix`). A single
 * decoder, and an instrument of one, has no prefix.
 *
 * Values: the resistor that sets the current takes the design's value (a
 * trim, when one is applied), else the project's per-output override, else
 * its default; the others come from the electrical model (a gate's pull-up
 * is `gatePullUp`), and a dark-decoded output's input network from the
 * values the budget sizes (`CircuitModel.darkNetwork`), or, before it has,
 * the estimate of `estimatedDarkNetwork`. A tie-on resistor
 * equals the counter's source resistance and hangs from the logic supply,
 * so a tied-on output's input sits where a lit one's sits.
 */
import { darkOutputs, type Diode, type DiodeMatrix } from "./matrix.ts";
import type { DecodeSpec } from "../spec/decodeSpec.ts";
import type { DriverKind, ElectricalModel } from "../project/project.ts";
import { preferredNeighbours } from "../budget/eSeries.ts";

/**
 * `pull-up`: from the logic supply to a dark-decoded output's node;
 * `divider`: a dark-decoded output's divider, from the node to the driver's input.
 */
export type PartResistorRole =
  "emitter" | "series" | "base" | "base-emitter" | "pull-down" | "line-pull-up" | "tie-on" | "gate-pull-up" | "pull-up" | "divider";

/** The values of the dark-decoded outputs' input network (one set for every such output). */
export interface DarkNetworkValues {
  /** Pull-up from the logic supply to each dark-decoded output node, ohms. */
  readonly pullUpOhms: number;
  /** Level-shift diodes per output (0 with a divider). */
  readonly shiftDiodes: number;
  /** A divider's upper resistor, from the node to the driver's input, ohms; null for level-shift diodes. */
  readonly dividerOhms: number | null;
  /**
   * A divider's lower resistor, from the driver's input to ground, ohms: it
   * takes the place of the output's pull-down; null for level-shift diodes
   * (whose bleed is the pull-down).
   */
  readonly dividerLowerOhms: number | null;
}

/**
 * The electrical model a circuit is built from: the project's, and, where
 * outputs are decoded dark, the values of their input network as the
 * budget sizes them (absent: `estimatedDarkNetwork`). A tolerance corner
 * scales them with the rest (corners.ts).
 */
export type CircuitModel = ElectricalModel & { readonly darkNetwork?: DarkNetworkValues };

/** The parts between a dark-decoded output's node and its driver. */
export interface DarkInputParts {
  readonly output: string;
  /** From the logic supply to the output node. */
  readonly pullUp: StageResistor;
  /** A divider's upper resistor, from the node to the driver's input; null with level-shift diodes. */
  readonly divider: StageResistor | null;
  /** A divider's lower resistor: the output's pull-down designator, with the divider's value (role `divider`); null with level-shift diodes. */
  readonly dividerLower: StageResistor | null;
  /** The level-shift diodes from the node to the driver's input, in that order (`D31`, `D32`); empty with a divider. */
  readonly shiftDiodes: readonly string[];
}

/** The resistor that sets a segment's current for each kind: its emitter resistor for a sink, its series resistor otherwise. */
export type CurrentResistorRole = "emitter" | "series";

/** One resistor of a driver stage. */
export interface StageResistor {
  readonly ref: string;
  readonly role: PartResistorRole;
  /** Ohms. */
  readonly ohms: number;
}

/** The parts around one driven output. */
export interface DriverParts {
  readonly output: string;
  readonly tiedOn: boolean;
  readonly kind: DriverKind;
  /** The driver transistor (an NPN, a high-side switch's PNP), `Q1`...; null for direct drive. */
  readonly transistor: string | null;
  /** The segment (its LEDs in series), `DS1`... */
  readonly display: string;
  /** The resistor that sets the segment current (`R<i>`): `emitter` for a sink, else `series`. */
  readonly current: StageResistor;
  /** A sink's emitter resistor; null for the other kinds. */
  readonly emitter: StageResistor | null;
  /** The segment's series resistor (a sink's collector resistor, when it has one); null where there is none. */
  readonly series: StageResistor | null;
  /** Resistor from the output line to the base; null where the base is the line itself or there is no transistor. */
  readonly base: StageResistor | null;
  /** Resistor across a switch's base and emitter (to ground for the NPN, from the supply for the PNP); null where there is none. */
  readonly baseEmitter: StageResistor | null;
  /**
   * The output line's bleed resistor, `pullDown` ohms: to ground (role
   * `pull-down`), or for a high-side switch to the segment supply (role
   * `line-pull-up`), which holds the PNP off while nothing pulls the line low.
   */
  readonly pullDown: StageResistor;
  /**
   * Resistor that holds a tied-on output on: from the logic supply to its
   * line, or for a high-side switch from its line to ground; null when
   * matrix-driven.
   */
  readonly tieOn: StageResistor | null;
}

export interface ResistorPart extends StageResistor {
  /** The output whose driver stage it belongs to, or the AND gate (`G1`) a gate pull-up pulls up. */
  readonly output: string;
}

/** An AND gate of a coded counter's decoder and the pull-up on its node. */
export interface GateParts {
  /** The gate, `G1`.. (its node). */
  readonly gate: string;
  /** From the logic supply to the gate node, `gatePullUp` ohms. */
  readonly pullUp: StageResistor;
}

export interface Designators {
  /** The matrix diodes, D1.. in assembly order. */
  readonly diodes: readonly Diode[];
  /** One entry per driven or tied-on output, in display order. */
  readonly drivers: readonly DriverParts[];
  /** The AND gates of a coded counter's decoder with their pull-ups, in gate order; empty for a one-hot counter. */
  readonly gates: readonly GateParts[];
  /** The input network of every dark-decoded output, in output order; empty when none is decoded dark. */
  readonly darkInputs: readonly DarkInputParts[];
  /** Every resistor of the build, in R-number order. */
  readonly resistors: readonly ResistorPart[];
}

/** Designator of the diode at `index` (0-based) in assembly order: `D1`... */
export function diodeRef(index: number): string {
  return `D${index + 1}`;
}

/**
 * The designator prefix of decoder `index` (0-based) of an instrument of
 * `count` decoders: its number, 1-based; none when there is one decoder.
 *
 * @example
 * decoderRefPrefix(1, 3); // "2"
 * decoderRefPrefix(0, 1); // ""
 */
export function decoderRefPrefix(index: number, count: number): string {
  if (!Number.isInteger(index) || index < 0 || index >= count) throw new RangeError(`decoder index ${index} of ${count}`);
  return count > 1 ? String(index + 1) : "";
}

/**
 * The matrix as one decoder of an instrument numbers it: every diode's
 * designator with the prefix in front (`D12` becomes `2D12`), and the prefix
 * kept, so that `designators` puts it in front of the transistors',
 * resistors' and segments' too. The structure is the verified one, unchanged.
 * An empty prefix gives the matrix itself.
 *
 * @example
 * withRefPrefix(matrix, "2").diodes[0].ref; // "2D1"
 */
export function withRefPrefix<M extends DiodeMatrix>(matrix: M, prefix: string): M {
  if (prefix === "") return matrix;
  if (!/^\d+$/.test(prefix)) throw new RangeError(`a designator prefix is a decoder number, got ${JSON.stringify(prefix)}`);
  if (matrix.refPrefix !== undefined) throw new RangeError(`the matrix already has the prefix ${matrix.refPrefix}`);
  return { ...matrix, refPrefix: prefix, diodes: matrix.diodes.map((d) => ({ ...d, ref: `${prefix}${d.ref}` })) };
}

/** Which resistor sets the segment current of a kind. */
export function currentRole(kind: DriverKind): CurrentResistorRole {
  return kind === "current-sink" ? "emitter" : "series";
}

/**
 * The resistor that sets an output's current, ohms: the design's value
 * (`chosen`, e.g. a trim) first, then the project's per-output override,
 * then the default (the emitter resistor of a sink, else the series resistor).
 */
export function currentOhmsOf(model: ElectricalModel, output: string, chosen?: ReadonlyMap<string, number>): number {
  const own = chosen?.get(output);
  if (own !== undefined) return own;
  if (currentRole(model.driver.kind) === "emitter") return model.driver.emitterResistors[output] ?? model.driver.emitterResistor;
  return model.segment.seriesResistors[output] ?? model.segment.seriesResistor;
}

/** A sink's collector resistor, ohms (0 = none): the per-output override, else the default. */
function sinkSeriesOhms(model: ElectricalModel, output: string): number {
  return model.segment.seriesResistors[output] ?? model.segment.seriesResistor;
}

/**
 * Numbers every part of a build and gives every resistor its value.
 *
 * @param model the electrical model whose resistor values apply (a tolerance corner passes a changed copy)
 * @param currentOhms values of the resistors that set the current, ohms, keyed by output (a trim); others as in `model`
 * @example
 * const parts = designators(spec, matrix, project.electrical);
 * parts.drivers[0]; // { output: "1a", transistor: "Q1", current: { ref: "R1", role: "series", ohms: 300 }, display: "DS1", ... }
 */
export function designators(
  spec: DecodeSpec,
  matrix: DiodeMatrix,
  model: CircuitModel,
  currentOhms?: ReadonlyMap<string, number>,
): Designators {
  const kind = model.driver.kind;
  const role = currentRole(kind);
  const p = matrix.refPrefix ?? "";
  const tied = new Set(matrix.tiedOn);
  const drivenSet = new Set([...matrix.outputs, ...matrix.tiedOn]);
  const driven = spec.allOutputs.filter((o) => drivenSet.has(o));
  let r = driven.length;
  const block = (outputs: readonly string[], ohmsOf: (o: string) => number | null, as: PartResistorRole): Map<string, StageResistor> => {
    const out = new Map<string, StageResistor>();
    for (const o of outputs) {
      const ohms = ohmsOf(o);
      if (ohms !== null) out.set(o, { ref: `${p}R${++r}`, role: as, ohms });
    }
    return out;
  };
  const dr = model.driver;
  const switching = kind === "low-side-switch" || kind === "high-side-switch";
  const base = block(driven, () => ((switching || kind === "emitter-follower") && dr.baseResistor > 0 ? dr.baseResistor : null), "base");
  const baseEmitter = block(driven, () => (switching ? dr.baseEmitterResistor : null), "base-emitter");
  const collector = block(
    driven,
    (o) => (kind === "current-sink" && sinkSeriesOhms(model, o) > 0 ? sinkSeriesOhms(model, o) : null),
    "series",
  );
  const matrixDriven = driven.filter((o) => !tied.has(o));
  const tiedOn = driven.filter((o) => tied.has(o));
  // A high-side switch's line is pulled up to the segment supply (its emitter), with the same value.
  const bleed: PartResistorRole = kind === "high-side-switch" ? "line-pull-up" : "pull-down";
  const pullDowns = block(matrixDriven, () => model.pullDown, bleed);
  const tieOns = block(tiedOn, () => model.counterOutput.resistance, "tie-on");
  for (const [o, p] of block(tiedOn, () => model.pullDown, bleed)) pullDowns.set(o, p);
  const gates = matrix.gates.map((g): GateParts => ({
    gate: g.ref,
    pullUp: { ref: `${p}R${++r}`, role: "gate-pull-up", ohms: model.gatePullUp },
  }));

  const dark = darkOutputs(matrix);
  const net = dark.length === 0 ? null : (model.darkNetwork ?? estimatedDarkNetwork(spec, model));
  // A divider's lower resistor is the output's pull-down, with the divider's value.
  if (net !== null && net.dividerLowerOhms !== null) {
    for (const o of dark) {
      const p = pullDowns.get(o);
      if (p !== undefined) pullDowns.set(o, { ref: p.ref, role: "divider", ohms: net.dividerLowerOhms });
    }
  }
  const pullUps = block(dark, () => net?.pullUpOhms ?? null, "pull-up");
  const dividers = block(dark, () => net?.dividerOhms ?? null, "divider");
  let nextDiode = matrix.diodes.length;
  const shiftCount = net !== null && net.dividerOhms === null ? net.shiftDiodes : 0;
  const darkInputs = dark.map((o): DarkInputParts => {
    const pullUp = pullUps.get(o);
    if (pullUp === undefined) throw new Error(`bug: no pull-up designator for ${o}`);
    const shift = Array.from({ length: shiftCount }, () => `${p}${diodeRef(nextDiode++)}`);
    const lower = net === null || net.dividerLowerOhms === null ? null : (pullDowns.get(o) ?? null);
    return { output: o, pullUp, divider: dividers.get(o) ?? null, dividerLower: lower, shiftDiodes: shift };
  });

  const drivers = driven.map((o, i): DriverParts => {
    const pullDown = pullDowns.get(o);
    if (pullDown === undefined) throw new Error(`bug: no pull-down designator for ${o}`);
    const current: StageResistor = { ref: `${p}R${i + 1}`, role, ohms: currentOhmsOf(model, o, currentOhms) };
    return {
      output: o,
      tiedOn: tied.has(o),
      kind,
      transistor: kind === "direct" ? null : `${p}Q${i + 1}`,
      display: `${p}DS${i + 1}`,
      current,
      emitter: role === "emitter" ? current : null,
      series: role === "series" ? current : (collector.get(o) ?? null),
      base: base.get(o) ?? null,
      baseEmitter: baseEmitter.get(o) ?? null,
      pullDown,
      tieOn: tieOns.get(o) ?? null,
    };
  });

  const resistors: ResistorPart[] = [];
  for (const d of drivers) {
    for (const x of [d.current, d.base, d.baseEmitter, d.emitter === null ? null : d.series, d.pullDown, d.tieOn]) {
      if (x !== null) resistors.push({ ...x, output: d.output });
    }
  }
  for (const g of gates) resistors.push({ ...g.pullUp, output: g.gate });
  for (const x of darkInputs) for (const y of [x.pullUp, x.divider]) if (y !== null) resistors.push({ ...y, output: x.output });
  resistors.sort((a, b) => refNumber(a.ref) - refNumber(b.ref));
  return { diodes: matrix.diodes, drivers, gates, darkInputs, resistors };
}

/**
 * The input network of the dark-decoded outputs before the budget sizes
 * it: the pull-up that draws each output's share of the active-low line's
 * rating (the design value of the level-shift arithmetic, levelShift.ts),
 * rounded up to E24; the spec's level-shift diodes, or a divider whose
 * resistors both equal the pull-up.
 *
 * @example
 * estimatedDarkNetwork(spec, project.electrical); // { pullUpOhms: 5100, shiftDiodes: 2, dividerOhms: null }
 */
export function estimatedDarkNetwork(spec: DecodeSpec, model: ElectricalModel): DarkNetworkValues {
  const share = spec.polarity.levelShift.pullUpA;
  const exact = share > 0 ? model.logicSupply.volts / share : 10_000;
  const pullUpOhms = preferredNeighbours(Math.min(1e6, Math.max(1000, exact)), "E24")[1];
  const divider = spec.polarity.darkInput === "divider";
  return {
    pullUpOhms,
    shiftDiodes: divider ? 0 : (spec.polarity.inputDiodes ?? 0),
    dividerOhms: divider ? pullUpOhms : null,
    dividerLowerOhms: divider ? pullUpOhms : null,
  };
}

/** The part number of a designator, after any decoder prefix and the class letters (`2R14` is 14). */
function refNumber(ref: string): number {
  return Number(ref.replace(/^\d*[A-Z]+/, ""));
}
