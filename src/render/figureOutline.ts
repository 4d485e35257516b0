/**
 * The outline of a custom cell's segment shape, in the figure's own
 * coordinates, for everything that draws a cell: a dot is a circle; a bar
 * is a hexagon with pointed ends, like a seven-segment bar; a polyline is
 * the closed outline of a stroke of its width, mitred at the bends, so that
 * one segment is one filled shape however it bends.
 */
import type { FigurePoint, SegmentShape } from "../core/project/project.ts";
import type { Point } from "./drawingModel.ts";

export type ShapeOutline =
  { readonly kind: "circle"; readonly centre: Point; readonly r: number } | { readonly kind: "polygon"; readonly points: readonly Point[] };

/** Longest mitre, in half-widths, before a sharp bend is cut square. */
const MITRE_LIMIT = 4;

/**
 * @example
 * shapeOutline({ kind: "bar", points: [[0, 5], [10, 5]], width: 2 });
 * // { kind: "polygon", points: [{x:0,y:5}, {x:1,y:4}, {x:9,y:4}, {x:10,y:5}, {x:9,y:6}, {x:1,y:6}] }
 */
export function shapeOutline(shape: SegmentShape): ShapeOutline {
  if (shape.kind === "dot") return { kind: "circle", centre: pt(shape.at), r: shape.r };
  if (shape.kind === "bar") return { kind: "polygon", points: barOutline(pt(shape.points[0]), pt(shape.points[1]), shape.width / 2) };
  return { kind: "polygon", points: strokeOutline(dedupe(shape.points.map(pt)), shape.width / 2) };
}

/** Where a segment's name goes: a dot's centre, a bar's middle, a polyline's middle point. */
export function shapeAnchor(shape: SegmentShape): Point {
  if (shape.kind === "dot") return pt(shape.at);
  const ps = shape.points.map(pt);
  if (shape.kind === "bar" || ps.length % 2 === 0) {
    const a = ps[ps.length / 2 - 1] ?? ps[0]!;
    const b = ps[ps.length / 2] ?? ps[0]!;
    return { x: (a.x + b.x) / 2, y: (a.y + b.y) / 2 };
  }
  return ps[(ps.length - 1) / 2]!;
}

/** The box every outline of a figure fits in, `{ x0, y0, x1, y1 }`. */
export function outlinesExtent(outlines: readonly ShapeOutline[]): { x0: number; y0: number; x1: number; y1: number } {
  const xs: number[] = [];
  const ys: number[] = [];
  for (const o of outlines) {
    if (o.kind === "circle") {
      xs.push(o.centre.x - o.r, o.centre.x + o.r);
      ys.push(o.centre.y - o.r, o.centre.y + o.r);
    } else {
      for (const p of o.points) {
        xs.push(p.x);
        ys.push(p.y);
      }
    }
  }
  return { x0: Math.min(...xs), y0: Math.min(...ys), x1: Math.max(...xs), y1: Math.max(...ys) };
}

const pt = (q: FigurePoint): Point => ({ x: q[0], y: q[1] });

function dedupe(ps: Point[]): Point[] {
  return ps.filter((p, i) => i === 0 || p.x !== ps[i - 1]!.x || p.y !== ps[i - 1]!.y);
}

function barOutline(a: Point, b: Point, h: number): Point[] {
  const len = Math.hypot(b.x - a.x, b.y - a.y);
  const u = { x: (b.x - a.x) / len, y: (b.y - a.y) / len };
  const n = { x: -u.y, y: u.x };
  // The points sit half a width in from each end, as on a seven-segment bar; a bar shorter than its width gets square ends.
  const k = Math.min(h, len / 2);
  const at = (p: Point, along: number, across: number): Point => ({
    x: p.x + u.x * along + n.x * across,
    y: p.y + u.y * along + n.y * across,
  });
  return [a, at(a, k, -h), at(b, -k, -h), b, at(b, -k, h), at(a, k, h)];
}

function strokeOutline(ps: Point[], h: number): Point[] {
  const normals = ps.slice(1).map((p, i) => {
    const q = ps[i]!;
    const len = Math.hypot(p.x - q.x, p.y - q.y);
    return { x: -(p.y - q.y) / len, y: (p.x - q.x) / len };
  });
  const side = (sign: 1 | -1): Point[] => {
    const out: Point[] = [];
    ps.forEach((p, i) => {
      const before = normals[i - 1];
      const after = normals[i];
      if (!before || !after) {
        const nn = (before ?? after)!;
        out.push({ x: p.x + sign * h * nn.x, y: p.y + sign * h * nn.y });
        return;
      }
      // The mitre: along the bisector of the two normals, long enough to meet both offset lines.
      const bx = before.x + after.x;
      const by = before.y + after.y;
      const blen = Math.hypot(bx, by);
      const cos = blen / 2;
      if (blen < 1e-9 || 1 / cos > MITRE_LIMIT) {
        out.push(
          { x: p.x + sign * h * before.x, y: p.y + sign * h * before.y },
          { x: p.x + sign * h * after.x, y: p.y + sign * h * after.y },
        );
        return;
      }
      const m = h / cos;
      out.push({ x: p.x + (sign * m * bx) / blen, y: p.y + (sign * m * by) / blen });
    });
    return out;
  };
  return [...side(1), ...side(-1).reverse()];
}
