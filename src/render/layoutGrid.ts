/**
 * The grid of the matrix drawing, before it is cut into sheets: every net
 * that drives a diode has a horizontal row (counter lines first, then bus
 * rows, then the link rows of outputs that drive other outputs); every net a
 * diode drives has a vertical column (bus columns on the left, then the
 * output columns grouped per display position). A diode sits where its
 * driving row crosses its driven column: the anode lead taps the row just
 * left of the crossing, the cathode lead taps the column just below it, so
 * the triangle points from row to column and the bar faces the driven line.
 * A bus has both a column (where states feed it) and a row (where it feeds
 * outputs), joined at a corner; bus B1 gets the leftmost column and the
 * lowest row so that the bus lines nest without crossing.
 *
 * A coded counter's decoder has the stage lines (`Q0`, `nQ0`, ...) as its
 * first rows and its AND gates drawn like buses: a gate column on the left,
 * with the gate's pull-up at its top (hanging from the VLOGIC rail above the
 * matrix, darkColumns.ts) and one diode to each input row (drawn
 * reversed: anode on the column, band on the stage line), joined at a corner
 * to the gate's row, which feeds the outputs. Millimetres, in grid
 * coordinates (the sheet layout moves them onto paper).
 */
import { decodeSides, type DecodeSpec } from "../core/spec/decodeSpec.ts";
import { designators } from "../core/matrix/designators.ts";
import { darkSideDiodes, type DiodeMatrix } from "../core/matrix/matrix.ts";
import type { Project } from "../core/project/project.ts";
import { boundingBox, textWidth, type DiodeSymbol, type Dot, type Point } from "./drawingModel.ts";
import { glyphKeyHeight } from "./glyphKey.ts";
import { findDots } from "./junctions.ts";
import type { Metrics } from "./layoutMetrics.ts";
import {
  bandPitch,
  columnBands,
  darkColumns,
  gateColumns,
  type ColumnBands,
  type ColumnPart,
  type DarkColumn,
  type GateColumn,
} from "./darkColumns.ts";
import type { DarkNetworkValues } from "../core/matrix/designators.ts";

export type RowKind = "state" | "line" | "gate" | "bus" | "link";

export interface GridRow {
  readonly net: string;
  readonly kind: RowKind;
  readonly text: string;
}

export interface GridColumn {
  readonly net: string;
  readonly kind: "gate" | "bus" | "output";
  /** `Gates`, `Buses` or the display position number. */
  readonly group: string;
  /** Name printed at the column's head. */
  readonly head: string;
  /** Printed at the foot of an output column: its driver. */
  readonly foot: string;
}

/** One wire of a net, in grid millimetres (before placing on a sheet). */
export interface Wire {
  readonly net: string;
  readonly a: Point;
  readonly b: Point;
  readonly horizontal: boolean;
}

export interface Grid {
  readonly rows: readonly GridRow[];
  readonly columns: readonly GridColumn[];
  readonly pitchX: number;
  readonly wires: readonly Wire[];
  readonly diodes: readonly DiodeSymbol[];
  readonly dots: readonly Dot[];
  readonly rotateHeads: boolean;
  readonly keyH: number;
  /** The dark-decoded columns with their pull-ups and input networks (empty when every output is decoded lit). */
  readonly dark: readonly DarkColumn[];
  /** The AND gates with the pull-ups at their columns' tops (empty for a one-hot counter). */
  readonly gates: readonly GateColumn[];
  /** The pull-up at the top of every column that has one (a dark-decoded output's or an AND gate's), by the column's net. */
  readonly pullUps: ReadonlyMap<string, ColumnPart>;
  /** The bands the dark-decoded columns and the gates' pull-ups add above and below the matrix (all 0 without). */
  readonly bands: ColumnBands;
  readonly m: Metrics;
}

/** x of column `c` in grid millimetres. */
export const X = (c: number, pitchX: number): number => c * pitchX;
/** y of row `r` in grid millimetres. */
export const Y = (r: number, m: Metrics): number => r * m.pitchY;

/**
 * Lays out the rows, columns, wires, diodes and junction dots of a matrix at one scale.
 *
 * @param darkValues the sized input network of the dark-decoded outputs (the budget's); without it their parts show designators only
 */
export function buildGrid(project: Project, spec: DecodeSpec, matrix: DiodeMatrix, m: Metrics, darkValues?: DarkNetworkValues): Grid {
  const drivers = new Set(matrix.diodes.map((d) => d.from));
  const linkSources = matrix.outputs.filter((o) => drivers.has(o));
  const gates = new Set(matrix.gates.map((g) => g.ref));
  const lines = new Set(matrix.lines);
  // An AND gate's input diode: drawn where the stage line's row crosses the gate's column.
  const isGateInput = (d: { from: string; to: string }): boolean => gates.has(d.from) && lines.has(d.to);
  const usedLines = spec.lines.filter((l) => matrix.diodes.some((d) => d.from === l || d.to === l));
  // A one-hot counter: a row per state line it decodes from, the active-high S<k> and the active-low nS<k>.
  // The lines the decode's polarities sit on (a high-side switch's lit cells on the nS lines).
  const sides = decodeSides(spec.polarity);
  const stateRows = (names: readonly string[]): GridRow[] =>
    names.map((s, k) => ({ net: s, kind: "state" as const, text: `${s} "${spec.texts[k] ?? ""}"` }));
  const rows: GridRow[] = [
    ...(spec.counter.kind === "one-hot"
      ? [...stateRows(sides.has("high") ? spec.states : []), ...stateRows(sides.has("low") ? spec.polarity.activeLow : [])]
      : usedLines.map((l) => ({ net: l, kind: "line" as const, text: l }))),
    ...[...matrix.gates].reverse().map((g) => ({ net: g.ref, kind: "gate" as const, text: `${g.ref} (gate)` })),
    ...[...matrix.buses].reverse().map((b) => ({ net: b, kind: "bus" as const, text: `${b} (bus)` })),
    ...linkSources.map((o) => ({ net: o, kind: "link" as const, text: `${o} (link)` })),
  ];
  const driverOf = new Map(designators(spec, matrix, project.electrical).drivers.map((d) => [d.output, d.transistor ?? d.current.ref]));
  const columns: GridColumn[] = [
    ...matrix.gates.map((g) => ({ net: g.ref, kind: "gate" as const, group: "Gates", head: g.ref, foot: "" })),
    ...matrix.buses.map((b) => ({ net: b, kind: "bus" as const, group: "Buses", head: b, foot: "" })),
    ...matrix.outputs.map((o) => {
      const m = /^(\d+)(.*)$/.exec(o);
      return { net: o, kind: "output" as const, group: m?.[1] ?? "", head: m?.[2] ?? o, foot: driverOf.get(o) ?? "" };
    }),
  ];
  const dark = darkColumns(project, spec, matrix, darkValues);
  const gateParts = gateColumns(project, spec, matrix);
  const pullUps = new Map<string, ColumnPart>([
    ...gateParts.map((g) => [g.gate, g.pullUp] as const),
    ...dark.map((d) => [d.output, d.pullUp] as const),
  ]);
  const refW = Math.max(0, ...matrix.diodes.map((d) => textWidth(d.ref, m.refSize)));
  const pitchX =
    Math.ceil(Math.max(m.minPitchX, m.leftPad + 1.0 * m.scale + refW + 0.6 * m.scale, bandPitch(dark, gateParts, m)) * 10) / 10;
  const rowOf = new Map(rows.map((r, i) => [r.net, i]));
  const colOf = new Map(columns.map((c, i) => [c.net, i]));
  const C = Math.max(columns.length, 1);
  const R = rows.length;
  const left = X(0, pitchX) - m.leftPad;
  const right = X(C - 1, pitchX) + pitchX - m.leftPad;
  const top = Y(0, m) - m.topPad;
  const bottom = Y(R - 1, m) + m.pitchY - m.topPad;

  // A dark-side diode sits where its driving row crosses its column like any other, drawn the other way
  // round: its anode on the column (the output or bus it pulls down), its band on the row.
  const darkSide = darkSideDiodes(matrix);
  const diodes: DiodeSymbol[] = matrix.diodes.map((d) => {
    const gateInput = isGateInput(d);
    const r = rowOf.get(gateInput ? d.to : d.from);
    const c = colOf.get(gateInput ? d.from : d.to);
    if (r === undefined || c === undefined) throw new Error(`bug: diode ${d.ref} from ${d.from} to ${d.to} has no row or column`);
    const at = { x: X(c, pitchX), y: Y(r, m) };
    if (darkSide.has(d.ref)) return diodeSymbol({ ref: d.ref, from: d.to, to: d.from, reversed: true }, at, m);
    return diodeSymbol(gateInput ? { ...d, reversed: true } : d, at, m);
  });

  const wires: Wire[] = [];
  for (const [r, row] of rows.entries()) {
    const y = Y(r, m);
    if (row.kind === "state" || row.kind === "line") {
      wires.push({ net: row.net, a: { x: left, y }, b: { x: right, y }, horizontal: true });
      continue;
    }
    const own = colOf.get(row.net);
    const ownX = own === undefined ? [] : [X(own, pitchX)];
    // From the leftmost anode tap to just past the rightmost crossing, so the
    // row really crosses every column it feeds.
    const fed = diodes.filter((d) => (d.reversed ? d.to : d.from) === row.net);
    const x0 = Math.min(...ownX, ...fed.map((d) => (d.reversed ? d.cathode.x : d.anode.x) - m.overshoot));
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
    // Where diodes tap the column: a bus's cathodes, a gate's input anodes.
    const taps = diodes
      .filter((d) => (d.reversed ? d.from : d.to) === col.net)
      .map((d) => (d.reversed ? d.anode.y : d.cathode.y) + m.overshoot);
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
  return {
    rows,
    columns,
    pitchX,
    wires,
    diodes,
    dots,
    rotateHeads,
    keyH,
    dark,
    gates: gateParts,
    pullUps,
    bands: columnBands(dark, gateParts, m),
    m,
  };
}

/**
 * The symbol of a diode at a crossing, its taps `m.tap` left of and below
 * it: the anode on the row to the left and the cathode on the column below,
 * or the other way round for a reversed (gate input) diode.
 */
export function diodeSymbol(
  d: { readonly ref: string; readonly from: string; readonly to: string; readonly reversed?: boolean },
  crossing: Point,
  m: Metrics,
): DiodeSymbol {
  const { ref, from, to } = d;
  const rowTap = { x: crossing.x - m.tap, y: crossing.y };
  const columnTap = { x: crossing.x, y: crossing.y + m.tap };
  const anode = d.reversed ? columnTap : rowTap;
  const cathode = d.reversed ? rowTap : columnTap;
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
  return {
    ref,
    from,
    to,
    crossing,
    anode,
    cathode,
    ...(d.reversed ? { reversed: true } : {}),
    triangle,
    bar,
    box: boundingBox([anode, cathode, ...triangle, ...bar]),
  };
}
