/**
 * The small drawn key above each display position's columns: a seven-segment
 * figure with its segment names (a top, b to f clockwise, g middle, dp the
 * point), or, for a custom cell, its segment names in a framed grid.
 */
import type { Cell } from "../core/project/project.ts";
import {
  STROKE,
  boundingBox,
  label,
  textWidth,
  type Box,
  type Circle,
  type Label,
  type Point,
  type Polygon,
  type Rect,
  type Segment,
} from "./drawingModel.ts";

export interface GlyphKey {
  readonly segments: Segment[];
  readonly polygons: Polygon[];
  readonly rects: Rect[];
  readonly circles: Circle[];
  readonly labels: Label[];
  /** Everything the key inks, millimetres. */
  readonly box: Box;
}

/** Height of a key, millimetres, for a cell drawn in a given width at a scale. */
export function glyphKeyHeight(cell: Cell, widthMm: number, scale = 1): number {
  return scale * (cell.kind === "custom" ? customLayout(cell, widthMm / scale).height : SEG7_KEY_H);
}

const SEG7_KEY_H = 14;
const NAME_SIZE = 1.8;

/** Where a key goes, millimetres. */
export interface KeyPlace {
  /** Centre of the key, across. */
  readonly cx: number;
  /** Top of the key. */
  readonly top: number;
  /** The width the key may use (the group's columns). */
  readonly widthMm: number;
  /** Size relative to the plain key (the drawing's scale); 1 when left out. */
  readonly scale?: number;
}

/**
 * Draws the key of a cell at a place.
 *
 * @example
 * glyphKey(spec.cell, { cx: 60, top: 21.5, widthMm: 70, scale: 1.25 }).box;
 */
export function glyphKey(cell: Cell, place: KeyPlace): GlyphKey {
  const { cx, top, widthMm, scale = 1 } = place;
  const plain = cell.kind === "custom" ? customKey(cell, 0, 0, widthMm / scale) : seg7Key(cell.kind === "seg7dp", 0, 0);
  const k = scaled(plain, cx, top, scale);
  const corners = [
    ...k.segments.flatMap((s) => [s.a, s.b]),
    ...k.rects.flatMap((r) => [
      { x: r.box.x, y: r.box.y },
      { x: r.box.x + r.box.w, y: r.box.y + r.box.h },
    ]),
    ...k.circles.flatMap((c) => [
      { x: c.at.x - c.r, y: c.at.y - c.r },
      { x: c.at.x + c.r, y: c.at.y + c.r },
    ]),
    ...k.labels.flatMap((l) => [
      { x: l.box.x, y: l.box.y },
      { x: l.box.x + l.box.w, y: l.box.y + l.box.h },
    ]),
  ];
  return { ...k, box: boundingBox(corners) };
}

/** Moves a key drawn at the origin to (cx, top) and scales it about that point. */
function scaled(k: Omit<GlyphKey, "box">, cx: number, top: number, scale: number): Omit<GlyphKey, "box"> {
  const at = (p: Point): Point => ({ x: cx + p.x * scale, y: top + p.y * scale });
  return {
    segments: k.segments.map((s) => ({ ...s, a: at(s.a), b: at(s.b), width: s.width * scale })),
    polygons: k.polygons.map((p) => ({ ...p, points: p.points.map(at), width: p.width * scale })),
    rects: k.rects.map((r) => {
      const corner = at({ x: r.box.x, y: r.box.y });
      return { ...r, box: { x: corner.x, y: corner.y, w: r.box.w * scale, h: r.box.h * scale } };
    }),
    circles: k.circles.map((c) => ({ ...c, at: at(c.at), r: c.r * scale })),
    labels: k.labels.map((l) => label(l.text, at(l.at), l.size * scale, l.role, { anchor: l.anchor, rotate: l.rotate, bold: l.bold })),
  };
}

function seg7Key(dp: boolean, cx: number, top: number): Omit<GlyphKey, "box"> {
  const w = 4;
  const h = 8;
  const x0 = cx - w / 2;
  const y0 = top + 3;
  const xm = x0 + w;
  const ym = y0 + h / 2;
  const yb = y0 + h;
  const bar = (ax: number, ay: number, bx: number, by: number): Segment => ({ a: { x: ax, y: ay }, b: { x: bx, y: by }, width: 0.6 });
  const g = 0.45; // gap at the corners, so each segment reads as its own bar
  const segments: Segment[] = [
    bar(x0 + g, y0, xm - g, y0), // a
    bar(xm, y0 + g, xm, ym - g), // b
    bar(xm, ym + g, xm, yb - g), // c
    bar(x0 + g, yb, xm - g, yb), // d
    bar(x0, ym + g, x0, yb - g), // e
    bar(x0, y0 + g, x0, ym - g), // f
    bar(x0 + g, ym, xm - g, ym), // g
  ];
  const s = NAME_SIZE;
  const labels: Label[] = [
    label("a", { x: cx, y: y0 - 0.7 }, s, "key", { anchor: "middle" }),
    label("b", { x: xm + 0.8, y: y0 + h / 4 + 0.7 }, s, "key"),
    label("c", { x: xm + 0.8, y: ym + h / 4 + 0.7 }, s, "key"),
    label("d", { x: cx, y: yb + 2.3 }, s, "key", { anchor: "middle" }),
    label("e", { x: x0 - 0.8, y: ym + h / 4 + 0.7 }, s, "key", { anchor: "end" }),
    label("f", { x: x0 - 0.8, y: y0 + h / 4 + 0.7 }, s, "key", { anchor: "end" }),
    label("g", { x: cx, y: ym - 0.7 }, s, "key", { anchor: "middle" }),
  ];
  const circles: Circle[] = [];
  if (dp) {
    circles.push({ at: { x: xm + 1.2, y: yb }, r: 0.4, filled: true });
    labels.push(label("dp", { x: xm + 0.8, y: yb + 2.3 }, s, "key"));
  }
  return { segments, polygons: [], rects: [], circles, labels };
}

function customLayout(cell: Cell, widthMm: number): { perRow: number; cellW: number; height: number } {
  const longest = Math.max(1, ...cell.segments.map((n) => [...n].length));
  const cellW = textWidth("x".repeat(longest), NAME_SIZE) + 2.2;
  const perRow = Math.max(1, Math.min(cell.segments.length, Math.floor((widthMm - 1) / cellW), 4));
  const rows = Math.ceil(cell.segments.length / perRow);
  return { perRow, cellW, height: rows * 2.8 + 2 };
}

/** A custom cell has no fixed shape: a framed grid of pips with names stands for it. */
function customKey(cell: Cell, cx: number, top: number, widthMm: number): Omit<GlyphKey, "box"> {
  const { perRow, cellW, height } = customLayout(cell, widthMm);
  const frameW = perRow * cellW + 0.8;
  const x0 = cx - frameW / 2;
  const labels: Label[] = [];
  const circles: Circle[] = [];
  cell.segments.forEach((name, i) => {
    const col = i % perRow;
    const row = Math.floor(i / perRow);
    const x = x0 + 0.4 + col * cellW;
    const baseline = top + 1 + row * 2.8 + 1.6;
    circles.push({ at: { x: x + 0.7, y: baseline - 0.6 }, r: 0.45, filled: true });
    labels.push(label(name, { x: x + 1.5, y: baseline }, NAME_SIZE, "key"));
  });
  return { segments: [], polygons: [], rects: [{ box: { x: x0, y: top, w: frameW, h: height }, width: STROKE.thin }], circles, labels };
}
