/**
 * Layout of the matrix drawing: verified matrix -> sheets of lines, diode
 * symbols, junction dots and labels, in millimetres. Pure; no DOM.
 *
 * The steps, one module each: the grid of rows, columns, diodes and wires
 * (layoutGrid.ts, sized by layoutMetrics.ts), the junction dots found on it
 * (junctions.ts), the cut into as few sheets as the paper allows
 * (pagination.ts), the notes (matrixNotes.ts), and each sheet on paper with
 * its continuation marks, heads, notes and title block (layoutSheet.ts).
 * This module tries the scales and puts the sheets together.
 */
import type { DecodeSpec } from "../core/spec/decodeSpec.ts";
import type { DiodeMatrix } from "../core/matrix/matrix.ts";
import type { Project } from "../core/project/project.ts";
import type { Sheet } from "./drawingModel.ts";
import type { DrawingOptions } from "./drawingOptions.ts";
import { buildGrid } from "./layoutGrid.ts";
import { metrics, SCALES } from "./layoutMetrics.ts";
import { layoutSheet } from "./layoutSheet.ts";
import { matrixNotes } from "./matrixNotes.ts";
import { plan, type Plan } from "./pagination.ts";
import { sheetFrame } from "./sheetFrame.ts";

/** Where the wiring list finds a diode on the drawing. */
export interface DiodePlacement {
  readonly sheet: number;
  /** Zone of the crossing, e.g. `C4`. */
  readonly zone: string;
}

export interface MatrixDrawing {
  readonly sheets: readonly Sheet[];
  /** Sheet and zone of every diode, by reference. */
  readonly placements: ReadonlyMap<string, DiodePlacement>;
}

/**
 * Lays out the matrix drawing.
 *
 * @example
 * const drawing = layoutMatrix(project, spec, matrix, drawingOptions(project));
 * drawing.sheets.length;           // 1 for a small matrix
 * drawing.placements.get("D1");    // { sheet: 1, zone: "B2" }
 */
export function layoutMatrix(project: Project, spec: DecodeSpec, matrix: DiodeMatrix, options: DrawingOptions): MatrixDrawing {
  const probe = sheetFrame(options.paper, "landscape");
  // Sized with the continuation note, in case the drawing needs more than one sheet.
  const sizingNotes = matrixNotes(project, spec, matrix, true);
  const sheetsOf = (q: Plan): number => q.rowChunks.length * q.colChunks.length;
  // The fewest sheets, then the largest scale that achieves them.
  const tries = SCALES.map((scale) => {
    const g = buildGrid(project, spec, matrix, metrics(scale));
    return { grid: g, plan: plan(g, probe, sizingNotes) };
  }).filter((t) => t.plan.fits);
  const fewest = Math.min(...tries.map((t) => sheetsOf(t.plan)));
  const chosen = tries.find((t) => sheetsOf(t.plan) === fewest);
  if (!chosen) throw new Error("bug: not even one grid cell fits a sheet");
  const { grid, plan: p } = chosen;
  const count = p.rowChunks.length * p.colChunks.length;
  const sheetNo = (ri: number, ci: number): number => ri * p.colChunks.length + ci + 1;
  const notes = matrixNotes(project, spec, matrix, count > 1);
  const sheets: Sheet[] = [];
  const placements = new Map<string, DiodePlacement>();
  p.rowChunks.forEach((rows, ri) => {
    p.colChunks.forEach((cols, ci) => {
      const neighbours = {
        left: ci > 0 ? sheetNo(ri, ci - 1) : undefined,
        right: ci + 1 < p.colChunks.length ? sheetNo(ri, ci + 1) : undefined,
        up: ri > 0 ? sheetNo(ri - 1, ci) : undefined,
        down: ri + 1 < p.rowChunks.length ? sheetNo(ri + 1, ci) : undefined,
      };
      const sheet = layoutSheet({
        grid,
        plan: p,
        rows,
        cols,
        number: sheetNo(ri, ci),
        count,
        neighbours,
        options,
        title: project.title,
        cell: spec.cell,
        diodeCount: matrix.count,
        notes,
      });
      sheets.push(sheet.sheet);
      for (const [ref, zone] of sheet.zones) placements.set(ref, { sheet: sheet.sheet.number, zone });
    });
  });
  return { sheets, placements };
}
