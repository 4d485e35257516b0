/**
 * Junction dots: they are not chosen but found, wherever three or more wire
 * ends of one net meet. Lines of different nets only ever cross, never
 * touch, so a crossing without a dot is never a joint.
 */
import type { DiodeSymbol, Dot, Point } from "./drawingModel.ts";

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
