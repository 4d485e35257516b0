/**
 * Pagination: a matrix too big for one sheet is cut into blocks of rows and
 * columns, as few sheets as the paper allows, with the notes and title
 * block beside the matrix (side) or under it (bottom), whichever needs
 * fewer sheets.
 */
import type { Box } from "./drawingModel.ts";
import { textWidth } from "./drawingModel.ts";
import type { Grid } from "./layoutGrid.ts";
import { GAP } from "./layoutMetrics.ts";
import { notesHeight, TITLE_BLOCK_MM, type SheetFrame } from "./sheetFrame.ts";

/** A block of consecutive grid rows or columns, first and last index. */
export interface Chunk {
  readonly first: number;
  readonly last: number;
}

export function chunks(count: number, perSheet: number): Chunk[] {
  const n = Math.max(1, Math.ceil(count / Math.max(1, perSheet)));
  const size = Math.ceil(count / n);
  const out: Chunk[] = [];
  for (let i = 0; i < n; i++) out.push({ first: i * size, last: Math.min(count, (i + 1) * size) - 1 });
  return out;
}

export interface Plan {
  readonly arrangement: "side" | "bottom";
  readonly region: Box;
  readonly rowChunks: Chunk[];
  readonly colChunks: Chunk[];
  readonly hStrips: boolean;
  readonly vStrips: boolean;
  /** False when not even one grid cell fits the region at this scale. */
  readonly fits: boolean;
}

export function headerHeight(grid: Grid): number {
  const m = grid.m;
  const heads = grid.rotateHeads ? Math.max(...grid.columns.map((c) => textWidth(c.head, m.columnSize))) + 1.5 : 4.5 * m.scale;
  return 3.5 + (grid.keyH > 0 ? grid.keyH + 1 : 0) + 1 + heads;
}

export function rowLabelWidth(grid: Grid): number {
  const m = grid.m;
  return Math.max(...grid.rows.map((r) => textWidth(r.text, m.rowSize))) + 2;
}

/** Height of the band under the matrix that holds the notes and the title block (bottom arrangement). */
export function bottomBand(notes: readonly string[], content: Box): number {
  return Math.max(TITLE_BLOCK_MM.h, notesHeight(notes, content.w - TITLE_BLOCK_MM.w - GAP));
}

export function plan(grid: Grid, frame: SheetFrame, notes: readonly string[]): Plan {
  const m = grid.m;
  const c = frame.content;
  const regions: Record<Plan["arrangement"], Box> = {
    side: { x: c.x, y: c.y, w: c.w - TITLE_BLOCK_MM.w - GAP, h: c.h },
    bottom: { x: c.x, y: c.y, w: c.w, h: c.h - bottomBand(notes, c) - GAP },
  };
  const C = Math.max(1, grid.columns.length);
  const R = grid.rows.length;
  const fit = (region: Box, hStrips: boolean, vStrips: boolean): { cols: number; rows: number } => ({
    cols: Math.floor((region.w - rowLabelWidth(grid) - (hStrips ? 2 * m.stripW : 0)) / grid.pitchX),
    rows: Math.floor((region.h - headerHeight(grid) - m.terminalH - (vStrips ? 2 * m.stripH : 0)) / m.pitchY),
  });
  const plans = (["side", "bottom"] as const).map((arrangement): Plan => {
    const region = regions[arrangement];
    const first = fit(region, false, false);
    const hStrips = C > first.cols;
    const vStrips = R > first.rows;
    const f = fit(region, hStrips, vStrips);
    if (f.cols < 1 || f.rows < 1) return { arrangement, region, rowChunks: [], colChunks: [], hStrips, vStrips, fits: false };
    return { arrangement, region, rowChunks: chunks(R, f.rows), colChunks: chunks(C, f.cols), hStrips, vStrips, fits: true };
  });
  const sheets = (p: Plan): number => (p.fits ? p.rowChunks.length * p.colChunks.length : Infinity);
  const [side, bottom] = plans as [Plan, Plan];
  return sheets(bottom) < sheets(side) ? bottom : side;
}
