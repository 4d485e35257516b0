/**
 * Stage 1 of the pipeline: project -> decode spec.
 *
 * The spec is the lit matrix: which output line (`<position><segment>`, such
 * as `1a` or `2tl`) must be driven in which state (`S0`..`S(N-1)`). Outputs
 * that are never lit need no driver; outputs lit in every state are tied on
 * and need no diodes.
 */
import type { Cell, CounterDrive, DarkInput, DecodePolarity, Project } from "../project/project.ts";
import { splitText } from "../project/projectSchema.ts";
import { counterCode, stageLines, type CounterCode } from "./counterCode.ts";
import { levelShift, type LevelShift } from "./levelShift.ts";

/**
 * The polarity one output is decoded in: its lit cells or its dark cells.
 * Which lines take them follows from the driver: a driver that turns on when
 * its node is high (the NPN kinds, direct drive) takes lit cells from the
 * active-high lines and dark cells onto the active-low ones; the high-side
 * switch, on when its node is low, takes lit cells onto the active-low lines
 * (see `outputSide`).
 */
export type OutputPolarity = "lit" | "dark";

/**
 * The lines an output's diodes meet: `high`, the active-high lines `S<k>`
 * (anode at the line, the node raised in their states), or `low`, the
 * active-low lines `nS<k>` (cathode at the line, the node pulled down).
 */
export type LineSide = "high" | "low";

/**
 * The side an output decoded in `polarity` sits on: lit cells raise a
 * non-inverting driver's node, dark cells pull it down; an inverting
 * driver (on when its node is low) the other way round.
 *
 * @example
 * outputSide("lit", false); // "high"
 * outputSide("lit", true);  // "low": a high-side switch's lit cells pull its node down
 */
export function outputSide(polarity: OutputPolarity, inverting: boolean): LineSide {
  return (polarity === "lit") !== inverting ? "high" : "low";
}

/**
 * What the decode polarity needs from the spec: the counter's active-low
 * lines, the dark cells, which polarity each output may take, and what a
 * dark-decoded output's input network costs.
 */
/**
 * The sides of the counter lines a decode uses: the sides of the
 * polarities it may give its outputs (`either` on a high-side switch is lit
 * only).
 *
 * @example
 * decodeSides({ decode: "either", inverting: false }); // Set { "high", "low" }
 * decodeSides({ decode: "lit", inverting: true });     // Set { "low" }
 */
export function decodeSides(p: Pick<SpecPolarity, "decode" | "inverting">): ReadonlySet<LineSide> {
  const polarities: readonly OutputPolarity[] = p.decode === "either" ? (p.inverting ? ["lit"] : ["lit", "dark"]) : [p.decode];
  return new Set(polarities.map((x) => outputSide(x, p.inverting)));
}

export interface SpecPolarity {
  readonly drive: CounterDrive;
  readonly decode: DecodePolarity;
  /** The active-high state lines `S<k>` the counter offers; empty for sink drive. */
  readonly activeHigh: readonly string[];
  /** The active-low state lines `nS<k>` the counter offers; empty for source drive. */
  readonly activeLow: readonly string[];
  /**
   * True when the driver turns on while its node is pulled low (the
   * high-side switch): lit cells are then decoded onto the active-low lines
   * and need no input network (the driver's own resistors pull the node up).
   */
  readonly inverting: boolean;
  /** Per output (as `outputs`), the polarities it may be decoded in. */
  readonly allowed: readonly (readonly OutputPolarity[])[];
  /** `dark[k][j]`: state k leaves `outputs[j]` dark (the complement of `lit`). */
  readonly dark: readonly (readonly boolean[])[];
  readonly darkInput: DarkInput;
  /**
   * Diodes in each dark-decoded output's input network: the level-shift
   * diodes (0 for a divider); null when no number of them keeps a pulled-down
   * output dark (see levelShift.ts).
   */
  readonly inputDiodes: number | null;
  /** Resistors in each dark-decoded output's input network besides its pull-up: 2 for a divider, else 0. */
  readonly inputResistors: number;
  /** The level-shift arithmetic behind `inputDiodes`. */
  readonly levelShift: LevelShift;
}

export interface DecodeSpec {
  readonly states: readonly string[];
  /** How the counter holds its state; its code table for a coded counter. */
  readonly counter: CounterCode;
  /**
   * The counter's lines that can drive the decoder: the state lines `S<k>`
   * of a one-hot counter, or every stage output and its complement
   * (`Q0`, `nQ0`, `Q1`, ...) of a coded one.
   */
  readonly lines: readonly string[];
  /** The text each state shows, as written in the project. */
  readonly texts: readonly string[];
  /** Every output of the display, position by position in segment order. */
  readonly allOutputs: readonly string[];
  /** Outputs the matrix must drive: lit in some states but not all. */
  readonly outputs: readonly string[];
  /** `lit[k][j]`: state k lights `outputs[j]`. */
  readonly lit: readonly (readonly boolean[])[];
  /** Outputs lit in no state: no driver or diode needed. */
  readonly neverLit: readonly string[];
  /** Outputs lit in every state: tie their drivers on, no diodes. */
  readonly tiedOn: readonly string[];
  readonly positions: number;
  readonly cell: Cell;
  readonly polarity: SpecPolarity;
}

/** The output line name of a segment at a position (1-based). */
export function outputName(position: number, segment: string): string {
  return `${position}${segment}`;
}

/** The state line name of state k (0-based). */
export function stateName(k: number): string {
  return `S${k}`;
}

/** The active-low line of state k (0-based): low in state k, high in the others. */
export function activeLowName(k: number): string {
  return `nS${k}`;
}

/**
 * Compiles a validated project into its decode spec.
 *
 * @example
 * const spec = compileSpec(project);
 * spec.outputs; // ["1a", "1b", ...]
 * spec.lit[0];  // [true, true, true, true, true, true, false] for a "0"
 */
export function compileSpec(project: Project): DecodeSpec {
  const { cell, positions } = project.display;
  const allOutputs: string[] = [];
  for (let p = 1; p <= positions; p++) for (const s of cell.segments) allOutputs.push(outputName(p, s));

  const full = project.show.map((text) => litOutputs(text, project));
  const n = project.show.length;
  const count = new Map<string, number>();
  for (const row of full) for (const o of row) count.set(o, (count.get(o) ?? 0) + 1);

  const outputs = allOutputs.filter((o) => {
    const c = count.get(o) ?? 0;
    return c > 0 && c < n;
  });
  const states = project.show.map((_, k) => stateName(k));
  const counter = counterCode(project.counter);
  const lit = full.map((row) => outputs.map((o) => row.has(o)));
  const polarity = specPolarity(project, lit);
  return {
    states,
    counter,
    lines: counter.kind === "one-hot" ? [...polarity.activeHigh, ...polarity.activeLow] : stageLines(counter.stages),
    texts: [...project.show],
    allOutputs,
    outputs,
    lit,
    neverLit: allOutputs.filter((o) => (count.get(o) ?? 0) === 0),
    tiedOn: allOutputs.filter((o) => count.get(o) === n),
    positions,
    cell,
    polarity,
  };
}

function specPolarity(project: Project, lit: readonly (readonly boolean[])[]): SpecPolarity {
  const { drive } = project.counter;
  const { decode, darkInput, depthLimit } = project.synthesis;
  const n = project.show.length;
  const oneHot = project.counter.code === "one-hot";
  const dark = lit.map((row) => row.map((x) => !x));
  const m = lit[0]?.length ?? 0;
  const pulledPerLine = Math.max(1, ...dark.map((row) => row.filter(Boolean).length));
  const shift = levelShift(project.electrical, depthLimit, pulledPerLine);
  const inverting = project.electrical.driver.kind === "high-side-switch";
  // A high-side switch takes lit cells only (polaritySchema.ts): `either` leaves it the one choice.
  const allowed: readonly OutputPolarity[] = inverting ? ["lit"] : decode === "either" ? ["lit", "dark"] : [decode];
  return {
    drive,
    decode,
    activeHigh: !oneHot || drive !== "sink" ? Array.from({ length: n }, (_, k) => stateName(k)) : [],
    activeLow: oneHot && drive !== "source" ? Array.from({ length: n }, (_, k) => activeLowName(k)) : [],
    inverting,
    allowed: Array.from({ length: m }, () => allowed),
    dark,
    darkInput,
    inputDiodes: inverting ? 0 : darkInput === "divider" ? 0 : shift.diodes,
    inputResistors: inverting ? 0 : darkInput === "divider" ? 2 : 0,
    levelShift: shift,
  };
}

/**
 * The polarity part of a spec for a counter of source drive decoded lit, as
 * every spec before dark decode was (tests and hand-made specs).
 */
export function litPolarity(lit: readonly (readonly boolean[])[], states: readonly string[]): SpecPolarity {
  const m = lit[0]?.length ?? 0;
  return {
    drive: "source",
    decode: "lit",
    activeHigh: states,
    activeLow: [],
    inverting: false,
    allowed: Array.from({ length: m }, () => ["lit"] as const),
    dark: lit.map((row) => row.map((x) => !x)),
    darkInput: "level-shift",
    inputDiodes: 0,
    inputResistors: 0,
    levelShift: { diodes: 0, pullUpA: 0, lineLowV: 0, nodeLowV: 0, steps: [], ghostA: 0 },
  };
}

function litOutputs(text: string, project: Project): Set<string> {
  const lit = new Set<string>();
  splitText(text, project.display.cell).forEach((pos, i) => {
    const segments = project.glyphs[pos.char];
    if (segments === undefined) throw new Error(`bug: validated project has no glyph for "${pos.char}"`);
    for (const s of segments) lit.add(outputName(i + 1, s));
    if (pos.dp) lit.add(outputName(i + 1, "dp"));
  });
  return lit;
}

/** Number of lit cells the matrix must drive (the direct diode count). */
export function litCellCount(spec: DecodeSpec): number {
  let c = 0;
  for (const row of spec.lit) for (const x of row) if (x) c++;
  return c;
}
