/**
 * The drawing model: what a sheet holds, in millimetres, with no DOM.
 *
 * Layout steps produce `Sheet`s; the svg.js adapter (drawSheet.ts) only
 * copies them onto a canvas. Every text carries the box it occupies, so tests
 * can check overlaps without a browser. Text is set in a monospaced face so
 * that the box estimated here is the box the printer inks.
 */

export interface Point {
  /** Millimetres from the sheet's left edge. */
  readonly x: number;
  /** Millimetres from the sheet's top edge. */
  readonly y: number;
}

/** An axis-aligned box, millimetres. */
export interface Box {
  readonly x: number;
  readonly y: number;
  readonly w: number;
  readonly h: number;
}

/** Line widths, millimetres (ISO 128 series: 0.18, 0.35, 0.5, 0.7). */
export const STROKE = { thin: 0.18, wire: 0.35, thick: 0.5, frame: 0.7 } as const;

/** A straight line. `net` names the electrical net for wires and diode leads. */
export interface Segment {
  readonly a: Point;
  readonly b: Point;
  /** Width, millimetres. */
  readonly width: number;
  readonly net?: string;
  readonly dashed?: boolean;
}

/** A closed polygon (arrowheads, filled key segments). */
export interface Polygon {
  readonly points: readonly Point[];
  readonly filled: boolean;
  /** Outline width, millimetres. */
  readonly width: number;
}

/** A rectangle outline (frames, title-block cells, check boxes). */
export interface Rect {
  readonly box: Box;
  /** Outline width, millimetres. */
  readonly width: number;
}

export interface Circle {
  readonly at: Point;
  /** Radius, millimetres. */
  readonly r: number;
  readonly filled: boolean;
}

/** What a text is for; tests and the renderer may treat roles differently. */
export type LabelRole =
  | "diode-ref"
  | "row"
  | "column"
  | "group"
  | "key"
  | "terminal"
  | "continuation"
  | "zone"
  | "title-field"
  | "title-value"
  | "note"
  | "part"
  | "table";

export type TextAnchor = "start" | "middle" | "end";

export interface Label {
  readonly text: string;
  /** Anchor point on the baseline (before rotation). */
  readonly at: Point;
  /** Font size (em height), millimetres. */
  readonly size: number;
  readonly anchor: TextAnchor;
  /** 0 reads left to right; -90 reads bottom to top. */
  readonly rotate: 0 | -90;
  readonly bold: boolean;
  readonly role: LabelRole;
  /** The area the text occupies, millimetres. */
  readonly box: Box;
}

/**
 * A diode drawn across a crossing: the anode lead taps the driving line (a
 * horizontal row), the cathode lead taps the driven line (a vertical column).
 * The triangle points along the current; the bar sits at the cathode end.
 * An AND gate's input diode is drawn the other way round (`reversed`): its
 * anode taps the gate's column, its cathode the stage line's row.
 */
export interface DiodeSymbol {
  readonly ref: string;
  readonly from: string;
  readonly to: string;
  /** Where the row and the column cross. */
  readonly crossing: Point;
  /** Anode tap: on the row, or on the column when reversed. */
  readonly anode: Point;
  /** Cathode tap: on the column, or on the row when reversed. */
  readonly cathode: Point;
  /** True for an AND gate's input diode (anode on the gate column, cathode on the stage-line row). */
  readonly reversed?: boolean;
  /** Triangle corners: base, base, apex (the apex touches the bar). */
  readonly triangle: readonly [Point, Point, Point];
  readonly bar: readonly [Point, Point];
  /** Everything the symbol inks, leads included. */
  readonly box: Box;
}

/** A junction dot: three or more wire ends of one net meet here. */
export interface Dot {
  readonly at: Point;
  /** Radius, millimetres. */
  readonly r: number;
  readonly net: string;
}

/** Paper sizes: ISO 216 A4 and A3 (for big matrices), and US Letter. */
export type PaperName = "a4" | "a3" | "letter";

/** Every paper, in the order the command line and the app list them. */
export const PAPER_NAMES: readonly PaperName[] = ["a4", "a3", "letter"];

export type Orientation = "landscape" | "portrait";

export interface Sheet {
  /** 1-based sheet number. */
  readonly number: number;
  readonly count: number;
  readonly paper: PaperName;
  /** Every sheet of a drawing has the same orientation, chosen for the fewest sheets. */
  readonly orientation: Orientation;
  /** Paper width, millimetres, as the sheet is read. */
  readonly widthMm: number;
  readonly heightMm: number;
  readonly segments: readonly Segment[];
  readonly polygons: readonly Polygon[];
  readonly rects: readonly Rect[];
  readonly circles: readonly Circle[];
  readonly diodes: readonly DiodeSymbol[];
  readonly dots: readonly Dot[];
  readonly labels: readonly Label[];
}

/** Advance width of one character of the monospaced face, in ems (DejaVu Sans Mono: 0.602). */
export const CHAR_WIDTH_EM = 0.61;
/** Ink above the baseline, in ems (caps and ascenders, with a little room). */
const ASCENT_EM = 0.8;
/** Ink below the baseline, in ems (descenders). */
const DESCENT_EM = 0.25;

/** Font families for every text, monospaced first (see CHAR_WIDTH_EM). */
export const FONT_FAMILY = "'DejaVu Sans Mono', 'Liberation Mono', 'Courier New', monospace";

/** Width of a text, millimetres, at a font size in millimetres. */
export function textWidth(text: string, size: number): number {
  return [...text].length * CHAR_WIDTH_EM * size;
}

/** Builds a label and works out its box. */
export function label(
  text: string,
  at: Point,
  size: number,
  role: LabelRole,
  options: { readonly anchor?: TextAnchor; readonly rotate?: 0 | -90; readonly bold?: boolean } = {},
): Label {
  const anchor = options.anchor ?? "start";
  const rotate = options.rotate ?? 0;
  const w = textWidth(text, size);
  const shift = anchor === "start" ? 0 : anchor === "middle" ? w / 2 : w;
  const box: Box =
    rotate === 0
      ? { x: at.x - shift, y: at.y - ASCENT_EM * size, w, h: (ASCENT_EM + DESCENT_EM) * size }
      : { x: at.x - ASCENT_EM * size, y: at.y - w + shift, w: (ASCENT_EM + DESCENT_EM) * size, h: w };
  return { text, at, size, anchor, rotate, bold: options.bold ?? false, role, box };
}

/** True when two boxes share some area (touching edges do not count). */
export function boxesOverlap(p: Box, q: Box): boolean {
  const eps = 1e-9;
  return p.x < q.x + q.w - eps && q.x < p.x + p.w - eps && p.y < q.y + q.h - eps && q.y < p.y + p.h - eps;
}

/** The smallest box holding all the points. */
export function boundingBox(points: readonly Point[]): Box {
  const xs = points.map((p) => p.x);
  const ys = points.map((p) => p.y);
  const x = Math.min(...xs);
  const y = Math.min(...ys);
  return { x, y, w: Math.max(...xs) - x, h: Math.max(...ys) - y };
}

/**
 * Breaks a text into lines of at most `maxChars` characters at spaces; a word
 * longer than a line is cut.
 */
export function wrapText(text: string, maxChars: number): string[] {
  const limit = Math.max(1, Math.floor(maxChars));
  const lines: string[] = [];
  let line = "";
  for (const word of text.split(/\s+/).filter((w) => w.length > 0)) {
    let rest = word;
    while ([...rest].length > limit) {
      if (line) {
        lines.push(line);
        line = "";
      }
      lines.push([...rest].slice(0, limit).join(""));
      rest = [...rest].slice(limit).join("");
    }
    const candidate = line ? `${line} ${rest}` : rest;
    if ([...candidate].length <= limit) line = candidate;
    else {
      lines.push(line);
      line = rest;
    }
  }
  if (line) lines.push(line);
  return lines;
}

/** Shortens a text to at most `maxChars` characters, ending in "..." when cut. */
export function fitText(text: string, maxChars: number): string {
  const chars = [...text];
  const limit = Math.max(3, Math.floor(maxChars));
  return chars.length <= limit ? text : chars.slice(0, limit - 3).join("") + "...";
}
