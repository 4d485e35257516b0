/**
 * Pagination: a matrix too big for one sheet is cut into blocks of rows and
 * columns, as few as the paper allows, with the notes and title block
 * beside the matrix (side) or under it (bottom); only the blocks with
 * something on them become sheets.
 */
import type { Box } from "./drawingModel.ts";
import { textWidth } from "./drawingModel.ts";
import type { Grid } from "./layoutGrid.ts";
import { GAP } from "./layoutMetrics.ts";
import { LOGIC_SUPPLY_NET } from "../core/papers/wiringList.ts";
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
  return 3.5 + (grid.keyH > 0 ? grid.keyH + 1 : 0) + 1 + heads + grid.bands.markH + grid.bands.pullUpH;
}

/** Height under the matrix for the drivers' names, and the dark-decoded columns' input networks above them. */
export function footHeight(grid: Grid): number {
  return grid.m.terminalH + grid.bands.footH;
}

export function rowLabelWidth(grid: Grid): number {
  const m = grid.m;
  const names = [...grid.rows.map((r) => r.text), ...(grid.pullUps.size > 0 ? [LOGIC_SUPPLY_NET] : [])];
  return Math.max(...names.map((t) => textWidth(t, m.rowSize))) + 2;
}

/** Height of the band under the matrix that holds the notes and the title block (bottom arrangement). */
export function bottomBand(notes: readonly string[], content: Box): number {
  return Math.max(TITLE_BLOCK_MM.h, notesHeight(notes, content.w - TITLE_BLOCK_MM.w - GAP));
}

/**
 * The two ways to place the notes and title block (beside the matrix, then
 * under it), each with its cut into blocks of rows and columns.
 */
export function plans(grid: Grid, frame: SheetFrame, notes: readonly string[]): Plan[] {
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
    rows: Math.floor((region.h - headerHeight(grid) - footHeight(grid) - (vStrips ? 2 * m.stripH : 0)) / m.pitchY),
  });
  return (["side", "bottom"] as const).map((arrangement): Plan => {
    const region = regions[arrangement];
    const first = fit(region, false, false);
    const hStrips = C > first.cols;
    const vStrips = R > first.rows;
    const f = fit(region, hStrips, vStrips);
    if (f.cols < 1 || f.rows < 1) return { arrangement, region, rowChunks: [], colChunks: [], hStrips, vStrips, fits: false };
    return { arrangement, region, rowChunks: chunks(R, f.rows), colChunks: chunks(C, f.cols), hStrips, vStrips, fits: true };
  });
}

/** A block of the grid that gets a sheet: its place among the blocks and its rows and columns. */
export interface Block {
  /** Index of its row chunk and its column chunk. */
  readonly ri: number;
  readonly ci: number;
  readonly rows: Chunk;
  readonly cols: Chunk;
}

/**
 * The blocks worth a sheet, in reading order: those holding a diode,
 * those at the foot of an output column, which show its driver, and those
 * at the top of a column with a pull-up, which show the part. A block
 * with neither (counter lines crossing columns they do not feed, a bus's
 * corner) would be a sheet of bare lines, so it gets none; when no block
 * holds anything (a matrix without diodes), the first one is kept.
 */
export function drawnBlocks(grid: Grid, p: Plan): Block[] {
  const m = grid.m;
  const used = new Set<string>();
  const chunkOf = (chunks: readonly Chunk[], i: number): number => chunks.findIndex((c) => i >= c.first && i <= c.last);
  for (const d of grid.diodes) {
    const r = Math.round(d.crossing.y / m.pitchY);
    const c = Math.round(d.crossing.x / grid.pitchX);
    used.add(`${chunkOf(p.rowChunks, r)},${chunkOf(p.colChunks, c)}`);
  }
  const lastRow = p.rowChunks.length - 1;
  grid.columns.forEach((col, c) => {
    if (col.kind === "output" && col.foot) used.add(`${lastRow},${chunkOf(p.colChunks, c)}`);
    // A column's pull-up (a dark-decoded output's or an AND gate's) stands above its first block.
    if (grid.pullUps.has(col.net)) used.add(`0,${chunkOf(p.colChunks, c)}`);
  });
  const blocks: Block[] = [];
  p.rowChunks.forEach((rows, ri) =>
    p.colChunks.forEach((cols, ci) => {
      if (used.has(`${ri},${ci}`)) blocks.push({ ri, ci, rows, cols });
    }),
  );
  const first = { ri: 0, ci: 0, rows: p.rowChunks[0], cols: p.colChunks[0] };
  return blocks.length > 0 || !first.rows || !first.cols ? blocks : [{ ...first, rows: first.rows, cols: first.cols }];
}
