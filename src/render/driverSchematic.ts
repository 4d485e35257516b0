/**
 * The driver stage of one kind, drawn once: from the output line the matrix
 * drives (and its pull-down) to the segment and its supply, with the
 * tie-on resistor from the logic supply that a tied-on output takes instead
 * of the matrix. The parts carry the names of the driver sheet's table
 * columns (`STAGE_PART_NAMES`); the table gives each output's references
 * and values. Pure layout in millimetres, at scale 1 with the top-left
 * corner at (0, 0); the sheet moves and scales it.
 */
import type { DriverKind } from "../core/project/project.ts";
import { label, type Box, type Label } from "./drawingModel.ts";
import { emptyInk, ground, junction, ledV, npn, pnp, resistorH, resistorV, terminal, wire, type Ink } from "./schematicSymbols.ts";

/** The parts a stage may have, by the name the drawing and the table give them (`Rpu`: a high-side switch's line pull-up). */
export type StagePart = "Q" | "Re" | "Rc" | "Rs" | "Rb" | "Rbe" | "Rpd" | "Rpu" | "Rt" | "DS";

/** What the table calls each part, in its column order. */
export const STAGE_PART_NAMES: readonly StagePart[] = ["Q", "Re", "Rs", "Rc", "Rb", "Rbe", "Rpd", "Rpu", "Rt", "DS"];

/** Which optional parts the drawn stage shows (those some output of the build has). */
export interface StageShape {
  readonly kind: DriverKind;
  /** A base resistor (switch, follower). */
  readonly base: boolean;
  /** A base-emitter resistor (switch). */
  readonly baseEmitter: boolean;
  /** A collector resistor under the segment (sink). */
  readonly collector: boolean;
  /** Some output is tied on: draw the tie-on resistor from the logic supply. */
  readonly tieOn: boolean;
  /** LEDs in series in one segment. */
  readonly leds: number;
  /** Supply texts, e.g. `+VSUP 5 V`, `VLOGIC 5 V`. */
  readonly supplyText: string;
  readonly logicText: string;
}

export interface StageSchematic {
  readonly ink: Ink;
  /** Everything it inks, labels included, millimetres at scale 1. */
  readonly box: Box;
}

const RAIL_Y = 8;
const LINE_Y = 52;
const GROUND_Y = 84;
const X_NODE = 26;
const Q_X = 62;

/**
 * Lays out the stage of a kind.
 *
 * @example
 * const s = stageSchematic({ kind: "low-side-switch", base: true, baseEmitter: true, collector: false, tieOn: false, leds: 1, supplyText: "+VSUP 5 V", logicText: "VLOGIC 5 V" });
 * s.ink.labels.map((l) => l.text); // [..., "Rb", "Rbe", "Q", "Rs", "DS", ...]
 */
export function stageSchematic(shape: StageShape): StageSchematic {
  const ink = emptyInk();
  const ledText = shape.leds === 1 ? "1 LED" : `${shape.leds} LEDs in series`;
  const x = { x: X_NODE, y: LINE_Y };
  // The output line from the matrix, its pull-down, and a tied-on output's tie-on resistor.
  terminal(ink, { x: 4, y: LINE_Y }, "", "left");
  wire(ink, { x: 4.8, y: LINE_Y }, x, "X");
  ink.labels.push(labelAt("output line X", 5.5, LINE_Y - 1.6));
  ink.labels.push(labelAt("(matrix column)", 5.5, LINE_Y + 4.0));
  if (shape.kind === "high-side-switch") {
    // A high-side switch's line: pulled up to the supply, held down by a tied-on output's Rt.
    resistorV(ink, X_NODE, RAIL_Y + 4, LINE_Y, "Rpu");
    if (shape.tieOn) {
      resistorV(ink, X_NODE, LINE_Y, GROUND_Y, "Rt");
      ground(ink, { x: X_NODE, y: GROUND_Y });
      ink.labels.push(labelAt("tied-on outputs only", X_NODE + 3, GROUND_Y - 4));
    }
  } else {
    resistorV(ink, X_NODE, LINE_Y, GROUND_Y, "Rpd");
    ground(ink, { x: X_NODE, y: GROUND_Y });
  }
  if (shape.tieOn && shape.kind !== "high-side-switch") {
    resistorV(ink, X_NODE, RAIL_Y + 14, LINE_Y, "Rt");
    terminal(ink, { x: X_NODE, y: RAIL_Y + 13.2 }, shape.logicText, "above");
    ink.labels.push(labelAt("tied-on outputs only", X_NODE + 3, RAIL_Y + 18.5));
  }
  junction(ink, x, "X");

  const supply = (at: number) => {
    wire(ink, { x: at, y: RAIL_Y + 0.8 }, { x: at, y: RAIL_Y + 4 });
    terminal(ink, { x: at, y: RAIL_Y }, shape.supplyText, "above");
  };
  const led = (top: number, bottom: number) => ledV(ink, Q_X + 2, top, bottom, "DS", ledText);

  switch (shape.kind) {
    case "current-sink": {
      wire(ink, x, { x: Q_X - 8, y: LINE_Y });
      const q = npn(ink, { x: Q_X, y: LINE_Y }, "Q");
      supply(q.collector.x);
      if (shape.collector) {
        led(RAIL_Y + 4, 28);
        resistorV(ink, q.collector.x, 28, q.collector.y, "Rc");
      } else led(RAIL_Y + 4, q.collector.y);
      resistorV(ink, q.emitter.x, q.emitter.y, GROUND_Y, "Re");
      ground(ink, { x: q.emitter.x, y: GROUND_Y });
      break;
    }
    case "low-side-switch": {
      const b = { x: 46, y: LINE_Y };
      if (shape.base) resistorH(ink, X_NODE, b.x, LINE_Y, "Rb");
      else wire(ink, x, b);
      wire(ink, b, { x: Q_X - 8, y: LINE_Y });
      if (shape.baseEmitter) {
        junction(ink, b, "B");
        resistorV(ink, b.x, LINE_Y, GROUND_Y, "Rbe");
        ground(ink, { x: b.x, y: GROUND_Y });
      }
      const q = npn(ink, { x: Q_X, y: LINE_Y }, "Q");
      supply(q.collector.x);
      led(RAIL_Y + 4, 28);
      resistorV(ink, q.collector.x, 28, q.collector.y, "Rs");
      wire(ink, q.emitter, { x: q.emitter.x, y: GROUND_Y });
      ground(ink, { x: q.emitter.x, y: GROUND_Y });
      break;
    }
    case "emitter-follower": {
      if (shape.base) resistorH(ink, X_NODE, 46, LINE_Y, "Rb");
      else wire(ink, x, { x: 46, y: LINE_Y });
      wire(ink, { x: 46, y: LINE_Y }, { x: Q_X - 8, y: LINE_Y });
      const q = npn(ink, { x: Q_X, y: LINE_Y }, "Q");
      supply(q.collector.x);
      wire(ink, { x: q.collector.x, y: RAIL_Y + 4 }, q.collector);
      resistorV(ink, q.emitter.x, q.emitter.y, 70, "Rs");
      led(70, GROUND_Y);
      ground(ink, { x: q.emitter.x, y: GROUND_Y });
      break;
    }
    case "high-side-switch": {
      // The supply rail along the top: the line's pull-up, Rbe and the emitter hang from it.
      const b = { x: 46, y: LINE_Y };
      if (shape.base) resistorH(ink, X_NODE, b.x, LINE_Y, "Rb");
      else wire(ink, x, b);
      wire(ink, b, { x: Q_X - 8, y: LINE_Y });
      const q = pnp(ink, { x: Q_X, y: LINE_Y }, "Q");
      const rail = RAIL_Y + 4;
      wire(ink, { x: X_NODE, y: rail }, { x: q.emitter.x, y: rail });
      junction(ink, { x: X_NODE, y: rail }, "VSUP");
      if (shape.baseEmitter) {
        junction(ink, b, "B");
        resistorV(ink, b.x, rail, LINE_Y, "Rbe");
        junction(ink, { x: b.x, y: rail }, "VSUP");
      }
      supply(q.emitter.x);
      wire(ink, { x: q.emitter.x, y: rail }, q.emitter);
      resistorV(ink, q.collector.x, q.collector.y, 70, "Rs");
      led(70, GROUND_Y);
      ground(ink, { x: q.collector.x, y: GROUND_Y });
      break;
    }
    case "direct": {
      const a = Q_X + 2;
      resistorH(ink, X_NODE, 50, LINE_Y, "Rs");
      wire(ink, { x: 50, y: LINE_Y }, { x: a, y: LINE_Y });
      led(LINE_Y, 74);
      wire(ink, { x: a, y: 74 }, { x: a, y: GROUND_Y });
      ground(ink, { x: a, y: GROUND_Y });
      break;
    }
  }
  return { ink, box: inkBox(ink) };
}

/** A plain explanatory text beside the stage. */
function labelAt(text: string, x: number, y: number): Label {
  return label(text, { x, y }, 2.2, "part");
}

/** The box around every shape and text of an ink, millimetres. */
export function inkBox(ink: Ink): Box {
  const xs: number[] = [];
  const ys: number[] = [];
  const add = (b: Box) => {
    xs.push(b.x, b.x + b.w);
    ys.push(b.y, b.y + b.h);
  };
  for (const s of ink.segments)
    add({ x: Math.min(s.a.x, s.b.x), y: Math.min(s.a.y, s.b.y), w: Math.abs(s.b.x - s.a.x), h: Math.abs(s.b.y - s.a.y) });
  for (const p of ink.polygons) for (const q of p.points) add({ x: q.x, y: q.y, w: 0, h: 0 });
  for (const c of ink.circles) add({ x: c.at.x - c.r, y: c.at.y - c.r, w: 2 * c.r, h: 2 * c.r });
  for (const l of ink.labels) add(l.box);
  const x = Math.min(...xs);
  const y = Math.min(...ys);
  return { x, y, w: Math.max(...xs) - x, h: Math.max(...ys) - y };
}
