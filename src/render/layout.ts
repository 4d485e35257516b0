/**
 * Layout of the matrix drawing: verified matrix -> sheets of lines, diode
 * symbols, junction dots and labels, in millimetres. Pure; no DOM.
 *
 * The grid: every net that drives a diode has a horizontal row (counter
 * lines first, then bus rows, then the link rows of outputs that drive other
 * outputs); every net a diode drives has a vertical column (bus columns on
 * the left, then the output columns grouped per display position). A diode
 * sits where its driving row crosses its driven column: the anode lead taps
 * the row just left of the crossing, the cathode lead taps the column just
 * below it, so the triangle points from row to column and the bar faces the
 * driven line. A bus has both a column (where states feed it) and a row
 * (where it feeds outputs), joined at a corner; bus B1 gets the leftmost
 * column and the lowest row so that the bus lines nest without crossing.
 *
 * Dots are not chosen: they are found, wherever three or more wire ends of
 * one net meet. Lines of different nets only ever cross, never touch.
 *
 * A matrix too big for one sheet is cut into blocks of rows and columns;
 * every wire cut at a block edge ends in an arrowhead with the number of the
 * sheet it continues on.
 */
import type { DecodeSpec } from "../core/spec/decodeSpec.ts";
import type { DiodeMatrix } from "../core/matrix/matrix.ts";
import { designators } from "../core/matrix/designators.ts";
import { refRanges } from "../core/papers/parts.ts";
import type { Project } from "../core/project/project.ts";
import {
  STROKE,
  boundingBox,
  label,
  textWidth,
  type Box,
  type Circle,
  type DiodeSymbol,
  type Dot,
  type Label,
  type Point,
  type Polygon,
  type Rect,
  type Segment,
  type Sheet,
} from "./drawingModel.ts";
import type { DrawingOptions } from "./drawingOptions.ts";
import { glyphKey, glyphKeyHeight } from "./glyphKey.ts";
import { milliampsExact } from "./units.ts";
import { TITLE_BLOCK_MM, notesBlock, notesHeight, sheetFrame, titleBlock, zoneOf, type SheetFrame } from "./sheetFrame.ts";

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

// ---------------------------------------------------------------- geometry constants (mm)

/**
 * Sizes of the matrix part of a drawing, millimetres, at a scale. Small
 * matrices are drawn larger (up to 1.5 times), as long as that costs no
 * extra sheet, so that they read easily at the bench.
 */
interface Metrics {
  readonly scale: number;
  /** Offset of both diode taps from the crossing, along the row and down the column. */
  readonly tap: number;
  /** Wire overshoot beyond the last tap or crossing, so that every tap is a T-joint. */
  readonly overshoot: number;
  readonly pitchY: number;
  readonly minPitchX: number;
  readonly leftPad: number;
  readonly topPad: number;
  readonly refSize: number;
  readonly rowSize: number;
  readonly columnSize: number;
  readonly groupSize: number;
  readonly contSize: number;
  readonly dotR: number;
  /** Half the length (and half the width) of the diode triangle. */
  readonly symbolHalf: number;
  /** Width of the strips that hold continuation marks, left and right. */
  readonly stripW: number;
  /** Height of the strips that hold continuation marks, top and bottom. */
  readonly stripH: number;
  readonly terminalH: number;
  readonly arrow: number;
}

/**
 * Scales tried, largest first. At 0.9 the diode references are 1.8 mm high,
 * the smallest lettering of the ISO 3098 series; nothing is drawn smaller.
 */
const SCALES = [1.5, 1.25, 1, 0.9] as const;

function metrics(scale: number): Metrics {
  const k = (v: number): number => Math.round(v * scale * 1000) / 1000;
  return {
    scale,
    tap: k(3.5),
    // tap + overshoot stays inside the cell (under leftPad and pitchY - topPad), so no stub pokes into the next sheet.
    overshoot: k(0.8),
    pitchY: k(6),
    minPitchX: k(10),
    leftPad: k(4.8),
    topPad: k(1.6),
    refSize: k(2.0),
    rowSize: k(2.5),
    columnSize: k(2.2),
    groupSize: 2.2,
    contSize: Math.max(1.8, k(1.8)),
    dotR: k(0.5),
    symbolHalf: k(0.9),
    stripW: k(8.5),
    stripH: k(4.5),
    terminalH: k(4.5),
    arrow: k(1.2),
  };
}
const GAP = 3;

// ---------------------------------------------------------------- the grid

type RowKind = "state" | "bus" | "link";

interface GridRow {
  readonly net: string;
  readonly kind: RowKind;
  readonly text: string;
}

interface GridColumn {
  readonly net: string;
  readonly kind: "bus" | "output";
  /** `Buses` or the display position number. */
  readonly group: string;
  /** Name printed at the column's head. */
  readonly head: string;
  /** Printed at the foot of an output column: its driver. */
  readonly foot: string;
}

/** One wire of a net, in grid millimetres (before placing on a sheet). */
interface Wire {
  readonly net: string;
  readonly a: Point;
  readonly b: Point;
  readonly horizontal: boolean;
}

interface Grid {
  readonly rows: readonly GridRow[];
  readonly columns: readonly GridColumn[];
  readonly pitchX: number;
  readonly wires: readonly Wire[];
  readonly diodes: readonly DiodeSymbol[];
  readonly dots: readonly Dot[];
  readonly rotateHeads: boolean;
  readonly keyH: number;
  readonly m: Metrics;
}

const X = (c: number, pitchX: number): number => c * pitchX;
const Y = (r: number, m: Metrics): number => r * m.pitchY;

function buildGrid(project: Project, spec: DecodeSpec, matrix: DiodeMatrix, m: Metrics): Grid {
  const drivers = new Set(matrix.diodes.map((d) => d.from));
  const linkSources = matrix.outputs.filter((o) => drivers.has(o));
  const rows: GridRow[] = [
    ...spec.states.map((s, k) => ({ net: s, kind: "state" as const, text: `${s} "${spec.texts[k] ?? ""}"` })),
    ...[...matrix.buses].reverse().map((b) => ({ net: b, kind: "bus" as const, text: `${b} (bus)` })),
    ...linkSources.map((o) => ({ net: o, kind: "link" as const, text: `${o} (link)` })),
  ];
  const driverOf = new Map(designators(spec, matrix, project.electrical).drivers.map((d) => [d.output, d.transistor]));
  const columns: GridColumn[] = [
    ...matrix.buses.map((b) => ({ net: b, kind: "bus" as const, group: "Buses", head: b, foot: "" })),
    ...matrix.outputs.map((o) => {
      const m = /^(\d+)(.*)$/.exec(o);
      return { net: o, kind: "output" as const, group: m?.[1] ?? "", head: m?.[2] ?? o, foot: driverOf.get(o) ?? "" };
    }),
  ];
  const refW = Math.max(0, ...matrix.diodes.map((d) => textWidth(d.ref, m.refSize)));
  const pitchX = Math.ceil(Math.max(m.minPitchX, m.leftPad + 1.0 * m.scale + refW + 0.6 * m.scale) * 10) / 10;
  const rowOf = new Map(rows.map((r, i) => [r.net, i]));
  const colOf = new Map(columns.map((c, i) => [c.net, i]));
  const C = Math.max(columns.length, 1);
  const R = rows.length;
  const left = X(0, pitchX) - m.leftPad;
  const right = X(C - 1, pitchX) + pitchX - m.leftPad;
  const top = Y(0, m) - m.topPad;
  const bottom = Y(R - 1, m) + m.pitchY - m.topPad;

  const diodes: DiodeSymbol[] = matrix.diodes.map((d) => {
    const r = rowOf.get(d.from);
    const c = colOf.get(d.to);
    if (r === undefined || c === undefined) throw new Error(`bug: diode ${d.ref} from ${d.from} to ${d.to} has no row or column`);
    return diodeSymbol(d.ref, d.from, d.to, { x: X(c, pitchX), y: Y(r, m) }, m);
  });

  const wires: Wire[] = [];
  for (const [r, row] of rows.entries()) {
    const y = Y(r, m);
    if (row.kind === "state") {
      wires.push({ net: row.net, a: { x: left, y }, b: { x: right, y }, horizontal: true });
      continue;
    }
    const own = colOf.get(row.net);
    const ownX = own === undefined ? [] : [X(own, pitchX)];
    // From the leftmost anode tap to just past the rightmost crossing, so the
    // row really crosses every column it feeds.
    const fed = diodes.filter((d) => d.from === row.net);
    const x0 = Math.min(...ownX, ...fed.map((d) => d.anode.x - m.overshoot));
    const x1 = Math.max(...ownX, ...fed.map((d) => d.crossing.x + m.overshoot));
    wires.push({ net: row.net, a: { x: x0, y }, b: { x: x1, y }, horizontal: true });
  }
  for (const [c, col] of columns.entries()) {
    const x = X(c, pitchX);
    if (col.kind === "output") {
      wires.push({ net: col.net, a: { x, y: top }, b: { x, y: bottom }, horizontal: false });
      continue;
    }
    const own = rowOf.get(col.net);
    const taps = diodes.filter((d) => d.to === col.net).map((d) => d.cathode.y + m.overshoot);
    const y1 = Math.max(...(own === undefined ? [] : [Y(own, m)]), ...taps);
    wires.push({ net: col.net, a: { x, y: top }, b: { x, y: y1 }, horizontal: false });
  }

  const dots = findDots(wires, diodes, m.dotR);
  const rotateHeads = columns.some((c) => textWidth(c.head, m.columnSize) > pitchX - 1.5);
  // Room for the tallest key of a whole position group; a group cut by a
  // sheet edge is narrower, and a key that then grows taller is left out.
  const groupSizes = new Map<string, number>();
  for (const c of columns) if (c.kind === "output") groupSizes.set(c.group, (groupSizes.get(c.group) ?? 0) + 1);
  const keyH = Math.max(0, ...[...groupSizes.values()].map((n) => glyphKeyHeight(spec.cell, n * pitchX - 1.6, m.scale)));
  return { rows, columns, pitchX, wires, diodes, dots, rotateHeads, keyH, m };
}

/** The symbol of a diode at a crossing, its taps `m.tap` left of and below it. */
function diodeSymbol(ref: string, from: string, to: string, crossing: Point, m: Metrics): DiodeSymbol {
  const anode = { x: crossing.x - m.tap, y: crossing.y };
  const cathode = { x: crossing.x, y: crossing.y + m.tap };
  const len = Math.hypot(cathode.x - anode.x, cathode.y - anode.y);
  const u = { x: (cathode.x - anode.x) / len, y: (cathode.y - anode.y) / len };
  const p = { x: -u.y, y: u.x };
  const mid = { x: (anode.x + cathode.x) / 2, y: (anode.y + cathode.y) / 2 };
  const half = m.symbolHalf;
  const base = { x: mid.x - u.x * half, y: mid.y - u.y * half };
  const apex = { x: mid.x + u.x * half, y: mid.y + u.y * half };
  const triangle: [Point, Point, Point] = [
    { x: base.x + p.x * half, y: base.y + p.y * half },
    { x: base.x - p.x * half, y: base.y - p.y * half },
    apex,
  ];
  const bar: [Point, Point] = [
    { x: apex.x + p.x * half, y: apex.y + p.y * half },
    { x: apex.x - p.x * half, y: apex.y - p.y * half },
  ];
  return { ref, from, to, crossing, anode, cathode, triangle, bar, box: boundingBox([anode, cathode, ...triangle, ...bar]) };
}

// ---------------------------------------------------------------- junctions

const key = (p: Point): string => `${p.x.toFixed(4)},${p.y.toFixed(4)}`;

/** Where a point lies on a segment: an end, inside, or off it. */
function contact(p: Point, a: Point, b: Point): "end" | "inside" | "off" {
  const eps = 1e-6;
  if (Math.hypot(p.x - a.x, p.y - a.y) < eps || Math.hypot(p.x - b.x, p.y - b.y) < eps) return "end";
  const cross = (b.x - a.x) * (p.y - a.y) - (b.y - a.y) * (p.x - a.x);
  if (Math.abs(cross) > eps * Math.hypot(b.x - a.x, b.y - a.y)) return "off";
  const t = ((p.x - a.x) * (b.x - a.x) + (p.y - a.y) * (b.y - a.y)) / ((b.x - a.x) ** 2 + (b.y - a.y) ** 2);
  return t > 0 && t < 1 ? "inside" : "off";
}

/** A net's pieces: its wires and the diode leads that end on it. */
export function netPieces(
  wires: readonly { net?: string; a: Point; b: Point }[],
  diodes: readonly DiodeSymbol[],
): Map<string, { a: Point; b: Point }[]> {
  const pieces = new Map<string, { a: Point; b: Point }[]>();
  const add = (net: string, a: Point, b: Point): void => void pieces.set(net, [...(pieces.get(net) ?? []), { a, b }]);
  for (const w of wires) if (w.net !== undefined) add(w.net, w.a, w.b);
  for (const d of diodes) {
    add(d.from, d.anode, midpoint(d.triangle[0], d.triangle[1]));
    add(d.to, midpoint(d.bar[0], d.bar[1]), d.cathode);
  }
  return pieces;
}

function midpoint(p: Point, q: Point): Point {
  return { x: (p.x + q.x) / 2, y: (p.y + q.y) / 2 };
}

/**
 * Junction dots: every point where the pieces of one net meet with three or
 * more arms (an end counts one arm, a piece passing through counts two).
 */
export function findDots(wires: readonly { net?: string; a: Point; b: Point }[], diodes: readonly DiodeSymbol[], radius: number): Dot[] {
  const dots: Dot[] = [];
  for (const [net, pieces] of netPieces(wires, diodes)) {
    const seen = new Set<string>();
    for (const piece of pieces) {
      for (const p of [piece.a, piece.b]) {
        if (seen.has(key(p))) continue;
        seen.add(key(p));
        let arms = 0;
        for (const q of pieces) {
          const c = contact(p, q.a, q.b);
          arms += c === "end" ? 1 : c === "inside" ? 2 : 0;
        }
        if (arms >= 3) dots.push({ at: p, r: radius, net });
      }
    }
  }
  return dots;
}

// ---------------------------------------------------------------- sheets

interface Chunk {
  readonly first: number;
  readonly last: number;
}

function chunks(count: number, perSheet: number): Chunk[] {
  const n = Math.max(1, Math.ceil(count / Math.max(1, perSheet)));
  const size = Math.ceil(count / n);
  const out: Chunk[] = [];
  for (let i = 0; i < n; i++) out.push({ first: i * size, last: Math.min(count, (i + 1) * size) - 1 });
  return out;
}

interface Plan {
  readonly arrangement: "side" | "bottom";
  readonly region: Box;
  readonly rowChunks: Chunk[];
  readonly colChunks: Chunk[];
  readonly hStrips: boolean;
  readonly vStrips: boolean;
  /** False when not even one grid cell fits the region at this scale. */
  readonly fits: boolean;
}

function headerHeight(grid: Grid): number {
  const m = grid.m;
  const heads = grid.rotateHeads ? Math.max(...grid.columns.map((c) => textWidth(c.head, m.columnSize))) + 1.5 : 4.5 * m.scale;
  return 3.5 + (grid.keyH > 0 ? grid.keyH + 1 : 0) + 1 + heads;
}

function rowLabelWidth(grid: Grid): number {
  const m = grid.m;
  return Math.max(...grid.rows.map((r) => textWidth(r.text, m.rowSize))) + 2;
}

/** Height of the band under the matrix that holds the notes and the title block (bottom arrangement). */
function bottomBand(notes: readonly string[], content: Box): number {
  return Math.max(TITLE_BLOCK_MM.h, notesHeight(notes, content.w - TITLE_BLOCK_MM.w - GAP));
}

function plan(grid: Grid, frame: SheetFrame, notes: readonly string[]): Plan {
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
      const sheet = layoutSheet(grid, p, rows, cols, sheetNo(ri, ci), count, neighbours, options, project, spec, matrix, notes);
      sheets.push(sheet.sheet);
      for (const [ref, zone] of sheet.zones) placements.set(ref, { sheet: sheet.sheet.number, zone });
    });
  });
  return { sheets, placements };
}

function matrixNotes(project: Project, spec: DecodeSpec, matrix: DiodeMatrix, continued: boolean): string[] {
  const e = project.electrical;
  const refs = matrix.diodes.map((d) => d.ref);
  const notes: string[] = [];
  if (refs.length > 0) {
    notes.push(
      `Diodes ${refRanges(refs)} (${refs.length}): small-signal silicon, at least ${e.diode.maxReverseV} V reverse and ${milliampsExact(e.diode.maxForwardA)} mA forward.`,
    );
  }
  notes.push(
    "Band = cathode = bar on the symbol. The anode takes the row (counter, bus or link line); the cathode goes to the column it drives.",
  );
  notes.push("Lines that cross without a dot are not joined; a dot marks a joint.");
  notes.push(
    `Rows: the counter lines ${spec.states[0]}-${spec.states[spec.states.length - 1]}, each with the text it shows. Columns: output lines, grouped by display position; each ends at its driver's base (Q).`,
  );
  if (matrix.buses.length > 0)
    notes.push(`Bus nodes ${matrix.buses.join(", ")}: the counter lines feed the bus column; the bus row feeds the outputs.`);
  const outputs = new Set(matrix.outputs);
  const links = matrix.diodes.filter((d) => outputs.has(d.from));
  if (links.length > 0) {
    const shown = links.slice(0, 6).map((d) => `${d.ref} ${d.from} to ${d.to}`);
    const more = links.length > shown.length ? ` and ${links.length - shown.length} more (see the wiring list)` : "";
    notes.push(`Links, output to output: ${shown.join(", ")}${more}; a link row taps its source column at the dot.`);
  }
  if (spec.tiedOn.length > 0) notes.push(`Lit in every state, no diodes: ${someOf(spec.tiedOn)} (base held high, see the BOM).`);
  if (spec.neverLit.length > 0) notes.push(`Never lit, not wired: ${someOf(spec.neverLit)}.`);
  if (continued) notes.push("An arrowhead with sh.N marks a line continued on sheet N.");
  notes.push("Fit the diodes in the order of the wiring list, row by row, ticking each one.");
  return notes;
}

/** A list for a note: the first dozen names, then how many more. */
function someOf(names: readonly string[]): string {
  const shown = names.slice(0, 12).join(", ");
  return names.length > 12 ? `${shown} and ${names.length - 12} more` : shown;
}

interface Neighbours {
  readonly left: number | undefined;
  readonly right: number | undefined;
  readonly up: number | undefined;
  readonly down: number | undefined;
}

function layoutSheet(
  grid: Grid,
  p: Plan,
  rows: Chunk,
  cols: Chunk,
  number: number,
  count: number,
  neighbours: Neighbours,
  options: DrawingOptions,
  project: Project,
  spec: DecodeSpec,
  matrix: DiodeMatrix,
  notes: readonly string[],
): { sheet: Sheet; zones: Map<string, string> } {
  const m = grid.m;
  const frame = sheetFrame(options.paper, "landscape");
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
      if (w.a.x < win.left - eps && neighbours.left !== undefined) {
        polygons.push(arrow({ x: paperWin.left, y: py }, "right", true, m));
        labels.push(
          label(
            `sh.${neighbours.left}`,
            { x: paperWin.left - m.arrow - 0.6 * m.scale, y: py + 0.36 * m.contSize },
            m.contSize,
            "continuation",
            { anchor: "end" },
          ),
        );
      }
      if (w.b.x > win.right + eps && neighbours.right !== undefined) {
        polygons.push(arrow({ x: paperWin.right, y: py }, "right", false, m));
        labels.push(
          label(
            `sh.${neighbours.right}`,
            { x: paperWin.right + m.arrow + 0.6 * m.scale, y: py + 0.36 * m.contSize },
            m.contSize,
            "continuation",
          ),
        );
      }
    } else {
      const x = w.a.x;
      if (x < win.left - eps || x >= win.right - eps) continue;
      const y0 = Math.max(w.a.y, win.top);
      const y1 = Math.min(w.b.y, win.bottom);
      if (y1 <= y0 + eps) continue;
      segments.push({ a: at({ x, y: y0 }), b: at({ x, y: y1 }), width: STROKE.wire, net: w.net });
      const pxx = x + dx;
      if (w.a.y < win.top - eps && neighbours.up !== undefined) {
        polygons.push(arrow({ x: pxx, y: paperWin.top }, "down", true, m));
        labels.push(
          label(`sh.${neighbours.up}`, { x: pxx, y: paperWin.top - m.arrow - 0.8 * m.scale }, m.contSize, "continuation", {
            anchor: "middle",
          }),
        );
      }
      if (w.b.y > win.bottom + eps && neighbours.down !== undefined) {
        polygons.push(arrow({ x: pxx, y: paperWin.bottom }, "down", false, m));
        labels.push(
          label(`sh.${neighbours.down}`, { x: pxx, y: paperWin.bottom + m.arrow + 2.0 * m.scale }, m.contSize, "continuation", {
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
    const moved = diodeSymbol(d.ref, d.from, d.to, at(d.crossing), m);
    diodes.push(moved);
    labels.push(
      label(d.ref, { x: moved.crossing.x + 1.0 * m.scale, y: moved.crossing.y + 0.8 * m.scale + 0.8 * m.refSize }, m.refSize, "diode-ref"),
    );
    zones.set(d.ref, zoneOf(frame.zones, moved.crossing));
  }
  const dots: Dot[] = grid.dots.filter((d) => inside(d.at)).map((d) => ({ ...d, at: at(d.at) }));

  // Row labels.
  for (let r = rows.first; r <= rows.last; r++) {
    const row = grid.rows[r] as GridRow;
    labels.push(
      label(row.text, { x: region.x + rowLabelW - 1.5, y: Y(r, m) + dy + 0.36 * m.rowSize }, m.rowSize, "row", {
        anchor: "end",
        bold: row.kind === "state",
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
      const footY = paperWin.bottom + (p.vStrips ? m.stripH : 0) + 3.2 * m.scale;
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
    const isBus = g.group === "Buses";
    labels.push(
      label(isBus ? "Buses" : `Pos ${g.group}`, { x: cx, y: headTop + 2.6 }, m.groupSize, "group", { anchor: "middle", bold: true }),
    );
    segments.push({ a: { x: x0, y: bracketY + 1 }, b: { x: x0, y: bracketY }, width: STROKE.thin });
    segments.push({ a: { x: x0, y: bracketY }, b: { x: x1, y: bracketY }, width: STROKE.thin });
    segments.push({ a: { x: x1, y: bracketY }, b: { x: x1, y: bracketY + 1 }, width: STROKE.thin });
    const k = glyphKey(spec.cell, cx, headTop + 3.5, x1 - x0, m.scale);
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
      title: project.title,
      drawingNumber: options.drawingNumber,
      revision: options.revision,
      date: options.date,
      drawnBy: options.drawnBy,
      documentType: "Diode matrix, assembly",
      extra: ["Diodes", String(matrix.count)],
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
    widthMm: frame.widthMm,
    heightMm: frame.heightMm,
    segments,
    polygons,
    rects,
    circles,
    diodes,
    dots,
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
