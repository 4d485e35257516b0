/**
 * Stage 1 of the pipeline: project -> decode spec.
 *
 * The spec is the lit matrix: which output line (`<position><segment>`, such
 * as `1a` or `2tl`) must be driven in which state (`S0`..`S(N-1)`). Outputs
 * that are never lit need no driver; outputs lit in every state are tied on
 * and need no diodes.
 */
import type { Cell, Project } from "../project/project.ts";
import { splitText } from "../project/projectSchema.ts";
import { counterCode, stageLines, type CounterCode } from "./counterCode.ts";

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
}

/** The output line name of a segment at a position (1-based). */
export function outputName(position: number, segment: string): string {
  return `${position}${segment}`;
}

/** The state line name of state k (0-based). */
export function stateName(k: number): string {
  return `S${k}`;
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
  return {
    states,
    counter,
    lines: counter.kind === "one-hot" ? states : stageLines(counter.stages),
    texts: [...project.show],
    allOutputs,
    outputs,
    lit: full.map((row) => outputs.map((o) => row.has(o))),
    neverLit: allOutputs.filter((o) => (count.get(o) ?? 0) === 0),
    tiedOn: allOutputs.filter((o) => count.get(o) === n),
    positions,
    cell,
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
