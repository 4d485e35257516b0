/**
 * The small drawn key above each display position's columns: a seven-segment
 * figure with its segment names (a top, b to f clockwise, g middle, dp the
 * point); for a custom cell, its own figure (render/figureOutline.ts) with
 * each segment's name beside its shape, or, when it gives no figure (or its
 * names cannot be set apart at any size a key may take), its segment names
 * in a framed grid.
 */
import type { Cell, CellFigure } from "../core/project/project.ts";
import { shapeAnchor, shapeOutline } from "./figureOutline.ts";
import {
  STROKE,
  boxesOverlap,
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
  if (cell.kind !== "custom") return scale * SEG7_KEY_H;
  const f = cell.figure ? figureKey(cell.figure, cell.segments) : null;
  return scale * (f ? f.height : customLayout(cell, widthMm / scale).height);
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
  const f = cell.kind === "custom" && cell.figure ? figureKey(cell.figure, cell.segments) : null;
  const plain = f ? f.key : cell.kind === "custom" ? customKey(cell, 0, 0, widthMm / scale) : seg7Key(cell.kind === "seg7dp", 0, 0);
  const k = scaled(plain, cx, top, scale);
  const corners = [
    ...k.segments.flatMap((s) => [s.a, s.b]),
    ...k.polygons.flatMap((p) => p.points),
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

/** Height of a figure key's drawing before any name is set, millimetres; it grows until the names stand apart. */
const FIGURE_KEY_H = 10;
/** The tallest a figure key may grow, millimetres. */
const FIGURE_KEY_MAX_H = 40;

/**
 * A custom cell's figure as a key: each shape outlined, its name beside it.
 * Each name takes the first of a few places around its shape (inside a pip
 * big enough to hold it, else beside it; off a bar's or polyline's middle, away from the
 * figure's centre, then to either side, then inward) where it touches no
 * other name and no shape but its own pip. The figure is drawn as small as
 * lets every name find such a place; null when no size up to the largest a
 * key may take does (the caller then draws the framed grid of names).
 */
function figureKey(figure: CellFigure, segments: readonly string[]): { key: Omit<GlyphKey, "box">; height: number } | null {
  // A name inside its pip reads best: first every size with the names of pips inside them, then names beside.
  for (const pipsInside of [true, false]) {
    for (let h = FIGURE_KEY_H; h <= FIGURE_KEY_MAX_H + 1e-9; h *= 1.1) {
      const key = figureKeyAt(figure, segments, h / figure.height, pipsInside);
      if (key) return key;
    }
  }
  return null;
}

type Drawn = { readonly name: string; readonly circle?: Circle; readonly polygon?: Polygon };

function figureKeyAt(
  figure: CellFigure,
  segments: readonly string[],
  k: number,
  pipsInside: boolean,
): { key: Omit<GlyphKey, "box">; height: number } | null {
  const s = NAME_SIZE;
  const x0 = (-figure.width * k) / 2;
  const at = (p: Point): Point => ({ x: x0 + p.x * k, y: p.y * k });
  const centre = at({ x: figure.width / 2, y: figure.height / 2 });
  const drawn: Drawn[] = [];
  for (const name of segments) {
    const shape = figure.shapes[name];
    if (!shape) continue;
    const o = shapeOutline(shape);
    drawn.push(
      o.kind === "circle"
        ? { name, circle: { at: at(o.centre), r: o.r * k, filled: false } }
        : { name, polygon: { points: o.points.map(at), filled: false, width: STROKE.thin } },
    );
  }
  const labels: Label[] = [];
  for (const d of drawn) {
    const shape = figure.shapes[d.name]!;
    const w = textWidth(d.name, s);
    const places: Label[] = [];
    const centred = (p: Point): Label => label(d.name, { x: p.x, y: p.y + 0.35 * s }, s, "key", { anchor: "middle" });
    if (d.circle) {
      const { at: c, r } = d.circle;
      if (2 * r >= w + 0.4 && 2 * r >= 1.1 * s) places.push(centred(c));
      const gapX = r + 0.3 + w / 2;
      const gapY = r + 0.3 + 0.55 * s;
      if (!pipsInside)
        places.push(
          centred({ x: c.x + gapX, y: c.y }),
          centred({ x: c.x - gapX, y: c.y }),
          centred({ x: c.x, y: c.y - gapY }),
          centred({ x: c.x, y: c.y + gapY }),
        );
    } else {
      const a = at(shapeAnchor(shape));
      const len = Math.hypot(a.x - centre.x, a.y - centre.y);
      const u = len < 1e-9 ? { x: 0, y: -1 } : { x: (a.x - centre.x) / len, y: (a.y - centre.y) / len };
      const half = shape.kind === "dot" ? 0 : (shape.width * k) / 2;
      for (const dir of [u, { x: -u.y, y: u.x }, { x: u.y, y: -u.x }, { x: -u.x, y: -u.y }]) {
        // Far enough along the direction that the name's box clears a straight stroke; further for a pointed bend.
        const reach = half + 0.3 + Math.abs(dir.x) * (w / 2) + Math.abs(dir.y) * 0.55 * s;
        for (const more of [0, half, 2 * half]) places.push(centred({ x: a.x + dir.x * (reach + more), y: a.y + dir.y * (reach + more) }));
      }
    }
    const place = places.find(
      (l) =>
        labels.every((m) => !boxesOverlap(l.box, m.box)) &&
        drawn.every((e) =>
          e === d && e.circle ? true : e.circle ? !boxesOverlap(l.box, circleBox(e.circle)) : !boxHitsPolygon(l.box, e.polygon!.points),
        ),
    );
    if (!place) return null;
    labels.push(place);
  }
  const circles = drawn.flatMap((d) => (d.circle ? [d.circle] : []));
  const polygons = drawn.flatMap((d) => (d.polygon ? [d.polygon] : []));
  const ys = [
    ...labels.flatMap((l) => [l.box.y, l.box.y + l.box.h]),
    ...circles.flatMap((c) => [c.at.y - c.r, c.at.y + c.r]),
    ...polygons.flatMap((p) => p.points.map((q) => q.y)),
  ];
  const shift = 1 - Math.min(...ys);
  const moved = (p: Point): Point => ({ x: p.x, y: p.y + shift });
  return {
    key: {
      segments: [],
      polygons: polygons.map((p) => ({ ...p, points: p.points.map(moved) })),
      rects: [],
      circles: circles.map((c) => ({ ...c, at: moved(c.at) })),
      labels: labels.map((l) => label(l.text, moved(l.at), l.size, l.role, { anchor: l.anchor })),
    },
    height: Math.max(...ys) + shift + 0.5,
  };
}

function circleBox(c: Circle): Box {
  return { x: c.at.x - c.r, y: c.at.y - c.r, w: 2 * c.r, h: 2 * c.r };
}

/** True when a box and a closed polygon share some area: an edge crosses the box, or one holds the other. */
function boxHitsPolygon(box: Box, pts: readonly Point[]): boolean {
  const inBox = (p: Point) => p.x > box.x && p.x < box.x + box.w && p.y > box.y && p.y < box.y + box.h;
  if (pts.some(inBox)) return true;
  const corners: Point[] = [
    { x: box.x, y: box.y },
    { x: box.x + box.w, y: box.y },
    { x: box.x + box.w, y: box.y + box.h },
    { x: box.x, y: box.y + box.h },
  ];
  if (corners.some((c) => insidePolygon(c, pts))) return true;
  return pts.some((p, i) => {
    const q = pts[(i + 1) % pts.length]!;
    return corners.some((c, j) => segmentsCross(p, q, c, corners[(j + 1) % 4]!));
  });
}

function insidePolygon(p: Point, pts: readonly Point[]): boolean {
  let inside = false;
  for (let i = 0, j = pts.length - 1; i < pts.length; j = i++) {
    const a = pts[i]!;
    const b = pts[j]!;
    if (a.y > p.y !== b.y > p.y && p.x < ((b.x - a.x) * (p.y - a.y)) / (b.y - a.y) + a.x) inside = !inside;
  }
  return inside;
}

function segmentsCross(a: Point, b: Point, c: Point, d: Point): boolean {
  const cross = (o: Point, p: Point, q: Point) => (p.x - o.x) * (q.y - o.y) - (p.y - o.y) * (q.x - o.x);
  const d1 = cross(c, d, a);
  const d2 = cross(c, d, b);
  const d3 = cross(a, b, c);
  const d4 = cross(a, b, d);
  return d1 * d2 < 0 && d3 * d4 < 0;
}
