/**
 * Schematic symbols for the driver-stage drawing, in millimetres, with no
 * DOM: resistors (IEC 60617 rectangle), an NPN transistor, an LED segment,
 * ground, supply terminals and junction dots. Each call adds its shapes to
 * an `Ink` and gives back the points its leads end at, so the stage layouts
 * (driverSchematic.ts) join symbols with plain wires.
 */
import { STROKE, label, type Circle, type Dot, type Label, type Point, type Polygon, type Segment } from "./drawingModel.ts";

/** Everything a schematic inks. */
export interface Ink {
  readonly segments: Segment[];
  readonly polygons: Polygon[];
  readonly circles: Circle[];
  readonly dots: Dot[];
  readonly labels: Label[];
}

export function emptyInk(): Ink {
  return { segments: [], polygons: [], circles: [], dots: [], labels: [] };
}

/** Size of a part's name beside its symbol, millimetres. */
export const PART_TEXT_MM = 2.5;
/** Length of a resistor body, millimetres. */
const R_LEN = 8;
/** Width of a resistor body, millimetres. */
const R_W = 3;

export function wire(ink: Ink, a: Point, b: Point, net?: string): void {
  ink.segments.push(net === undefined ? { a, b, width: STROKE.wire } : { a, b, width: STROKE.wire, net });
}

/** A rectangle as a closed outline of segments (the sheet's rects are frames; a body is a part of the wiring). */
function body(ink: Ink, x: number, y: number, w: number, h: number): void {
  const p = [
    { x, y },
    { x: x + w, y },
    { x: x + w, y: y + h },
    { x, y: y + h },
  ];
  ink.polygons.push({ points: p, filled: false, width: STROKE.wire });
}

/** A vertical resistor from `top` to `bottom` at `x`, its name to the right of the body. */
export function resistorV(ink: Ink, x: number, top: number, bottom: number, name: string): void {
  const mid = (top + bottom) / 2;
  wire(ink, { x, y: top }, { x, y: mid - R_LEN / 2 });
  body(ink, x - R_W / 2, mid - R_LEN / 2, R_W, R_LEN);
  wire(ink, { x, y: mid + R_LEN / 2 }, { x, y: bottom });
  ink.labels.push(label(name, { x: x + R_W / 2 + 1.2, y: mid + 0.9 }, PART_TEXT_MM, "part", { bold: true }));
}

/** A horizontal resistor from `left` to `right` at `y`, its name above the body. */
export function resistorH(ink: Ink, left: number, right: number, y: number, name: string): void {
  const mid = (left + right) / 2;
  wire(ink, { x: left, y }, { x: mid - R_LEN / 2, y });
  body(ink, mid - R_LEN / 2, y - R_W / 2, R_LEN, R_W);
  wire(ink, { x: mid + R_LEN / 2, y }, { x: right, y });
  ink.labels.push(label(name, { x: mid, y: y - R_W / 2 - 1.2 }, PART_TEXT_MM, "part", { anchor: "middle", bold: true }));
}

/**
 * An LED segment from `top` (anode) to `bottom` (cathode) at `x`: the diode
 * triangle pointing down onto its bar, two arrows for the light, and its
 * name with a second line (e.g. `3 LEDs`) to the right.
 */
export function ledV(ink: Ink, x: number, top: number, bottom: number, name: string, detail: string): void {
  const mid = (top + bottom) / 2;
  const half = 2.2;
  wire(ink, { x, y: top }, { x, y: mid - 2 });
  ink.polygons.push({
    points: [
      { x: x - half, y: mid - 2 },
      { x: x + half, y: mid - 2 },
      { x, y: mid + 2 },
    ],
    filled: true,
    width: STROKE.thin,
  });
  ink.segments.push({ a: { x: x - half, y: mid + 2 }, b: { x: x + half, y: mid + 2 }, width: STROKE.thick });
  wire(ink, { x, y: mid + 2 }, { x, y: bottom });
  for (const dy of [-1.4, 0.6]) {
    const a = { x: x + 2.4, y: mid + dy };
    const b = { x: x + 4.6, y: mid + dy - 2.2 };
    ink.segments.push({ a, b, width: STROKE.thin });
    ink.polygons.push({ points: arrowHead(a, b, 1.0), filled: true, width: STROKE.thin });
  }
  ink.labels.push(label(name, { x: x + 5.6, y: mid + 0.2 }, PART_TEXT_MM, "part", { bold: true }));
  ink.labels.push(label(detail, { x: x + 5.6, y: mid + 3.2 }, PART_TEXT_MM * 0.8, "part"));
}

/** A filled arrowhead at `b` pointing away from `a`. */
function arrowHead(a: Point, b: Point, len: number): Point[] {
  const d = Math.hypot(b.x - a.x, b.y - a.y);
  const ux = (b.x - a.x) / d;
  const uy = (b.y - a.y) / d;
  const w = len * 0.45;
  const back = { x: b.x - ux * len, y: b.y - uy * len };
  return [b, { x: back.x - uy * w, y: back.y + ux * w }, { x: back.x + uy * w, y: back.y - ux * w }];
}

/** Where an NPN's leads end. */
export interface NpnLeads {
  readonly base: Point;
  readonly collector: Point;
  readonly emitter: Point;
}

/**
 * An NPN transistor centred at `c`: the base from the left, the collector
 * up and the emitter (with its arrow pointing out) down, both at `c.x + 2`.
 */
export function npn(ink: Ink, c: Point, name: string): NpnLeads {
  ink.circles.push({ at: c, r: 4.6, filled: false });
  const bx = c.x - 1.8;
  const base = { x: c.x - 8, y: c.y };
  wire(ink, base, { x: bx, y: c.y });
  ink.segments.push({ a: { x: bx, y: c.y - 2.6 }, b: { x: bx, y: c.y + 2.6 }, width: STROKE.thick });
  const collector = { x: c.x + 2, y: c.y - 8 };
  const emitter = { x: c.x + 2, y: c.y + 8 };
  wire(ink, { x: bx, y: c.y - 1.2 }, { x: c.x + 2, y: c.y - 3.6 });
  wire(ink, { x: c.x + 2, y: c.y - 3.6 }, collector);
  const eEnd = { x: c.x + 2, y: c.y + 3.6 };
  wire(ink, { x: bx, y: c.y + 1.2 }, eEnd);
  ink.polygons.push({ points: arrowHead({ x: bx, y: c.y + 1.2 }, eEnd, 1.6), filled: true, width: STROKE.thin });
  wire(ink, eEnd, emitter);
  ink.labels.push(label(name, { x: c.x + 5.4, y: c.y + 0.9 }, PART_TEXT_MM, "part", { bold: true }));
  return { base, collector, emitter };
}

/** Where a PNP's leads end. */
export type PnpLeads = NpnLeads;

/**
 * A PNP transistor centred at `c`: the base from the left, the emitter up
 * (with its arrow pointing in, towards the base) and the collector down,
 * both at `c.x + 2`: drawn the way it hangs from a supply.
 */
export function pnp(ink: Ink, c: Point, name: string): PnpLeads {
  ink.circles.push({ at: c, r: 4.6, filled: false });
  const bx = c.x - 1.8;
  const base = { x: c.x - 8, y: c.y };
  wire(ink, base, { x: bx, y: c.y });
  ink.segments.push({ a: { x: bx, y: c.y - 2.6 }, b: { x: bx, y: c.y + 2.6 }, width: STROKE.thick });
  const emitter = { x: c.x + 2, y: c.y - 8 };
  const collector = { x: c.x + 2, y: c.y + 8 };
  const eEnd = { x: c.x + 2, y: c.y - 3.6 };
  wire(ink, { x: bx, y: c.y - 1.2 }, eEnd);
  ink.polygons.push({ points: arrowHead(eEnd, { x: bx, y: c.y - 1.2 }, 1.6), filled: true, width: STROKE.thin });
  wire(ink, eEnd, emitter);
  wire(ink, { x: bx, y: c.y + 1.2 }, { x: c.x + 2, y: c.y + 3.6 });
  wire(ink, { x: c.x + 2, y: c.y + 3.6 }, collector);
  ink.labels.push(label(name, { x: c.x + 5.4, y: c.y + 0.9 }, PART_TEXT_MM, "part", { bold: true }));
  return { base, collector, emitter };
}

/** The ground symbol hanging from `at`. */
export function ground(ink: Ink, at: Point): void {
  for (const [w, dy] of [
    [3, 0],
    [2, 1],
    [1, 2],
  ] as const) {
    ink.segments.push({ a: { x: at.x - w, y: at.y + dy }, b: { x: at.x + w, y: at.y + dy }, width: STROKE.wire });
  }
}

/** A terminal (open circle) with its net name beside it. */
export function terminal(ink: Ink, at: Point, text: string, side: "left" | "right" | "above"): void {
  ink.circles.push({ at, r: 0.8, filled: false });
  if (text === "") return;
  const l =
    side === "above"
      ? label(text, { x: at.x, y: at.y - 1.8 }, PART_TEXT_MM, "terminal", { anchor: "middle", bold: true })
      : side === "right"
        ? label(text, { x: at.x + 1.8, y: at.y + 0.9 }, PART_TEXT_MM, "terminal", { bold: true })
        : label(text, { x: at.x - 1.8, y: at.y + 0.9 }, PART_TEXT_MM, "terminal", { anchor: "end", bold: true });
  ink.labels.push(l);
}

export function junction(ink: Ink, at: Point, net: string): void {
  ink.dots.push({ at, r: 0.6, net });
}
