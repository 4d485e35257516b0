/**
 * The driver-stage sheets: the stage of the build's driver kind drawn once
 * (driverSchematic.ts), the supplies, the hazard note above 60 V DC, and a
 * table of every driven output's parts with their values after the trim
 * (the design the budget settles, as the BOM and the SPICE decks carry it)
 * and, with a budget, its lit current. A table too long for the first
 * sheet continues on the next ones. Pure layout; no DOM.
 *
 * The sheets are their own document ("Driver stages") with their own sheet
 * numbers, so that the matrix drawing, laid out before the budget settles
 * the resistor values, keeps its numbers.
 */
import type { Budget } from "../core/budget/budgetTypes.ts";
import { carriedVoltages, safetyCautions } from "../core/budget/safety.ts";
import { designModel, designNote, type SegmentDesign } from "../core/budget/segmentDesign.ts";
import { designators, type DarkInputParts, type DriverParts, type StageResistor } from "../core/matrix/designators.ts";
import type { DiodeMatrix } from "../core/matrix/matrix.ts";
import type { DriverKind, ElectricalModel, Project } from "../core/project/project.ts";
import type { DecodeSpec } from "../core/spec/decodeSpec.ts";
import { STROKE, label, textWidth, wrapText, type Box, type Label, type Rect, type Segment, type Sheet } from "./drawingModel.ts";
import type { DrawingOptions } from "./drawingOptions.ts";
import { stageSchematic, type StagePart } from "./driverSchematic.ts";
import { GAP } from "./layoutMetrics.ts";
import type { Ink } from "./schematicSymbols.ts";
import { notesBlock, notesHeight, sheetFrame, titleBlock, TITLE_BLOCK_MM } from "./sheetFrame.ts";
import { milliamps, ohmsText } from "./units.ts";

export interface DriverSheetInput {
  readonly project: Project;
  readonly spec: DecodeSpec;
  readonly matrix: DiodeMatrix;
  /** The design the papers show (the budget's, with the trim where it is applied). */
  readonly design: SegmentDesign;
  readonly options: DrawingOptions;
  /** The budget of this design, for each output's lit current; null when there is none. */
  readonly budget: Budget | null;
}

/** One row of the table: an output and the text of each column. */
export interface DriverTableRow {
  readonly output: string;
  readonly cells: readonly string[];
}

export interface DriverTable {
  readonly head: readonly string[];
  readonly rows: readonly DriverTableRow[];
}

/** Width of the left column (the stage and the notes), millimetres. */
const LEFT_MM = 118;
/** Largest and smallest table text, millimetres. */
const TABLE_TEXT_MAX = 2.3;
const TABLE_TEXT_MIN = 1.5;
/** Horizontal padding inside a table cell, millimetres (each side). */
const CELL_PAD = 1.2;
const CAUTION_TEXT = 2.3;

/** What each kind is, in the words of the notes. */
const KIND_WORDS: Readonly<Record<DriverKind, string>> = {
  "current-sink":
    "NPN constant-current sink: the output line X is the base; Re from the emitter to ground sets the current, (Vx - Vbe) / Re; the segment hangs from +VSUP on the collector.",
  "low-side-switch":
    "NPN low-side switch under a common-anode display: X drives the base through Rb, Rbe holds it off; saturated, Rs sets the current, (Vs - n Vf - Vce(sat)) / Rs.",
  "emitter-follower":
    "NPN emitter follower over a common-cathode display: the collector is on +VSUP, the emitter sits one Vbe below the base and feeds Rs and the segment to ground.",
  "high-side-switch":
    "PNP high-side switch over a common-cathode display: the emitter is on +VSUP; X pulled low drives the base through Rb, Rbe and the line's pull-up hold it off; saturated, Rs sets the current, (Vs - Vec(sat) - n Vf) / Rs.",
  direct: "No transistor: the counter line lights the segment through the matrix and Rs, (Vline - diode drops - n Vf) / Rs.",
};

/** The resistor of a column, for an output's parts. */
function resistorOf(part: StagePart, d: DriverParts): StageResistor | null {
  const sink = d.kind === "current-sink";
  switch (part) {
    case "Re":
      return sink ? d.current : null;
    case "Rs":
      return sink ? null : d.current;
    case "Rc":
      return sink ? d.series : null;
    case "Rb":
      return d.base;
    case "Rbe":
      return d.baseEmitter;
    case "Rpd":
      return d.pullDown.role === "pull-down" || d.pullDown.role === "divider" ? d.pullDown : null;
    case "Rpu":
      return d.pullDown.role === "line-pull-up" ? d.pullDown : null;
    case "Rt":
      return d.tieOn;
    default:
      return null;
  }
}

const RESISTOR_PARTS: readonly StagePart[] = ["Re", "Rs", "Rc", "Rb", "Rbe", "Rpd", "Rpu", "Rt"];

/**
 * The table of every driven output: output, driver, each resistor (reference
 * and value) that some output has, the segment, and with a budget the lit
 * current over the states at nominal values. Where outputs are decoded
 * dark, their pull-up (Ru) and level-shift diodes (Dl) or divider (Rv; its
 * lower resistor is the output's Rpd) come after the output.
 *
 * @example
 * driverTable(parts.drivers, budget).head; // ["Output", "Q", "Rs", "Rb", "Rbe", "Rpd", "DS", "Lit mA"]
 */
export function driverTable(
  drivers: readonly DriverParts[],
  budget: Budget | null,
  darkInputs: readonly DarkInputParts[] = [],
): DriverTable {
  const parts = RESISTOR_PARTS.filter((p) => drivers.some((d) => resistorOf(p, d) !== null));
  const withQ = drivers.some((d) => d.transistor !== null);
  const dark = new Map(darkInputs.map((p) => [p.output, p]));
  const withShift = darkInputs.some((p) => p.shiftDiodes.length > 0);
  const withDivider = darkInputs.some((p) => p.divider !== null);
  const darkHead = dark.size === 0 ? [] : ["Ru", ...(withShift ? ["Dl"] : []), ...(withDivider ? ["Rv"] : [])];
  const head = ["Output", ...darkHead, ...(withQ ? ["Q"] : []), ...parts, "DS", ...(budget ? ["Lit mA"] : [])];
  const rows = drivers.map((d) => {
    const cells = [d.tiedOn ? `${d.output} (on)` : d.output];
    if (dark.size > 0) {
      const p = dark.get(d.output);
      cells.push(p ? `${p.pullUp.ref} ${ohmsText(p.pullUp.ohms)}` : "-");
      if (withShift) cells.push(p && p.shiftDiodes.length > 0 ? p.shiftDiodes.join(" ") : "-");
      if (withDivider) cells.push(p?.divider ? `${p.divider.ref} ${ohmsText(p.divider.ohms)}` : "-");
    }
    if (withQ) cells.push(d.transistor ?? "-");
    for (const p of parts) {
      const r = resistorOf(p, d);
      cells.push(r === null ? "-" : `${r.ref} ${ohmsText(r.ohms)}`);
    }
    cells.push(d.display);
    if (budget) {
      const o = budget.outputs[d.output];
      cells.push(o && o.maxA > 0 ? `${milliamps(o.minA)}-${milliamps(o.maxA)}` : "-");
    }
    return { output: d.output, cells };
  });
  return { head, rows };
}

/** The notes of the driver sheet, in order. */
export function driverNotes(
  e: ElectricalModel,
  tiedOn: readonly string[],
  design: SegmentDesign,
  withBudget: boolean,
  darkInputs: readonly DarkInputParts[] = [],
): string[] {
  const s = e.supply;
  const kind = e.driver.kind;
  const notes = [KIND_WORDS[kind]];
  notes.push(
    kind === "direct"
      ? "No segment supply: the counter lines (and the logic supply, for tied-on outputs) give all the current."
      : `Segment supply +VSUP ${s.volts} V (${s.minVolts}-${s.maxVolts} V): ${kind === "emitter-follower" ? "every follower's collector" : kind === "high-side-switch" ? "every switch's emitter, its Rbe and the line pull-ups Rpu" : "the anode end of every segment"}.`,
  );
  if (kind === "high-side-switch") {
    notes.push(
      `Active-low lines: each matrix column X is pulled down through the matrix diodes to the line nS<k> of every state that lights its segment (${e.lowLine.low} V active, ${e.lowLine.high} V idle), which turns the switch on; Rpu and Rbe hold it off otherwise.`,
    );
  }
  if (tiedOn.length > 0 && kind === "high-side-switch") {
    notes.push(
      `Tied-on outputs (${tiedOn.join(", ")}, lit in every state, no diodes): X is held down to ground through Rt instead of a matrix column.`,
    );
  } else if (tiedOn.length > 0) {
    notes.push(
      `Tied-on outputs (${tiedOn.join(", ")}, lit in every state, no diodes): X hangs from the logic supply VLOGIC ${e.logicSupply.volts} V through Rt instead of a matrix column.`,
    );
  }
  if (darkInputs.length > 0) {
    const divider = darkInputs.some((p) => p.divider !== null);
    notes.push(
      `Dark-decoded outputs (${darkInputs.map((p) => p.output).join(", ")}): the matrix column is pulled up from VLOGIC ${e.logicSupply.volts} V through Ru and down through the matrix diodes to the active-low lines; ` +
        (divider
          ? "X reaches the stage through the divider Rv over Rpd."
          : "X reaches the stage through the level-shift diodes Dl (anode at the column), which Rpd keeps conducting."),
    );
  }
  const seg = e.segment;
  notes.push(
    `DS: ${seg.leds === 1 ? "one LED" : `${seg.leds} LEDs in series`} per segment, target ${milliamps(seg.targetA, 1)} mA, rated ${milliamps(seg.maxA, 1)} mA.`,
  );
  if (kind !== "direct") {
    const d = e.driver;
    notes.push(
      `Q: small-signal ${kind === "high-side-switch" ? "PNP" : "NPN"} rated at least ${d.maxVceV} V, ${d.maxPowerW} W, ${milliamps(d.maxCollectorA, 0)} mA.`,
    );
  }
  notes.push(designNote(design));
  notes.push(
    withBudget
      ? "Lit mA: the segment's lowest and highest current over the states that light it, at nominal values (the budget)."
      : "The currents follow when the budget has been worked out.",
  );
  return notes;
}

/** A box of caution text: a bold heading and the wrapped messages. */
function cautionBlock(messages: readonly string[], x: number, y: number, w: number): { rects: Rect[]; labels: Label[]; h: number } {
  const maxChars = (w - 4) / textWidth("M", CAUTION_TEXT);
  const lines = ["DANGER: HAZARDOUS VOLTAGE", ...messages.flatMap((m) => wrapText(m, maxChars))];
  const lineH = CAUTION_TEXT * 1.35;
  const labels = lines.map((t, i) => label(t, { x: x + 2, y: y + 3.6 + i * lineH }, CAUTION_TEXT, "note", { bold: i === 0 }));
  const h = lines.length * lineH + 2.5;
  return { rects: [{ box: { x, y, w, h }, width: STROKE.thick }], labels, h };
}

/** Widths of the table columns at a text size, millimetres. */
function columnWidths(table: DriverTable, size: number): number[] {
  return table.head.map((h, c) => {
    const texts = [h, ...table.rows.map((r) => r.cells[c] ?? "")];
    return Math.max(...texts.map((t) => textWidth(t, size))) + 2 * CELL_PAD;
  });
}

/** A band of the table: its header and rows `first`..`first + count - 1`, top-left at (x, y). */
function tableBand(
  table: DriverTable,
  widths: readonly number[],
  size: number,
  rows: readonly DriverTableRow[],
  x: number,
  y: number,
): { segments: Segment[]; rects: Rect[]; labels: Label[] } {
  const rowH = rowHeight(size);
  const w = widths.reduce((a, b) => a + b, 0);
  const h = (rows.length + 1) * rowH;
  const segments: Segment[] = [];
  const labels: Label[] = [];
  const rects: Rect[] = [{ box: { x, y, w, h }, width: STROKE.thin }];
  let cx = x;
  widths.forEach((cw, c) => {
    if (c > 0) segments.push({ a: { x: cx, y }, b: { x: cx, y: y + h }, width: STROKE.thin });
    labels.push(label(table.head[c] ?? "", { x: cx + CELL_PAD, y: y + rowH * 0.72 }, size, "table", { bold: true }));
    rows.forEach((r, i) => {
      const text = r.cells[c] ?? "";
      labels.push(label(text, { x: cx + CELL_PAD, y: y + (i + 1) * rowH + rowH * 0.72 }, size, "table", { bold: c === 0 }));
    });
    cx += cw;
  });
  for (let i = 1; i <= rows.length; i++) {
    segments.push({ a: { x, y: y + i * rowH }, b: { x: x + w, y: y + i * rowH }, width: i === 1 ? STROKE.wire : STROKE.thin });
  }
  return { segments, rects, labels };
}

const rowHeight = (size: number): number => size * 1.75;

const BAND_TITLE_TEXT = 2.2;

/** The title over a band of the table. */
function bandTitle(from: number, to: number, of: number, next: number | null): string {
  return `PARTS OF EACH STAGE, outputs ${from}-${to} of ${of}${next !== null ? ` (on to sheet ${next})` : ""}`;
}

/** Moves and scales a schematic's ink onto the sheet. */
function placeInk(ink: Ink, dx: number, dy: number, s: number): Ink {
  const p = (q: { x: number; y: number }) => ({ x: dx + q.x * s, y: dy + q.y * s });
  return {
    segments: ink.segments.map((g) => ({ ...g, a: p(g.a), b: p(g.b) })),
    polygons: ink.polygons.map((g) => ({ ...g, points: g.points.map(p) })),
    circles: ink.circles.map((c) => ({ ...c, at: p(c.at), r: c.r * s })),
    dots: ink.dots.map((d) => ({ ...d, at: p(d.at), r: d.r * s })),
    labels: ink.labels.map((l) => label(l.text, p(l.at), l.size * s, l.role, { anchor: l.anchor, rotate: l.rotate, bold: l.bold })),
  };
}

/**
 * Lays out the driver-stage sheets of a build.
 *
 * @example
 * const sheets = layoutDriverSheets({ project, spec, matrix, design: budgetDesign(budget), options, budget });
 * sheets[0].labels.some((l) => l.text === "Rs"); // true for a low-side switch
 */
export function layoutDriverSheets(input: DriverSheetInput): Sheet[] {
  const { project, spec, matrix, design, options, budget } = input;
  const e = project.electrical;
  const parts = designators(spec, matrix, designModel(e, design), design.ohms);
  const table = driverTable(parts.drivers, budget, parts.darkInputs);
  const tiedOn = parts.drivers.filter((d) => d.tiedOn).map((d) => d.output);
  const frame = sheetFrame(options.paper, "landscape");
  const content = frame.content;
  const tbTop = content.y + content.h - TITLE_BLOCK_MM.h;

  // The left column: the stage, then the notes.
  const notes = driverNotes(e, tiedOn, design, budget !== null, parts.darkInputs);
  const notesH = notesHeight(notes, LEFT_MM);
  const schematic = stageSchematic({
    kind: e.driver.kind,
    base: parts.drivers.some((d) => d.base !== null),
    baseEmitter: parts.drivers.some((d) => d.baseEmitter !== null),
    collector: e.driver.kind === "current-sink" && parts.drivers.some((d) => d.series !== null),
    tieOn: tiedOn.length > 0,
    leds: e.segment.leds,
    supplyText: e.driver.kind === "direct" ? "" : `+VSUP ${e.supply.volts} V`,
    logicText: `VLOGIC ${e.logicSupply.volts} V`,
  });
  const b = schematic.box;
  const heading = 4;
  const s = Math.min(1.35, LEFT_MM / b.w, (content.h - notesH - GAP - heading) / b.h);
  const placed = placeInk(schematic.ink, content.x - b.x * s, content.y + heading - b.y * s, s);
  const notesBox: Box = { x: content.x, y: content.y + heading + b.h * s + GAP, w: LEFT_MM, h: notesH };

  // The right column: the cautions, then the table.
  const rightX = content.x + LEFT_MM + 2 * GAP;
  const rightW = content.x + content.w - rightX;
  const cautions = safetyCautions(carriedVoltages(e)).map((c) => c.message);
  const caution = cautions.length > 0 ? cautionBlock(cautions, rightX, content.y, rightW) : null;
  const tableTop = content.y + (caution ? caution.h + GAP : 0);
  let size = TABLE_TEXT_MAX;
  while (size > TABLE_TEXT_MIN && columnWidths(table, size).reduce((a, c) => a + c, 0) > rightW) size -= 0.1;
  const widths = columnWidths(table, size);
  const tableW = widths.reduce((a, c) => a + c, 0);
  const rowH = rowHeight(size);
  const titleRow = 4;
  const firstRows = Math.max(0, Math.floor((tbTop - GAP - tableTop - titleRow) / rowH) - 1);
  // Later sheets: bands side by side above the title block.
  const laterH = tbTop - GAP - content.y - titleRow;
  const perBand = Math.max(1, Math.floor(laterH / rowH) - 1);
  const n = table.rows.length;
  const bandW = Math.max(tableW, textWidth(bandTitle(n, n, n, n + 1), BAND_TITLE_TEXT));
  const bands = Math.max(1, Math.floor((content.w + GAP) / (bandW + GAP)));
  const pages: { x: number; y: number; rows: DriverTableRow[] }[][] = [];
  let rest = [...table.rows];
  pages.push([{ x: rightX, y: tableTop + titleRow, rows: rest.splice(0, firstRows) }]);
  while (rest.length > 0) {
    const page: { x: number; y: number; rows: DriverTableRow[] }[] = [];
    for (let k = 0; k < bands && rest.length > 0; k++)
      page.push({ x: content.x + k * (bandW + GAP), y: content.y + titleRow, rows: rest.splice(0, perBand) });
    pages.push(page);
  }
  const count = pages.length;

  return pages.map((page, i): Sheet => {
    const number = i + 1;
    const segments: Segment[] = [...frame.segments];
    const rects: Rect[] = [...frame.rects];
    const labels: Label[] = [...frame.labels];
    const sheet: Pick<Ink, "polygons" | "circles" | "dots"> = { polygons: [], circles: [], dots: [] };
    if (i === 0) {
      labels.push(label("DRIVER STAGE, ONE PER OUTPUT", { x: content.x, y: content.y + 2.2 }, 2.5, "note", { bold: true }));
      segments.push(...placed.segments);
      sheet.polygons.push(...placed.polygons);
      sheet.circles.push(...placed.circles);
      sheet.dots.push(...placed.dots);
      labels.push(...placed.labels);
      const nb = notesBlock(notes, notesBox);
      rects.push(...nb.rects);
      labels.push(...nb.labels);
      if (caution) {
        rects.push(...caution.rects);
        labels.push(...caution.labels);
      }
    }
    page.forEach((band, k) => {
      if (band.rows.length === 0) return;
      const from = table.rows.indexOf(band.rows[0] as DriverTableRow) + 1;
      const to = from + band.rows.length - 1;
      const next = k === page.length - 1 && number < count ? number + 1 : null;
      labels.push(label(bandTitle(from, to, n, next), { x: band.x, y: band.y - 1.2 }, BAND_TITLE_TEXT, "note", { bold: true }));
      const t = tableBand(table, widths, size, band.rows, band.x, band.y);
      segments.push(...t.segments);
      rects.push(...t.rects);
      labels.push(...t.labels);
    });
    const tb = titleBlock(
      {
        title: project.title,
        drawingNumber: `${options.drawingNumber}-D`,
        revision: options.revision,
        date: options.date,
        drawnBy: options.drawnBy,
        documentType: "Driver stages, schematic",
        extra: ["Outputs", String(table.rows.length)],
      },
      number,
      count,
      { x: content.x + content.w, y: content.y + content.h },
    );
    rects.push(...tb.rects);
    labels.push(...tb.labels);
    return {
      number,
      count,
      paper: options.paper,
      orientation: "landscape",
      widthMm: frame.widthMm,
      heightMm: frame.heightMm,
      segments,
      polygons: sheet.polygons,
      rects,
      circles: sheet.circles,
      diodes: [],
      dots: sheet.dots,
      labels,
    };
  });
}
