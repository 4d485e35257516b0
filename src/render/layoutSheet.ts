/**
 * One sheet of the matrix drawing: a block of the grid moved onto paper,
 * with its wires clipped at the block's edges (an arrowhead and the number
 * of the sheet a cut wire continues on), the diodes whose crossing is in
 * the block, row labels, column heads with their group titles and glyph
 * keys, the drivers at the column feet, the notes and the title block.
 */
import type { Cell } from "../core/project/project.ts";
import {
  STROKE,
  label,
  textWidth,
  type Box,
  type Circle,
  type DiodeSymbol,
  type Dot,
  type Label,
  type Orientation,
  type Point,
  type Polygon,
  type Rect,
  type Segment,
  type Sheet,
} from "./drawingModel.ts";
import type { DrawingOptions } from "./drawingOptions.ts";
import { glyphKey } from "./glyphKey.ts";
import { diodeSymbol, X, Y, type Grid, type GridColumn, type GridRow } from "./layoutGrid.ts";
import { GAP, type Metrics } from "./layoutMetrics.ts";
import type { Edge } from "./continuation.ts";
import { bottomBand, headerHeight, rowLabelWidth, type Chunk, type Plan } from "./pagination.ts";
import { footBand, polarityMarks, pullUpBand, pullUpReferences, type BandInk, type PlacedColumn } from "./darkColumns.ts";
import { notesBlock, sheetFrame, titleBlock, TITLE_BLOCK_MM, zoneOf } from "./sheetFrame.ts";

/** What one sheet shows and where it sits among the others. */
export interface SheetJob {
  readonly grid: Grid;
  readonly plan: Plan;
  /** The block of grid rows and columns this sheet shows. */
  readonly rows: Chunk;
  readonly cols: Chunk;
  /** This sheet's number, 1-based, and how many sheets the drawing has. */
  readonly number: number;
  readonly count: number;
  /** The sheets a net cut at an edge of this sheet continues on; empty where it ends. */
  readonly continues: (net: string, edge: Edge) => readonly number[];
  /**
   * The sheet that draws the pull-ups of this sheet's columns: the one
   * holding their tops (this sheet's own number on a sheet of the first
   * rows); null when no column has a pull-up.
   */
  readonly pullUpSheet: number | null;
  readonly orientation: Orientation;
  readonly options: DrawingOptions;
  /** The project's title, for the title block. */
  readonly title: string;
  /** The display cell, for the glyph keys over the column groups. */
  readonly cell: Cell;
  /** The matrix's diode count, for the title block. */
  readonly diodeCount: number;
  readonly notes: readonly string[];
}

/** A laid-out sheet and the drawing zone of every diode on it (and of a dark-decoded column's parts), by reference. */
export interface SheetLayout {
  readonly sheet: Sheet;
  readonly zones: ReadonlyMap<string, string>;
}

/**
 * Lays out one sheet of the drawing.
 *
 * @example
 * const { sheet, zones } = layoutSheet({ grid, plan, orientation: "landscape", rows, cols, number: 1, count: 1, continues: () => [], pullUpSheet: null, options, title, cell, diodeCount, notes });
 */
export function layoutSheet(job: SheetJob): SheetLayout {
  const { grid, plan: p, rows, cols, number, count, continues, options, notes } = job;
  const m = grid.m;
  const frame = sheetFrame(options.paper, job.orientation);
  const marks = (net: string, edge: Edge): string | null => {
    const to = continues(net, edge);
    return to.length > 0 ? `sh.${to.join(",")}` : null;
  };
  const segments: Segment[] = [...frame.segments];
  const rects: Rect[] = [...frame.rects];
  const labels: Label[] = [...frame.labels];
  const polygons: Polygon[] = [];
  const circles: Circle[] = [];
  const region = p.region;
  const px = grid.pitchX;
  const rowLabelW = rowLabelWidth(grid);
  const headerH = headerHeight(grid);

  // Window of this block in grid millimetres, and where it lands on paper.
  const colLast = Math.max(cols.last, cols.first);
  const win = {
    left: X(cols.first, px) - m.leftPad,
    right: X(colLast, px) + px - m.leftPad,
    top: Y(rows.first, m) - m.topPad,
    bottom: Y(rows.last, m) + m.pitchY - m.topPad,
  };
  const origin = {
    x: region.x + rowLabelW + (p.hStrips ? m.stripW : 0),
    y: region.y + headerH + (p.vStrips ? m.stripH : 0),
  };
  const dx = origin.x - win.left;
  const dy = origin.y - win.top;
  const at = (q: Point): Point => ({ x: q.x + dx, y: q.y + dy });
  const inside = (q: Point): boolean =>
    q.x >= win.left - 1e-9 && q.x < win.right - 1e-9 && q.y >= win.top - 1e-9 && q.y < win.bottom - 1e-9;
  const paperWin = { left: win.left + dx, right: win.right + dx, top: win.top + dy, bottom: win.bottom + dy };
  const eps = 1e-6;

  // Wires, clipped to the window, with continuation marks where cut.
  for (const w of grid.wires) {
    if (w.horizontal) {
      const y = w.a.y;
      if (y < win.top - eps || y >= win.bottom - eps) continue;
      const x0 = Math.max(w.a.x, win.left);
      const x1 = Math.min(w.b.x, win.right);
      if (x1 <= x0 + eps) continue;
      segments.push({ a: at({ x: x0, y }), b: at({ x: x1, y }), width: STROKE.wire, net: w.net });
      const py = y + dy;
      const left = w.a.x < win.left - eps ? marks(w.net, "left") : null;
      const right = w.b.x > win.right + eps ? marks(w.net, "right") : null;
      if (left !== null) {
        polygons.push(arrow({ x: paperWin.left, y: py }, "right", true, m));
        labels.push(
          label(left, { x: paperWin.left - m.arrow - 0.6 * m.scale, y: py + 0.36 * m.contSize }, m.contSize, "continuation", {
            anchor: "end",
          }),
        );
      }
      if (right !== null) {
        polygons.push(arrow({ x: paperWin.right, y: py }, "right", false, m));
        labels.push(label(right, { x: paperWin.right + m.arrow + 0.6 * m.scale, y: py + 0.36 * m.contSize }, m.contSize, "continuation"));
      }
    } else {
      const x = w.a.x;
      if (x < win.left - eps || x >= win.right - eps) continue;
      const y0 = Math.max(w.a.y, win.top);
      const y1 = Math.min(w.b.y, win.bottom);
      if (y1 <= y0 + eps) continue;
      segments.push({ a: at({ x, y: y0 }), b: at({ x, y: y1 }), width: STROKE.wire, net: w.net });
      const pxx = x + dx;
      const up = w.a.y < win.top - eps ? marks(w.net, "up") : null;
      const down = w.b.y > win.bottom + eps ? marks(w.net, "down") : null;
      if (up !== null) {
        polygons.push(arrow({ x: pxx, y: paperWin.top }, "down", true, m));
        labels.push(
          label(up, { x: pxx, y: paperWin.top - m.arrow - 0.8 * m.scale }, m.contSize, "continuation", {
            anchor: "middle",
          }),
        );
      }
      if (down !== null) {
        polygons.push(arrow({ x: pxx, y: paperWin.bottom }, "down", false, m));
        labels.push(
          label(down, { x: pxx, y: paperWin.bottom + m.arrow + 2.0 * m.scale }, m.contSize, "continuation", {
            anchor: "middle",
          }),
        );
      }
    }
  }

  // Diodes whose crossing is in this block, with their references.
  const diodes: DiodeSymbol[] = [];
  const zones = new Map<string, string>();
  for (const d of grid.diodes) {
    if (!inside(d.crossing)) continue;
    const moved = diodeSymbol(d, at(d.crossing), m);
    diodes.push(moved);
    labels.push(
      label(d.ref, { x: moved.crossing.x + 1.0 * m.scale, y: moved.crossing.y + 0.8 * m.scale + 0.8 * m.refSize }, m.refSize, "diode-ref"),
    );
    zones.set(d.ref, zoneOf(frame.zones, moved.crossing));
  }
  const dots: Dot[] = grid.dots.filter((d) => inside(d.at)).map((d) => ({ ...d, at: at(d.at) }));
  // The columns whose line this sheet shows, for the pull-ups' cross-references.
  const shownColumns = new Set(segments.filter((s) => s.net !== undefined && s.a.x === s.b.x).map((s) => s.net as string));
  const bandDots: Dot[] = [];

  // Row labels.
  for (let r = rows.first; r <= rows.last; r++) {
    const row = grid.rows[r] as GridRow;
    labels.push(
      label(row.text, { x: region.x + rowLabelW - 1.5, y: Y(r, m) + dy + 0.36 * m.rowSize }, m.rowSize, "row", {
        anchor: "end",
        bold: row.kind === "state" || row.kind === "line",
      }),
    );
  }

  // Column heads, group titles and glyph keys, feet.
  const headTop = region.y;
  const bracketY = headTop + 3.5 + (grid.keyH > 0 ? grid.keyH + 1 : 0) + 0.5;
  const groups: { group: string; first: number; last: number }[] = [];
  for (let c = cols.first; c <= cols.last && c < grid.columns.length; c++) {
    const col = grid.columns[c] as GridColumn;
    const x = X(c, px) + dx;
    if (grid.rotateHeads) {
      labels.push(
        label(
          col.head,
          { x: x + 0.75, y: bracketY + 1.2 + Math.max(...grid.columns.map((k) => textWidth(k.head, m.columnSize))) },
          m.columnSize,
          "column",
          { rotate: -90 },
        ),
      );
    } else {
      labels.push(label(col.head, { x, y: bracketY + 3.4 * m.scale }, m.columnSize, "column", { anchor: "middle", bold: true }));
    }
    if (col.kind === "output" && rows.last === grid.rows.length - 1 && col.foot) {
      const footY = paperWin.bottom + (p.vStrips ? m.stripH : 0) + grid.bands.footH + 3.2 * m.scale;
      labels.push(label(col.foot, { x, y: footY }, m.columnSize, "terminal", { anchor: "middle" }));
    }
    const last = groups[groups.length - 1];
    if (last && last.group === col.group) last.last = c;
    else groups.push({ group: col.group, first: c, last: c });
  }
  for (const g of groups) {
    const x0 = X(g.first, px) + dx - px / 2 + 0.8;
    const x1 = X(g.last, px) + dx + px / 2 - 0.8;
    const cx = (x0 + x1) / 2;
    const isBus = g.group === "Buses" || g.group === "Gates";
    labels.push(
      label(g.group === "Gates" ? "AND gates" : isBus ? "Buses" : `Pos ${g.group}`, { x: cx, y: headTop + 2.6 }, m.groupSize, "group", {
        anchor: "middle",
        bold: true,
      }),
    );
    segments.push({ a: { x: x0, y: bracketY + 1 }, b: { x: x0, y: bracketY }, width: STROKE.thin });
    segments.push({ a: { x: x0, y: bracketY }, b: { x: x1, y: bracketY }, width: STROKE.thin });
    segments.push({ a: { x: x1, y: bracketY }, b: { x: x1, y: bracketY + 1 }, width: STROKE.thin });
    const k = glyphKey(job.cell, { cx, top: headTop + 3.5, widthMm: x1 - x0, scale: m.scale });
    // A key wider than its group's columns would run into the next group's: leave it out.
    const fits =
      k.box.x >= x0 - 0.8 - 1e-9 && k.box.x + k.box.w <= x1 + 0.8 + 1e-9 && k.box.y + k.box.h <= headTop + 3.5 + grid.keyH + 1e-9;
    if (!isBus && grid.keyH > 0 && fits) {
      segments.push(...k.segments);
      polygons.push(...k.polygons);
      rects.push(...k.rects);
      circles.push(...k.circles);
      labels.push(...k.labels);
    }
  }

  // Dark-decoded columns: the polarity of every output column under the heads; the pull-ups (dark columns'
  // and AND gates') above the matrix on the sheets of its first rows, a cross-reference to them on the
  // others; the level-shift diodes or dividers under it on the sheets of its last rows.
  if (grid.dark.length > 0 || grid.pullUps.size > 0) {
    const darkOf = new Map(grid.dark.map((d) => [d.output, d]));
    const placed: PlacedColumn[] = [];
    const outputs: PlacedColumn[] = [];
    for (let c = cols.first; c <= cols.last && c < grid.columns.length; c++) {
      const col = grid.columns[c] as GridColumn;
      const q = { x: X(c, px) + dx, net: col.net, dark: darkOf.get(col.net) ?? null, pullUp: grid.pullUps.get(col.net) ?? null };
      placed.push(q);
      if (col.kind === "output") outputs.push(q);
    }
    const bandsTop = region.y + headerH - grid.bands.pullUpH - grid.bands.markH;
    if (grid.dark.length > 0) labels.push(...polarityMarks(outputs, bandsTop + 2.0 * m.scale, m));
    const add = (ink: BandInk): void => {
      segments.push(...ink.segments);
      polygons.push(...ink.polygons);
      bandDots.push(...ink.dots);
      labels.push(...ink.labels);
      for (const q of ink.places) zones.set(q.ref, zoneOf(frame.zones, q.at));
    };
    const bandTop = bandsTop + grid.bands.markH;
    if (rows.first === 0) {
      add(pullUpBand(placed, { top: bandTop, left: paperWin.left, nameRight: region.x + rowLabelW - 1.5, gridTop: paperWin.top }, m));
    } else if (job.pullUpSheet !== null) {
      labels.push(
        ...pullUpReferences(
          placed.filter((c) => shownColumns.has(c.net)),
          { top: bandTop },
          job.pullUpSheet,
          m,
        ),
      );
    }
    if (grid.dark.length > 0 && rows.last === grid.rows.length - 1) {
      const footY = paperWin.bottom + (p.vStrips ? m.stripH : 0) + grid.bands.footH + 3.2 * m.scale;
      add(footBand(outputs, { gridBottom: paperWin.bottom, footTop: footY - m.columnSize - 0.4 * m.scale }, m));
    }
  }

  // Notes and title block.
  const content = frame.content;
  const tbCorner = { x: content.x + content.w, y: content.y + content.h };
  const notesBox: Box =
    p.arrangement === "side"
      ? { x: tbCorner.x - TITLE_BLOCK_MM.w, y: content.y, w: TITLE_BLOCK_MM.w, h: content.h - TITLE_BLOCK_MM.h - GAP }
      : (() => {
          const h = bottomBand(notes, content);
          return { x: content.x, y: tbCorner.y - h, w: content.w - TITLE_BLOCK_MM.w - GAP, h };
        })();
  const nb = notesBlock(notes, notesBox);
  rects.push(...nb.rects);
  labels.push(...nb.labels);
  const tb = titleBlock(
    {
      title: job.title,
      drawingNumber: options.drawingNumber,
      revision: options.revision,
      date: options.date,
      drawnBy: options.drawnBy,
      documentType: "Diode matrix, assembly",
      extra: ["Diodes", String(job.diodeCount)],
    },
    number,
    count,
    tbCorner,
  );
  rects.push(...tb.rects);
  labels.push(...tb.labels);

  const sheet: Sheet = {
    number,
    count,
    paper: options.paper,
    orientation: job.orientation,
    widthMm: frame.widthMm,
    heightMm: frame.heightMm,
    segments,
    polygons,
    rects,
    circles,
    diodes,
    dots: [...dots, ...bandDots],
    labels,
  };
  return { sheet, zones };
}

/** A filled arrowhead at a cut edge: outgoing just beyond the edge, incoming just before it. */
function arrow(edge: Point, direction: "right" | "down", incoming: boolean, m: Metrics): Polygon {
  const h = m.arrow;
  const w = 0.5 * m.scale;
  if (direction === "right") {
    const x0 = incoming ? edge.x - h : edge.x;
    return {
      points: [
        { x: x0, y: edge.y - w },
        { x: x0 + h, y: edge.y },
        { x: x0, y: edge.y + w },
      ],
      filled: true,
      width: STROKE.thin,
    };
  }
  const y0 = incoming ? edge.y - h : edge.y;
  return {
    points: [
      { x: edge.x - w, y: y0 },
      { x: edge.x, y: y0 + h },
      { x: edge.x + w, y: y0 },
    ],
    filled: true,
    width: STROKE.thin,
  };
}
