/**
 * The strict, complete project that every stage past the parser works on.
 *
 * The loose JSON a person writes (`diodeloom/project@2`, or a format-1 file,
 * migrated) is turned into this once, by `parseProject`; nothing downstream
 * sees optional fields.
 */

/** The format the writer writes. */
export const PROJECT_SCHEMA = "diodeloom/project@2";
/** The first format, still read: its `electrical` section describes a current sink with format 1's defaults. */
export const PROJECT_SCHEMA_V1 = "diodeloom/project@1";

export type DepthPolicy = "mixed" | "per-segment" | "uniform";

/**
 * How the counter holds its state:
 * - `one-hot`: a ring counter, one line per state (`S<k>`), exactly one high;
 * - `johnson`: a twisted-ring counter of N/2 stages;
 * - `binary`: natural binary, state k has code k, ceil(log2 N) stages (N = 10 is BCD);
 * - `custom`: the codes listed in `counter.codes`.
 * A coded counter offers every stage's output `Q<i>` and its complement `nQ<i>`.
 */
export type CounterCodeKind = "one-hot" | "johnson" | "binary" | "custom";

/**
 * Which level marks the active state line of a one-hot counter:
 * - `source`: the active line is high (`S<k>`), the idle lines low;
 * - `sink`: the active line is low (`nS<k>`), the idle lines high;
 * - `complementary`: every stage offers both, `S<k>` and `nS<k>`.
 */
export type CounterDrive = "source" | "sink" | "complementary";

/**
 * How an output is decoded:
 * - `lit`: diodes on its lit cells raise the output node in the states that light it;
 * - `dark`: the node has a pull-up, and diodes on its dark cells pull it down
 *   to an active-low line in the states where its segment is dark;
 * - `either`: per output, whichever makes the whole design cheapest.
 */
export type DecodePolarity = "lit" | "dark" | "either";

/**
 * What keeps a dark-decoded output's driver off while its node is pulled
 * down (the node sits some forward drops above the line's low level):
 * - `level-shift`: diodes in series with the driver's input, as many as the
 *   level-shift arithmetic asks for (each counted as a diode);
 * - `divider`: two resistors that divide the node's voltage down.
 */
export type DarkInput = "level-shift" | "divider";

/** The counter section. */
export interface CounterSection {
  readonly states: number;
  readonly drive: CounterDrive;
  readonly code: CounterCodeKind;
  /**
   * For a `custom` code, one bit string per state, the highest stage leftmost
   * (as a binary number is written); empty for the other codes.
   */
  readonly codes: readonly string[];
}

export type CellKind = "seg7" | "seg7dp" | "custom";

export interface Cell {
  readonly kind: CellKind;
  /** Segment names in drawing order, e.g. `a`..`g` (plus `dp`). */
  readonly segments: readonly string[];
  /**
   * How a custom cell looks: each segment's position and shape. Absent for
   * the built-in cells, and for a custom cell that gives none (it is then
   * drawn as a grid of named pads).
   */
  readonly figure?: CellFigure;
}

/** A point in a figure's coordinate box, `[x, y]`: x to the right, y down, from the box's top left corner. */
export type FigurePoint = readonly [number, number];

/** One segment's shape in a figure's box. */
export type SegmentShape =
  /** A round pip (a die face's), centre and radius. */
  | { readonly kind: "dot"; readonly at: FigurePoint; readonly r: number }
  /** A straight bar with pointed ends, like a seven-segment bar, from end to end. */
  | { readonly kind: "bar"; readonly points: readonly [FigurePoint, FigurePoint]; readonly width: number }
  /** A stroke through 2 to 16 points (an arrowhead, a bent bar). */
  | { readonly kind: "polyline"; readonly points: readonly FigurePoint[]; readonly width: number };

/** A custom cell's drawing: a coordinate box and every segment's shape in it. */
export interface CellFigure {
  /** Size of the coordinate box, in its own units. */
  readonly width: number;
  readonly height: number;
  /** One shape per segment of the cell, by segment name. */
  readonly shapes: Readonly<Record<string, SegmentShape>>;
}

export interface SynthesisOptions {
  /** Most diodes on any path from a counter line to an output line (1-3). */
  readonly depthLimit: number;
  readonly policy: DepthPolicy;
  /** May the optimizer add shared bus nodes? */
  readonly buses: boolean;
  /** May the optimizer add output-to-output links? */
  readonly links: boolean;
  /** Wall-clock limit for the exact optimizer, milliseconds. */
  readonly timeLimitMs: number;
  /** Seed for any randomised step, so a run can be repeated. */
  readonly seed: number;
  /** Which cells the diodes decode: lit, dark or the cheaper per output. */
  readonly decode: DecodePolarity;
  /** The input network of a dark-decoded output. */
  readonly darkInput: DarkInput;
}

/** The synthesis options as the project file spells them. */
export interface SynthesisFields {
  readonly maxDepth: number;
  readonly depth: DepthPolicy;
  readonly buses: boolean;
  readonly links: boolean;
  readonly timeLimitMs: number;
  readonly seed: number;
  readonly decode: DecodePolarity;
  readonly darkInput: DarkInput;
}

/** Counter output stage as a Thevenin source. */
export interface CounterOutputModel {
  /** Open-circuit voltage of the active line, volts. */
  readonly high: number;
  /** Open-circuit voltage of an idle line, volts. */
  readonly low: number;
  /** Series resistance of a high (active) line, ohms. */
  readonly resistance: number;
  /**
   * Series resistance of a low (idle) line, ohms: a discrete stage pulls its
   * line low through a saturated transistor, far stiffer than the collector
   * load it pulls high through. It matters where a low line sinks current,
   * as a coded counter's stage lines do from the gates they hold low.
   */
  readonly lowResistance: number;
  /** Most current one line may source (or, low, sink), amperes; more is a warning naming the line. */
  readonly maxCurrentA: number;
}

/**
 * A counter's active-low line (`nS<k>`, sink or complementary drive) as a
 * Thevenin source: low in its own state, high in the others.
 */
export interface LowLineModel {
  /** Open-circuit voltage of the active (low) line, volts. */
  readonly low: number;
  /** Open-circuit voltage of an idle (high) line, volts. */
  readonly high: number;
  /** Series resistance, ohms (a saturated transistor's, when low). */
  readonly resistance: number;
  /** Most current one active line may sink, amperes. */
  readonly maxCurrentA: number;
}

/**
 * The logic supply: the rail the counter runs from. Tied-on outputs are
 * held on from it (a real net the drawing shows), never from a counter line.
 */
export interface LogicSupplyModel {
  /** Volts. */
  readonly volts: number;
}

/** Matrix diode: Shockley model plus ratings. */
export interface DiodeModel {
  /** Saturation current, amperes. */
  readonly is: number;
  /** Emission coefficient (ideality), dimensionless. */
  readonly n: number;
  /** Series resistance, ohms. */
  readonly rs: number;
  /** Rated continuous forward current, amperes. */
  readonly maxForwardA: number;
  /** Rated reverse voltage, volts. */
  readonly maxReverseV: number;
}

/**
 * The circuit between an output line and its segment (docs/electrical-model.md):
 * - `current-sink`: NPN, base on the line, emitter resistor to ground, the
 *   segment from the supply to the collector;
 * - `low-side-switch`: NPN switch, base resistor from the line, emitter at
 *   ground, the segment and its series resistor from the supply to the
 *   collector (a common-anode display);
 * - `emitter-follower`: NPN, collector on the supply, base on the line
 *   (through a base resistor if given), the series resistor and the segment
 *   from the emitter to ground (a common-cathode display);
 * - `high-side-switch`: PNP switch, emitter on the supply, base resistor
 *   from the line (a base-emitter resistor from the supply holds it off),
 *   the series resistor and the segment from the collector to ground (a
 *   common-cathode display); on while its line is pulled low, so its lit
 *   cells are decoded onto the active-low lines `nS<k>`;
 * - `direct`: no transistor; the line drives the segment through its
 *   series resistor, the other end at ground.
 */
export type DriverKind = "current-sink" | "low-side-switch" | "emitter-follower" | "high-side-switch" | "direct";

/** Segment driver: Ebers-Moll transport model with IS, BF, BR (an NPN, or a PNP for `high-side-switch`), its resistors and ratings. */
export interface DriverModel {
  readonly kind: DriverKind;
  /** Transport saturation current, amperes. */
  readonly is: number;
  readonly betaF: number;
  readonly betaR: number;
  /** Emitter resistor of a current sink, ohms. */
  readonly emitterResistor: number;
  /** Per-output emitter resistor overrides, ohms, keyed by output name (`1a`). */
  readonly emitterResistors: Readonly<Record<string, number>>;
  /** Base resistor of a switch (required) or a follower (0 = base joined to the line), ohms. */
  readonly baseResistor: number;
  /** Resistor across a switch's base and emitter (to ground for the NPN, to the supply for the PNP), ohms; null = none (a PNP needs one). */
  readonly baseEmitterResistor: number | null;
  /** Rated collector-emitter voltage, volts. */
  readonly maxVceV: number;
  /** Rated dissipation, watts. */
  readonly maxPowerW: number;
  /** Rated continuous collector current, amperes. */
  readonly maxCollectorA: number;
}

/** The segment load: `leds` identical LEDs in series, each a Shockley diode with a series resistance, and its series resistor. */
export interface SegmentModel {
  /** LEDs in series per segment, 1-200. */
  readonly leds: number;
  /** Saturation current per LED, amperes. */
  readonly is: number;
  readonly n: number;
  /** Series resistance per LED, ohms. */
  readonly rs: number;
  /**
   * Resistor in series with the segment, ohms: it sets the current of a
   * switch, a follower and direct drive; a current sink may have one in its
   * collector (0 = none) to take part of the drop off the transistor.
   */
  readonly seriesResistor: number;
  /** Per-output series resistor overrides, ohms, keyed by output name. */
  readonly seriesResistors: Readonly<Record<string, number>>;
  /** Intended segment current, amperes. */
  readonly targetA: number;
  /** Rated segment current, amperes. */
  readonly maxA: number;
}

export interface SupplyModel {
  /** Nominal segment supply, volts. */
  readonly volts: number;
  readonly minVolts: number;
  readonly maxVolts: number;
}

export interface ToleranceModel {
  /** Resistor tolerance, percent. */
  readonly resistorPct: number;
  readonly betaMin: number;
  readonly betaMax: number;
  /** Ambient range, degrees Celsius, [low, high]. */
  readonly temperatureC: readonly [number, number];
}

/** The names of the electrical presets (electricalPresets.ts). */
export type PresetName =
  "bench-5v-switch" | "panel-12v-sink" | "cathode-5v-follower" | "bench-5v-high-side" | "line-direct" | "string-hv-sink";

export interface ElectricalModel {
  /**
   * The preset the values start from; null when the file named none and
   * took no default (a format-1 file, whose own defaults apply).
   */
  readonly preset: PresetName | null;
  /** Junction temperature for the nominal solve, degrees Celsius. */
  readonly temperatureC: number;
  /**
   * Largest current an unlit segment may carry, as a fraction of `segment.targetA`
   * (LEDs glow visibly at microamperes).
   */
  readonly ghostFraction: number;
  readonly counterOutput: CounterOutputModel;
  /** The active-low lines, where the counter offers them (sink or complementary drive). */
  readonly lowLine: LowLineModel;
  readonly logicSupply: LogicSupplyModel;
  readonly diode: DiodeModel;
  /** Pull-down from every output line to ground, ohms. */
  readonly pullDown: number;
  /**
   * Pull-up from the logic supply to every AND gate node of a coded
   * counter's decoder, ohms: what a gate whose inputs are all high drives
   * its outputs through, and what each low input line sinks from it.
   */
  readonly gatePullUp: number;
  readonly driver: DriverModel;
  readonly segment: SegmentModel;
  readonly supply: SupplyModel;
  readonly tolerance: ToleranceModel;
}

export interface Project {
  readonly schema: typeof PROJECT_SCHEMA;
  readonly title: string;
  readonly counter: CounterSection;
  readonly display: { readonly positions: number; readonly cell: Cell };
  /**
   * Every character the project may show, mapped to its lit segments: the
   * built-in table for the cell, overridden and extended by the file's own
   * `glyphs`.
   */
  readonly glyphs: Readonly<Record<string, readonly string[]>>;
  /** The file's own glyph entries, kept so that a saved project round-trips. */
  readonly glyphOverrides: Readonly<Record<string, readonly string[]>>;
  /**
   * Per state, the glyph shown at each position, position 1 first. For a
   * `seg7dp` cell a `.` joins the position before it, so `"3."` is one
   * position.
   */
  readonly show: readonly string[];
  readonly synthesis: SynthesisOptions;
  readonly electrical: ElectricalModel;
}
