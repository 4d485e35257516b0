/**
 * The parts every drawing sheet shares: the paper, the 10 mm frame, the
 * zone grid in the border, the ISO 7200 title block and the notes box.
 *
 * Sheet sizes: A4 210 x 297 mm and A3 297 x 420 mm (ISO 216), Letter
 * 8.5 x 11 in; the frame
 * sits 10 mm in from the paper edge.
 */
import {
  STROKE,
  fitText,
  label,
  textWidth,
  wrapText,
  type Box,
  type Label,
  type Orientation,
  type PaperName,
  type Point,
  type Rect,
  type Segment,
} from "./drawingModel.ts";

/** Paper size, millimetres, portrait. */
export const PAPER_MM: Readonly<Record<PaperName, { readonly w: number; readonly h: number }>> = {
  a4: { w: 210, h: 297 },
  a3: { w: 297, h: 420 },
  letter: { w: 215.9, h: 279.4 },
};

/** Frame distance from the paper edge, millimetres. */
export const FRAME_MM = 10;
/** Width of the zone strip inside the frame, millimetres. */
export const ZONE_STRIP_MM = 5;
/** Target size of one zone, millimetres. */
const ZONE_TARGET_MM = 30;

/** Size of the title block, millimetres. */
export const TITLE_BLOCK_MM = { w: 100, h: 36 } as const;

/** What the title block says besides the sheet number. */
export interface TitleInfo {
  readonly title: string;
  readonly drawingNumber: string;
  readonly revision: string;
  /** Date of issue as given (ISO 8601 recommended); empty leaves the field for a hand entry. */
  readonly date: string;
  readonly drawnBy: string;
  readonly documentType: string;
  /** Extra field shown in the block, e.g. ["Diodes", "78"]. */
  readonly extra: readonly [string, string];
}

/** The zone grid: numbered columns left to right, lettered rows top to bottom. */
export interface ZoneGrid {
  /** The area the zones divide (inside the zone strip), millimetres. */
  readonly area: Box;
  readonly columns: number;
  readonly rows: number;
}

export interface SheetFrame {
  readonly widthMm: number;
  readonly heightMm: number;
  readonly zones: ZoneGrid;
  /** Where the content may go, millimetres. */
  readonly content: Box;
  readonly segments: Segment[];
  readonly rects: Rect[];
  readonly labels: Label[];
}

/**
 * Frame, border and zone marks of a sheet.
 *
 * @param orientation landscape for the matrix, portrait for tables
 */
export function sheetFrame(paper: PaperName, orientation: Orientation): SheetFrame {
  const p = PAPER_MM[paper];
  const widthMm = orientation === "landscape" ? p.h : p.w;
  const heightMm = orientation === "landscape" ? p.w : p.h;
  const outer: Box = { x: FRAME_MM, y: FRAME_MM, w: widthMm - 2 * FRAME_MM, h: heightMm - 2 * FRAME_MM };
  const area: Box = {
    x: outer.x + ZONE_STRIP_MM,
    y: outer.y + ZONE_STRIP_MM,
    w: outer.w - 2 * ZONE_STRIP_MM,
    h: outer.h - 2 * ZONE_STRIP_MM,
  };
  const columns = Math.max(1, Math.round(area.w / ZONE_TARGET_MM));
  const rows = Math.min(26, Math.max(1, Math.round(area.h / ZONE_TARGET_MM)));
  const zones: ZoneGrid = { area, columns, rows };
  const segments: Segment[] = [];
  const labels: Label[] = [];
  const rects: Rect[] = [
    { box: outer, width: STROKE.frame },
    { box: area, width: STROKE.thin },
  ];
  const zw = area.w / columns;
  const zh = area.h / rows;
  const size = 2.5;
  for (let i = 0; i < columns; i++) {
    const cx = area.x + (i + 0.5) * zw;
    for (const y of [outer.y + ZONE_STRIP_MM / 2 + 0.9, outer.y + outer.h - ZONE_STRIP_MM / 2 + 0.9]) {
      labels.push(label(String(i + 1), { x: cx, y }, size, "zone", { anchor: "middle" }));
    }
    if (i > 0) {
      const x = area.x + i * zw;
      segments.push({ a: { x, y: outer.y }, b: { x, y: area.y }, width: STROKE.thin });
      segments.push({ a: { x, y: area.y + area.h }, b: { x, y: outer.y + outer.h }, width: STROKE.thin });
    }
  }
  for (let j = 0; j < rows; j++) {
    const cy = area.y + (j + 0.5) * zh + 0.9;
    for (const x of [outer.x + ZONE_STRIP_MM / 2, outer.x + outer.w - ZONE_STRIP_MM / 2]) {
      labels.push(label(zoneLetter(j), { x, y: cy }, size, "zone", { anchor: "middle" }));
    }
    if (j > 0) {
      const y = area.y + j * zh;
      segments.push({ a: { x: outer.x, y }, b: { x: area.x, y }, width: STROKE.thin });
      segments.push({ a: { x: area.x + area.w, y }, b: { x: outer.x + outer.w, y }, width: STROKE.thin });
    }
  }
  const pad = 3;
  const content: Box = { x: area.x + pad, y: area.y + pad, w: area.w - 2 * pad, h: area.h - 2 * pad };
  return { widthMm, heightMm, zones, content, segments, rects, labels };
}

function zoneLetter(j: number): string {
  return String.fromCharCode(65 + j);
}

/** The zone (`C4`: row letter, column number) a point lies in. */
export function zoneOf(zones: ZoneGrid, at: Point): string {
  const { area, columns, rows } = zones;
  const col = Math.min(columns - 1, Math.max(0, Math.floor(((at.x - area.x) / area.w) * columns)));
  const row = Math.min(rows - 1, Math.max(0, Math.floor(((at.y - area.y) / area.h) * rows)));
  return `${zoneLetter(row)}${col + 1}`;
}

/**
 * The ISO 7200 title block with its lower-right corner at `corner`: title,
 * drawing (identification) number, revision, date of issue, sheet k of n,
 * creator ("drawn by"), approver (left blank for a signature), document type,
 * and one extra field.
 */
export function titleBlock(info: TitleInfo, sheet: number, count: number, corner: Point): { rects: Rect[]; labels: Label[] } {
  const { w, h } = TITLE_BLOCK_MM;
  const x0 = corner.x - w;
  const y0 = corner.y - h;
  const rects: Rect[] = [{ box: { x: x0, y: y0, w, h }, width: STROKE.thick }];
  const labels: Label[] = [];
  const fieldSize = 1.8;
  const valueSize = 2.5;
  const cell = (box: Box, field: string, value: string, lines = 1): void => {
    rects.push({ box, width: STROKE.thin });
    labels.push(label(field, { x: box.x + 1, y: box.y + 2.1 }, fieldSize, "title-field"));
    const maxChars = (box.w - 2) / textWidth("M", valueSize);
    const wrapped = lines > 1 ? wrapText(value, maxChars) : [value];
    const shown = wrapped
      .slice(0, lines)
      .map((l, i) =>
        i === lines - 1 && wrapped.length > lines ? fitText(`${l} ${wrapped[i + 1] ?? ""}`, maxChars) : fitText(l, maxChars),
      );
    shown.forEach((text, i) => {
      if (text)
        labels.push(label(text, { x: box.x + 1, y: box.y + 5.2 + i * 3.1 }, valueSize, "title-value", { bold: i === 0 && lines > 1 }));
    });
  };
  const rowH = [12, 8, 8, 8] as const;
  let y = y0;
  cell({ x: x0, y, w, h: rowH[0] }, "Title", info.title, 2);
  y += rowH[0];
  cell({ x: x0, y, w: 55, h: rowH[1] }, "Drawing number", info.drawingNumber);
  cell({ x: x0 + 55, y, w: 15, h: rowH[1] }, "Rev.", info.revision);
  cell({ x: x0 + 70, y, w: 30, h: rowH[1] }, "Date of issue", info.date);
  y += rowH[1];
  cell({ x: x0, y, w: 55, h: rowH[2] }, "Document type", info.documentType);
  cell({ x: x0 + 55, y, w: 45, h: rowH[2] }, "Sheet", `${sheet} of ${count}`);
  y += rowH[2];
  cell({ x: x0, y, w: 35, h: rowH[3] }, "Drawn by", info.drawnBy);
  cell({ x: x0 + 35, y, w: 35, h: rowH[3] }, "Approved", "");
  cell({ x: x0 + 70, y, w: 30, h: rowH[3] }, info.extra[0], info.extra[1]);
  return { rects, labels };
}

const NOTE_SIZE = 2.2;
const NOTE_LINE_MM = 3.1;

/** The notes as printed lines; continuation lines are indented by position, not by spaces, which SVG would collapse. */
function noteLines(notes: readonly string[], width: number): { text: string; indent: number }[] {
  const maxChars = (width - 4) / textWidth("M", NOTE_SIZE);
  const lines: { text: string; indent: number }[] = [{ text: "NOTES", indent: 0 }];
  notes.forEach((n, i) => {
    const prefix = `${i + 1}. `;
    const indent = textWidth(prefix, NOTE_SIZE);
    wrapText(n, maxChars - prefix.length).forEach((l, k) => lines.push(k === 0 ? { text: prefix + l, indent: 0 } : { text: l, indent }));
  });
  return lines;
}

/** Height a notes box of a given width needs to show every line, millimetres. */
export function notesHeight(notes: readonly string[], width: number): number {
  return noteLines(notes, width).length * NOTE_LINE_MM + 2.5;
}

/**
 * Numbered notes wrapped into a box; lines that do not fit are dropped and
 * the last shown line says so.
 */
export function notesBlock(notes: readonly string[], box: Box): { rects: Rect[]; labels: Label[] } {
  const size = NOTE_SIZE;
  const lineH = NOTE_LINE_MM;
  const labels: Label[] = [];
  const lines = noteLines(notes, box.w);
  const capacity = Math.max(1, Math.floor((box.h - 2) / lineH));
  const shown = lines.length <= capacity ? lines : [...lines.slice(0, capacity - 1), { text: "(further notes did not fit)", indent: 0 }];
  shown.forEach((line, i) => {
    labels.push(label(line.text, { x: box.x + 2 + line.indent, y: box.y + 3.5 + i * lineH }, size, "note", { bold: i === 0 }));
  });
  return { rects: [{ box, width: STROKE.thin }], labels };
}
