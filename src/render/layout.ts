/**
 * Layout of the matrix drawing: verified matrix -> sheets of lines, diode
 * symbols, junction dots and labels, in millimetres. Pure; no DOM.
 *
 * The steps, one module each: the grid of rows, columns, diodes and wires
 * (layoutGrid.ts, sized by layoutMetrics.ts), the junction dots found on it
 * (junctions.ts), the cut into blocks of rows and columns and which blocks
 * are worth a sheet (pagination.ts), where a cut line continues
 * (continuation.ts), the notes (matrixNotes.ts), and each sheet on paper
 * with its continuation marks, heads, notes and title block
 * (layoutSheet.ts). This module tries the orientations and scales and puts
 * the sheets together.
 */
import type { DecodeSpec } from "../core/spec/decodeSpec.ts";
import type { DiodeMatrix } from "../core/matrix/matrix.ts";
import type { DarkNetworkValues } from "../core/matrix/designators.ts";
import type { Project } from "../core/project/project.ts";
import type { Orientation, Sheet } from "./drawingModel.ts";
import type { DrawingOptions } from "./drawingOptions.ts";
import { continuations } from "./continuation.ts";
import { buildGrid } from "./layoutGrid.ts";
import { metrics, SCALES } from "./layoutMetrics.ts";
import { layoutSheet } from "./layoutSheet.ts";
import { matrixNotes } from "./matrixNotes.ts";
import { drawnBlocks, plans, type Plan } from "./pagination.ts";
import { sheetFrame } from "./sheetFrame.ts";

/** Where the wiring list finds a diode on the drawing. */
export interface DiodePlacement {
  readonly sheet: number;
  /** Zone of the crossing, e.g. `C4`. */
  readonly zone: string;
}

export interface MatrixDrawing {
  readonly sheets: readonly Sheet[];
  /** Sheet and zone of every diode, and of every part a dark-decoded column or an AND gate's column carries, by reference. */
  readonly placements: ReadonlyMap<string, DiodePlacement>;
}

/** Landscape first: on a tie it is the one tried first, and so the one kept. */
const ORIENTATIONS: readonly Orientation[] = ["landscape", "portrait"];

/**
 * Lays out the matrix drawing: the fewest sheets the paper allows, in
 * either orientation, then the largest scale that achieves them. A block of
 * rows and columns with nothing on it (no diode, no driver) gets no sheet;
 * the lines that pass through it are marked with the sheet they continue on.
 * A dark-decoded output's column carries its pull-up above the matrix and
 * its level-shift diodes or divider below it (darkColumns.ts); their values
 * are printed once `darkValues`, the budget's sized network, is given. An
 * AND gate's column carries its pull-up the same way, with its value.
 *
 * @example
 * const drawing = layoutMatrix(project, spec, matrix, drawingOptions(project));
 * drawing.sheets.length;           // 1 for a small matrix
 * drawing.placements.get("D1");    // { sheet: 1, zone: "B2" }
 */
export function layoutMatrix(
  project: Project,
  spec: DecodeSpec,
  matrix: DiodeMatrix,
  options: DrawingOptions,
  darkValues?: DarkNetworkValues,
): MatrixDrawing {
  // Sized with the continuation note, in case the drawing needs more than one sheet.
  const sizingNotes = matrixNotes(project, spec, matrix, true);
  const grids = SCALES.map((scale) => buildGrid(project, spec, matrix, metrics(scale), darkValues));
  const tries = ORIENTATIONS.flatMap((orientation) => {
    const frame = sheetFrame(options.paper, orientation);
    return grids.flatMap((grid) =>
      plans(grid, frame, sizingNotes)
        .filter((p) => p.fits)
        .map((p) => ({ orientation, grid, plan: p, drawn: drawnBlocks(grid, p) })),
    );
  });
  const fewest = Math.min(...tries.map((t) => t.drawn.length));
  // The fewest sheets; among those the largest scale (tries run largest first), landscape, notes beside the matrix.
  const chosen = tries.find((t) => t.drawn.length === fewest);
  if (!chosen) throw new Error("bug: not even one grid cell fits a sheet");
  const { grid, plan: p, orientation, drawn } = chosen;
  const count = drawn.length;
  const sheetOf = new Map(drawn.map((b, i) => [`${b.ri},${b.ci}`, i + 1]));
  const continues = continuations(grid, p, sheetOf);
  const notes = matrixNotes(project, spec, matrix, count > 1);
  const sheets: Sheet[] = [];
  const placements = new Map<string, DiodePlacement>();
  drawn.forEach((b, i) => {
    const sheet = layoutSheet({
      grid,
      plan: p as Plan,
      orientation,
      rows: b.rows,
      cols: b.cols,
      number: i + 1,
      count,
      continues: (net, edge) => continues(b.ri, b.ci, net, edge),
      pullUpSheet: grid.pullUps.size > 0 ? (sheetOf.get(`0,${b.ci}`) ?? null) : null,
      options,
      title: project.title,
      cell: spec.cell,
      diodeCount: matrix.count,
      notes,
    });
    sheets.push(sheet.sheet);
    for (const [ref, zone] of sheet.zones) placements.set(ref, { sheet: sheet.sheet.number, zone });
  });
  return { sheets, placements };
}
