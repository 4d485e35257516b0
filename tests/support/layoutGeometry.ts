/**
 * Geometry checks on laid-out sheets, written independently of the layout's
 * own junction finder so that the tests can catch it out.
 */
import type { Box, Point, Sheet } from "../../src/render/drawingModel.ts";

export interface Piece {
  readonly net: string;
  readonly a: Point;
  readonly b: Point;
}

const EPS = 1e-6;

/** Wires (segments with a net) and diode leads of a sheet, each with its net. */
export function pieces(sheet: Sheet): Piece[] {
  const out: Piece[] = sheet.segments.filter((s) => s.net !== undefined).map((s) => ({ net: s.net as string, a: s.a, b: s.b }));
  for (const d of sheet.diodes) {
    const [b0, b1] = d.triangle;
    out.push({ net: d.from, a: d.anode, b: { x: (b0.x + b1.x) / 2, y: (b0.y + b1.y) / 2 } });
    out.push({ net: d.to, a: { x: (d.bar[0].x + d.bar[1].x) / 2, y: (d.bar[0].y + d.bar[1].y) / 2 }, b: d.cathode });
  }
  return out;
}

export function samePoint(p: Point, q: Point): boolean {
  return Math.abs(p.x - q.x) < EPS && Math.abs(p.y - q.y) < EPS;
}

/** 0: not on it; 1: at an end; 2: strictly inside. */
export function touches(p: Point, s: { a: Point; b: Point }): 0 | 1 | 2 {
  if (samePoint(p, s.a) || samePoint(p, s.b)) return 1;
  const len = Math.hypot(s.b.x - s.a.x, s.b.y - s.a.y);
  const cross = (s.b.x - s.a.x) * (p.y - s.a.y) - (s.b.y - s.a.y) * (p.x - s.a.x);
  if (Math.abs(cross) / len > EPS) return 0;
  const t = ((p.x - s.a.x) * (s.b.x - s.a.x) + (p.y - s.a.y) * (s.b.y - s.a.y)) / (len * len);
  return t > 0 && t < 1 ? 2 : 0;
}

/** Number of wire arms of a net that meet at a point. */
export function arms(p: Point, net: string, all: readonly Piece[]): number {
  return all.filter((q) => q.net === net).reduce((n, q) => n + touches(p, q), 0);
}

export function overlap(p: Box, q: Box): boolean {
  return p.x < q.x + q.w - EPS && q.x < p.x + p.w - EPS && p.y < q.y + q.h - EPS && q.y < p.y + p.h - EPS;
}

export function dotBox(at: Point, r: number): Box {
  return { x: at.x - r, y: at.y - r, w: 2 * r, h: 2 * r };
}

/** Every problem found with the text boxes of a sheet, as sentences. */
export function textProblems(sheet: Sheet): string[] {
  const problems: string[] = [];
  const labels = sheet.labels;
  for (let i = 0; i < labels.length; i++) {
    const l = labels[i]!;
    if (l.box.x < 0 || l.box.y < 0 || l.box.x + l.box.w > sheet.widthMm || l.box.y + l.box.h > sheet.heightMm) {
      problems.push(`"${l.text}" runs off the paper`);
    }
    for (let j = i + 1; j < labels.length; j++) {
      const m = labels[j]!;
      if (overlap(l.box, m.box)) problems.push(`"${l.text}" (${l.role}) overlaps "${m.text}" (${m.role}) on sheet ${sheet.number}`);
    }
    for (const d of sheet.diodes) if (overlap(l.box, d.box)) problems.push(`"${l.text}" sits on the symbol of ${d.ref}`);
    for (const dot of sheet.dots)
      if (overlap(l.box, dotBox(dot.at, dot.r))) problems.push(`"${l.text}" sits on a junction dot of ${dot.net}`);
  }
  for (let i = 0; i < sheet.diodes.length; i++) {
    for (let j = i + 1; j < sheet.diodes.length; j++) {
      if (overlap(sheet.diodes[i]!.box, sheet.diodes[j]!.box))
        problems.push(`symbols ${sheet.diodes[i]!.ref} and ${sheet.diodes[j]!.ref} overlap`);
    }
  }
  return problems;
}

/** Wires shorter than 1 mm: a stub left by a cut at a sheet edge, or a line that ends where it starts. */
export function stubProblems(sheet: Sheet): string[] {
  return sheet.segments
    .filter((s) => s.net !== undefined && Math.hypot(s.b.x - s.a.x, s.b.y - s.a.y) < 1)
    .map((s) => `a ${Math.hypot(s.b.x - s.a.x, s.b.y - s.a.y).toFixed(2)} mm stub of ${s.net} on sheet ${sheet.number}`);
}
