/**
 * The dark-decoded columns of the matrix drawing: each column's polarity
 * under its head, the pull-up at its top (from a VLOGIC rail drawn above
 * the matrix, like a row) and its input network at its foot (the
 * level-shift diodes in series, band down towards the driver, or the
 * divider's upper resistor), so a builder wires the whole path from the
 * logic supply through the node to the driver stage from the one sheet.
 * The divider's lower resistor stands at the driver (it takes the place of
 * the pull-down) and is drawn on the driver sheet.
 *
 * The same band holds the pull-up of every AND gate of a coded counter's
 * decoder, at the top of the gate's column (its node), from the same rail.
 * A column's pull-up is drawn once, on the sheet holding the column's top;
 * a sheet further down that shows the column names it there instead, with
 * the sheet it is drawn on.
 *
 * Pure layout in millimetres: the grid gives the bands' heights, the sheet
 * layout says where they land on paper and which columns it shows.
 */
import { darkOutputs, type DiodeMatrix } from "../core/matrix/matrix.ts";
import { designators, type DarkNetworkValues } from "../core/matrix/designators.ts";
import { LOGIC_SUPPLY_NET, driverInputNet } from "../core/papers/wiringList.ts";
import type { Project } from "../core/project/project.ts";
import type { DecodeSpec } from "../core/spec/decodeSpec.ts";
import { STROKE, label, textWidth, type Dot, type Label, type Point, type Polygon, type Segment } from "./drawingModel.ts";
import type { Metrics } from "./layoutMetrics.ts";
import { formatOhms } from "./units.ts";

/** A part drawn in a dark-decoded column: its designator and, once the budget has sized it, its value. */
export interface ColumnPart {
  readonly ref: string;
  /** Ohms; null while the budget has not sized the network (the sheet then shows the designator only). */
  readonly ohms: number | null;
}

/** What a dark-decoded output's column carries besides its diodes. */
export interface DarkColumn {
  /** The output (its column's net). */
  readonly output: string;
  readonly pullUp: ColumnPart;
  /** The level-shift diodes from the node towards the driver, in order; empty with a divider. */
  readonly shiftDiodes: readonly string[];
  /** The divider's upper resistor, from the node to the driver's input; null with level-shift diodes. */
  readonly divider: ColumnPart | null;
}

/** An AND gate's column: the gate (its node's net) and the pull-up at its top. */
export interface GateColumn {
  readonly gate: string;
  readonly pullUp: ColumnPart;
}

/** Heights of the bands that dark-decoded columns and AND gates add to a drawing, millimetres (all 0 without). */
export interface ColumnBands {
  /** The line under the column heads that says each output column's polarity (dark-decoded columns only). */
  readonly markH: number;
  /** The band between the heads and the matrix holding the VLOGIC rail and the pull-ups (dark columns' and gates'). */
  readonly pullUpH: number;
  /** The band under the matrix holding the level-shift diodes or dividers, above the drivers' names. */
  readonly footH: number;
}

export const NO_COLUMN_BANDS: ColumnBands = { markH: 0, pullUpH: 0, footH: 0 };

/** Length of one level-shift diode's place in the foot band, in units of the scale. */
const SHIFT_PITCH = 5;
/** Resistor body, in units of the scale: length along the column and width. */
const BODY_LEN = 5;
const BODY_W = 1.6;
/** Where the VLOGIC rail sits below the top of the pull-up band, in units of the scale. */
const RAIL_DROP = 1.5;
/** From the rail to a pull-up's body, and from its body to the band's foot, in units of the scale. */
const LEAD = 1.5;
const FOOT_LEAD = 1.5;

/**
 * The dark-decoded columns of a matrix with their parts' designators, and
 * their values where `values` (the sized network) is given.
 *
 * @example
 * darkColumns(project, spec, matrix, budgetDesign(budget).network ?? undefined)[0];
 * // { output: "1a", pullUp: { ref: "R29", ohms: 4300 }, shiftDiodes: ["D20", "D21"], divider: null }
 */
export function darkColumns(project: Project, spec: DecodeSpec, matrix: DiodeMatrix, values?: DarkNetworkValues): DarkColumn[] {
  if (darkOutputs(matrix).length === 0) return [];
  const model = values === undefined ? project.electrical : { ...project.electrical, darkNetwork: values };
  const sized = values !== undefined;
  return designators(spec, matrix, model).darkInputs.map((p) => ({
    output: p.output,
    pullUp: { ref: p.pullUp.ref, ohms: sized ? p.pullUp.ohms : null },
    shiftDiodes: p.shiftDiodes,
    divider: p.divider === null ? null : { ref: p.divider.ref, ohms: sized ? p.divider.ohms : null },
  }));
}

/**
 * The AND gates of a coded counter's decoder with their pull-ups'
 * designators and values (the BOM's: `gatePullUp` ohms each).
 *
 * @example
 * gateColumns(project, spec, matrix)[0]; // { gate: "G1", pullUp: { ref: "R29", ohms: 4700 } }
 */
export function gateColumns(project: Project, spec: DecodeSpec, matrix: DiodeMatrix): GateColumn[] {
  if (matrix.gates.length === 0) return [];
  return designators(spec, matrix, project.electrical).gates.map((g) => ({
    gate: g.gate,
    pullUp: { ref: g.pullUp.ref, ohms: g.pullUp.ohms },
  }));
}

/** The bands the dark-decoded columns and the AND gates' pull-ups need at a scale. */
export function columnBands(dark: readonly DarkColumn[], gates: readonly GateColumn[], m: Metrics): ColumnBands {
  if (dark.length === 0 && gates.length === 0) return NO_COLUMN_BANDS;
  const s = m.scale;
  const foot = Math.max(
    0,
    ...dark.map((c) => (c.divider !== null ? BODY_LEN + 5 : c.shiftDiodes.length * SHIFT_PITCH + (c.shiftDiodes.length > 0 ? 2 : 0))),
  );
  return { markH: dark.length > 0 ? 2.8 * s : 0, pullUpH: (RAIL_DROP + LEAD + BODY_LEN + FOOT_LEAD) * s, footH: foot * s };
}

/**
 * The column pitch the bands' texts need, millimetres: a part's designator
 * and value start just right of its symbol and must end clear of the next
 * column's symbol (a resistor body or a level-shift diode, the widest
 * thing the bands put on a column's line); a cross-reference is centred on
 * its column. A value not sized yet takes the room of the widest E24 value
 * from 1 kΩ to 1 MΩ (`100k`), so the sheet keeps its layout, and its
 * zones, once the values are printed.
 */
export function bandPitch(columns: readonly DarkColumn[], gates: readonly GateColumn[], m: Metrics): number {
  const s = m.scale;
  const texts = [
    ...columns.flatMap((c) => [...partTexts(c.pullUp), ...(c.divider === null ? [] : partTexts(c.divider)), ...c.shiftDiodes]),
    ...gates.flatMap((g) => partTexts(g.pullUp)),
  ];
  if (texts.length === 0) return 0;
  // Where the texts start right of a column (`resistor`, `diodeDown`), and the half width of the next column's symbol.
  const start = Math.max((BODY_W / 2 + 0.6) * s, m.symbolHalf + 0.5 * s);
  const symbolHalf = Math.max((BODY_W / 2) * s, m.symbolHalf);
  const beside = start + Math.max(...texts.map((t) => textWidth(t, m.refSize))) + TEXT_GAP * s + symbolHalf;
  const refs = [...columns.map((c) => c.pullUp.ref), ...gates.map((g) => g.pullUp.ref), WIDEST_SHEET_MARK];
  const centred = Math.max(...refs.map((t) => textWidth(t, m.contSize))) + TEXT_GAP * s;
  return Math.max(beside, centred);
}

/** The widest value text a part of the network can print (E24 from 1 kΩ to 1 MΩ, as formatOhms writes it). */
const WIDEST_VALUE = "100k";
/** The widest sheet mark a cross-reference prints (a drawing of up to 99 sheets). */
const WIDEST_SHEET_MARK = "sh.99";
/** Room between a symbol and its text, and between a text and the next column's symbol, in units of the scale. */
const TEXT_GAP = 0.6;

function partTexts(p: ColumnPart): string[] {
  return [p.ref, p.ohms === null ? WIDEST_VALUE : formatOhms(p.ohms)];
}

/** What a band adds to a sheet. */
export interface BandInk {
  readonly segments: Segment[];
  readonly polygons: Polygon[];
  readonly dots: Dot[];
  readonly labels: Label[];
  /** Where each part is drawn (the middle of its body or symbol), by designator, for the wiring list's zones. */
  readonly places: { readonly ref: string; readonly at: Point }[];
}

const emptyBand = (): BandInk => ({ segments: [], polygons: [], dots: [], labels: [], places: [] });

/** A column on paper: its x, its net and what it carries. */
export interface PlacedColumn {
  readonly x: number;
  /** The column's net: an output line, a bus or an AND gate's node. */
  readonly net: string;
  /** A dark-decoded output's parts; null for any other column. */
  readonly dark: DarkColumn | null;
  /** The pull-up at the column's top, from VLOGIC (a dark-decoded output's or an AND gate's); null for none. */
  readonly pullUp: ColumnPart | null;
}

/**
 * The polarity line under the output columns' heads: `dark` or `lit`,
 * centred on each column, its baseline at `baseline`.
 */
export function polarityMarks(columns: readonly PlacedColumn[], baseline: number, m: Metrics): Label[] {
  return columns.map((c) => label(c.dark === null ? "lit" : "dark", { x: c.x, y: baseline }, m.refSize, "column", { anchor: "middle" }));
}

/**
 * The pull-up band: the VLOGIC rail from the matrix's left edge (`left`,
 * its name right-aligned at `nameRight` like a row's) to the last column
 * with a pull-up, and under it each such column's pull-up (a dark-decoded
 * output's or an AND gate's) with its designator and value, its lower lead
 * running down to the matrix's top (`gridTop`).
 */
export function pullUpBand(
  columns: readonly PlacedColumn[],
  band: { readonly top: number; readonly left: number; readonly nameRight: number; readonly gridTop: number },
  m: Metrics,
): BandInk {
  const ink = emptyBand();
  const pulled = columns.filter((c) => c.pullUp !== null);
  const last = pulled[pulled.length - 1];
  if (last === undefined) return ink;
  const s = m.scale;
  const railY = band.top + RAIL_DROP * s;
  ink.segments.push({ a: { x: band.left, y: railY }, b: { x: last.x, y: railY }, width: STROKE.wire, net: LOGIC_SUPPLY_NET });
  ink.labels.push(label(LOGIC_SUPPLY_NET, { x: band.nameRight, y: railY + 0.36 * m.rowSize }, m.rowSize, "row", { anchor: "end" }));
  for (const c of pulled) {
    const bodyTop = railY + LEAD * s;
    resistor(ink, c.x, railY, bodyTop, band.gridTop, LOGIC_SUPPLY_NET, c.net, c.pullUp as ColumnPart, m);
    if (c !== last) ink.dots.push({ at: { x: c.x, y: railY }, r: m.dotR, net: LOGIC_SUPPLY_NET });
  }
  return ink;
}

/**
 * The pull-up band of a sheet below the one that draws the pull-ups: over
 * each column with a pull-up, where the part would hang, its designator and
 * the sheet it is drawn on (`sh.N`, as a continuation mark names a sheet),
 * so that a builder working from this sheet finds it. Nothing is drawn
 * twice: the part itself, its rail and its zone stay on sheet `sheet`.
 */
export function pullUpReferences(columns: readonly PlacedColumn[], band: { readonly top: number }, sheet: number, m: Metrics): Label[] {
  const s = m.scale;
  const refY = band.top + (RAIL_DROP + LEAD + BODY_LEN / 2) * s;
  return columns.flatMap((c) =>
    c.pullUp === null
      ? []
      : [
          label(c.pullUp.ref, { x: c.x, y: refY - 0.15 * m.contSize }, m.contSize, "continuation", { anchor: "middle" }),
          label(`sh.${sheet}`, { x: c.x, y: refY + 1.15 * m.contSize }, m.contSize, "continuation", { anchor: "middle" }),
        ],
  );
}

/**
 * The foot band, from the matrix's bottom (`gridBottom`) to just above the
 * drivers' names (`footTop`): a dark column's level-shift diodes in series
 * (anode up, band down towards the driver) or its divider's upper resistor,
 * each with its designator; a lit column's line runs straight through.
 */
export function footBand(
  columns: readonly PlacedColumn[],
  band: { readonly gridBottom: number; readonly footTop: number },
  m: Metrics,
): BandInk {
  const ink = emptyBand();
  const s = m.scale;
  for (const c of columns) {
    const d = c.dark;
    if (d === null) {
      ink.segments.push({ a: { x: c.x, y: band.gridBottom }, b: { x: c.x, y: band.footTop }, width: STROKE.wire, net: c.net });
      continue;
    }
    const input = driverInputNet(c.net);
    if (d.divider !== null) {
      resistor(ink, c.x, band.gridBottom, band.gridBottom + 2 * s, band.footTop, c.net, input, d.divider, m);
      continue;
    }
    let y = band.gridBottom;
    d.shiftDiodes.forEach((ref, j) => {
      const from = j === 0 ? c.net : `${c.net}/${j}`;
      const to = j === d.shiftDiodes.length - 1 ? input : `${c.net}/${j + 1}`;
      const end = j === d.shiftDiodes.length - 1 ? band.footTop : y + SHIFT_PITCH * s;
      diodeDown(ink, c.x, y, y + SHIFT_PITCH * s, end, from, to, ref, m);
      y += SHIFT_PITCH * s;
    });
    if (d.shiftDiodes.length === 0)
      ink.segments.push({ a: { x: c.x, y: band.gridBottom }, b: { x: c.x, y: band.footTop }, width: STROKE.wire, net: c.net });
  }
  return ink;
}

/**
 * A vertical resistor at `x`: a lead from `top` (net `upper`) to the body's
 * top at `bodyTop`, the body, a lead on to `bottom` (net `lower`), and its
 * designator with its value under it to the right of the body.
 */
function resistor(
  ink: BandInk,
  x: number,
  top: number,
  bodyTop: number,
  bottom: number,
  upper: string,
  lower: string,
  part: ColumnPart,
  m: Metrics,
): void {
  const s = m.scale;
  const len = BODY_LEN * s;
  const w = BODY_W * s;
  ink.segments.push({ a: { x, y: top }, b: { x, y: bodyTop }, width: STROKE.wire, net: upper });
  ink.polygons.push({
    points: [
      { x: x - w / 2, y: bodyTop },
      { x: x + w / 2, y: bodyTop },
      { x: x + w / 2, y: bodyTop + len },
      { x: x - w / 2, y: bodyTop + len },
    ],
    filled: false,
    width: STROKE.wire,
  });
  ink.segments.push({ a: { x, y: bodyTop + len }, b: { x, y: bottom }, width: STROKE.wire, net: lower });
  const textX = x + w / 2 + 0.6 * s;
  const mid = bodyTop + len / 2;
  ink.places.push({ ref: part.ref, at: { x, y: mid } });
  if (part.ohms === null) {
    ink.labels.push(label(part.ref, { x: textX, y: mid + 0.36 * m.refSize }, m.refSize, "part"));
    return;
  }
  ink.labels.push(label(part.ref, { x: textX, y: mid - 0.15 * m.refSize }, m.refSize, "part"));
  ink.labels.push(label(formatOhms(part.ohms), { x: textX, y: mid + 0.95 * m.refSize }, m.refSize, "part"));
}

/**
 * A diode at `x` pointing down: its anode lead from `top` (net `from`), the
 * triangle and bar centred in [top, slot], its cathode lead on to `bottom`
 * (net `to`), and its designator to the right.
 */
function diodeDown(
  ink: BandInk,
  x: number,
  top: number,
  slot: number,
  bottom: number,
  from: string,
  to: string,
  ref: string,
  m: Metrics,
): void {
  const h = m.symbolHalf;
  const mid = (top + slot) / 2;
  const base = mid - h;
  const apex = mid + h;
  ink.segments.push({ a: { x, y: top }, b: { x, y: base }, width: STROKE.wire, net: from });
  const triangle: Point[] = [
    { x: x - h, y: base },
    { x: x + h, y: base },
    { x, y: apex },
  ];
  ink.polygons.push({ points: triangle, filled: true, width: STROKE.thin });
  ink.segments.push({ a: { x: x - h, y: apex }, b: { x: x + h, y: apex }, width: STROKE.thick });
  ink.segments.push({ a: { x, y: apex }, b: { x, y: bottom }, width: STROKE.wire, net: to });
  ink.labels.push(label(ref, { x: x + h + 0.5 * m.scale, y: mid + 0.36 * m.refSize }, m.refSize, "diode-ref"));
  ink.places.push({ ref, at: { x, y: mid } });
}
