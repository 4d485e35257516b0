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
 * Pure layout in millimetres: the grid gives the bands' heights, the sheet
 * layout says where they land on paper and which columns it shows.
 */
import { darkOutputs, type DiodeMatrix } from "../core/matrix/matrix.ts";
import { designators, type DarkNetworkValues } from "../core/matrix/designators.ts";
import { LOGIC_SUPPLY_NET, driverInputNet } from "../core/papers/wiringList.ts";
import type { Project } from "../core/project/project.ts";
import type { DecodeSpec } from "../core/spec/decodeSpec.ts";
import { STROKE, label, type Dot, type Label, type Point, type Polygon, type Segment } from "./drawingModel.ts";
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

/** Heights of the bands a drawing with dark-decoded columns adds, millimetres (all 0 without). */
export interface DarkBands {
  /** The line under the column heads that says each output column's polarity. */
  readonly markH: number;
  /** The band between the heads and the matrix holding the VLOGIC rail and the pull-ups. */
  readonly pullUpH: number;
  /** The band under the matrix holding the level-shift diodes or dividers, above the drivers' names. */
  readonly footH: number;
}

export const NO_DARK_BANDS: DarkBands = { markH: 0, pullUpH: 0, footH: 0 };

/** Length of one level-shift diode's place in the foot band, in units of the scale. */
const SHIFT_PITCH = 5;
/** Resistor body, in units of the scale: length along the column and width. */
const BODY_LEN = 5;
const BODY_W = 1.6;
/** Where the VLOGIC rail sits below the top of the pull-up band, in units of the scale. */
const RAIL_DROP = 2.5;

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

/** The bands the dark-decoded columns need at a scale. */
export function darkBands(columns: readonly DarkColumn[], m: Metrics): DarkBands {
  if (columns.length === 0) return NO_DARK_BANDS;
  const s = m.scale;
  const foot = Math.max(
    ...columns.map((c) => (c.divider !== null ? BODY_LEN + 5 : c.shiftDiodes.length * SHIFT_PITCH + (c.shiftDiodes.length > 0 ? 2 : 0))),
  );
  return { markH: 2.8 * s, pullUpH: 13 * s, footH: foot * s };
}

/**
 * Every text a column's parts print beside it, for the column pitch. A
 * value not sized yet takes the room of the widest E24 value from 1 kΩ to
 * 1 MΩ (`100k`), so the sheet keeps its layout, and its zones, once the
 * values are printed.
 */
export function darkColumnTexts(columns: readonly DarkColumn[]): string[] {
  return columns.flatMap((c) => [...partTexts(c.pullUp), ...(c.divider === null ? [] : partTexts(c.divider)), ...c.shiftDiodes]);
}

/** The widest value text a part of the network can print (E24 from 1 kΩ to 1 MΩ, as formatOhms writes it). */
const WIDEST_VALUE = "100k";

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

/** A column on paper: its x and what it carries (null for a lit-decoded column). */
export interface PlacedColumn {
  readonly x: number;
  readonly output: string;
  readonly dark: DarkColumn | null;
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
 * its name right-aligned at `nameRight` like a row's) to the last dark
 * column, and under it each dark column's pull-up with its designator and
 * value, its lower lead running down to the matrix's top (`gridTop`).
 */
export function pullUpBand(
  columns: readonly PlacedColumn[],
  band: { readonly top: number; readonly left: number; readonly nameRight: number; readonly gridTop: number },
  m: Metrics,
): BandInk {
  const ink = emptyBand();
  const dark = columns.filter((c) => c.dark !== null);
  const last = dark[dark.length - 1];
  if (last === undefined) return ink;
  const s = m.scale;
  const railY = band.top + RAIL_DROP * s;
  ink.segments.push({ a: { x: band.left, y: railY }, b: { x: last.x, y: railY }, width: STROKE.wire, net: LOGIC_SUPPLY_NET });
  ink.labels.push(label(LOGIC_SUPPLY_NET, { x: band.nameRight, y: railY + 0.36 * m.rowSize }, m.rowSize, "row", { anchor: "end" }));
  for (const c of dark) {
    const d = c.dark as DarkColumn;
    const bodyTop = railY + 1.5 * s;
    resistor(ink, c.x, railY, bodyTop, band.gridTop, LOGIC_SUPPLY_NET, c.output, d.pullUp, m);
    if (c !== last) ink.dots.push({ at: { x: c.x, y: railY }, r: m.dotR, net: LOGIC_SUPPLY_NET });
  }
  return ink;
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
      ink.segments.push({ a: { x: c.x, y: band.gridBottom }, b: { x: c.x, y: band.footTop }, width: STROKE.wire, net: c.output });
      continue;
    }
    const input = driverInputNet(c.output);
    if (d.divider !== null) {
      resistor(ink, c.x, band.gridBottom, band.gridBottom + 2 * s, band.footTop, c.output, input, d.divider, m);
      continue;
    }
    let y = band.gridBottom;
    d.shiftDiodes.forEach((ref, j) => {
      const from = j === 0 ? c.output : `${c.output}/${j}`;
      const to = j === d.shiftDiodes.length - 1 ? input : `${c.output}/${j + 1}`;
      const end = j === d.shiftDiodes.length - 1 ? band.footTop : y + SHIFT_PITCH * s;
      diodeDown(ink, c.x, y, y + SHIFT_PITCH * s, end, from, to, ref, m);
      y += SHIFT_PITCH * s;
    });
    if (d.shiftDiodes.length === 0)
      ink.segments.push({ a: { x: c.x, y: band.gridBottom }, b: { x: c.x, y: band.footTop }, width: STROKE.wire, net: c.output });
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
