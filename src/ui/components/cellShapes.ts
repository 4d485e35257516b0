/**
 * Geometry of a drawn display cell for the glyph editor and the previews:
 * one shape per segment, in a box 100 units high.
 *
 * Seven-segment cells get the usual bars (a top, b-f clockwise, g middle,
 * dp a dot at the lower right), 60 wide. A custom cell with a figure is
 * drawn as its figure says (dots, bars and polylines, render/figureOutline.ts),
 * scaled to the same height; one without a figure has no known arrangement,
 * so its segments sit on a grid of round pads, each labelled with its name.
 */
import type { CellFigure, CellKind } from "../../core/project/project.ts";
import { shapeAnchor, shapeOutline } from "../../render/figureOutline.ts";

export const CELL_WIDTH = 60;
export const CELL_HEIGHT = 100;

/** Where a segment's name goes, and whether it sits on the shape itself (then it is drawn light on a lit shape). */
interface NamePlace {
  readonly labelX: number;
  readonly labelY: number;
  readonly labelInside?: boolean;
}

export type DrawnSegment =
  | ({ readonly segment: string; readonly kind: "polygon"; readonly points: string } & NamePlace)
  | ({ readonly segment: string; readonly kind: "circle"; readonly cx: number; readonly cy: number; readonly r: number } & NamePlace);

/** A cell as drawn: its box and its segments' shapes, in the cell's segment order. */
export interface CellDrawing {
  readonly width: number;
  readonly height: number;
  readonly shapes: readonly DrawnSegment[];
}

/** What the drawing needs to know of a cell. */
export interface CellLook {
  readonly kind: CellKind;
  readonly segments: readonly string[];
  readonly figure?: CellFigure | undefined;
}

const T = 8; // bar thickness

function bar(segment: string, x1: number, y1: number, x2: number, y2: number, lx: number, ly: number): DrawnSegment {
  const h = T / 2;
  const pts =
    y1 === y2
      ? [
          [x1, y1],
          [x1 + h, y1 - h],
          [x2 - h, y1 - h],
          [x2, y1],
          [x2 - h, y1 + h],
          [x1 + h, y1 + h],
        ]
      : [
          [x1, y1],
          [x1 + h, y1 + h],
          [x1 + h, y2 - h],
          [x1, y2],
          [x1 - h, y2 - h],
          [x1 - h, y1 + h],
        ];
  return { segment, kind: "polygon", points: pts.map(([x, y]) => `${x},${y}`).join(" "), labelX: lx, labelY: ly };
}

const SEG7: readonly DrawnSegment[] = [
  bar("a", 12, 10, 48, 10, 30, 4),
  bar("b", 50, 12, 50, 48, 57, 30),
  bar("c", 50, 52, 50, 88, 57, 70),
  bar("d", 12, 90, 48, 90, 30, 99),
  bar("e", 10, 52, 10, 88, 3, 70),
  bar("f", 10, 12, 10, 48, 3, 30),
  bar("g", 12, 50, 48, 50, 30, 44),
];

const r2 = (x: number): number => Math.round(x * 100) / 100;

/**
 * The drawing of a cell.
 *
 * @example
 * cellShapes({ kind: "seg7", segments: [] }).shapes.map((s) => s.segment); // ["a", "b", ..., "g"]
 */
export function cellShapes(cell: CellLook): CellDrawing {
  const { kind, segments, figure } = cell;
  if (kind !== "custom") {
    const shapes = [...SEG7];
    if (kind === "seg7dp") shapes.push({ segment: "dp", kind: "circle", cx: 56, cy: 94, r: 3.5, labelX: 56, labelY: 84 });
    return { width: CELL_WIDTH, height: CELL_HEIGHT, shapes };
  }
  if (figure) return figureShapes(figure, segments);
  const cols = Math.max(1, Math.ceil(Math.sqrt(segments.length)));
  const rows = Math.max(1, Math.ceil(segments.length / cols));
  const dx = CELL_WIDTH / cols;
  const dy = CELL_HEIGHT / rows;
  const r = Math.min(dx, dy) * 0.28;
  const shapes = segments.map((segment, i): DrawnSegment => {
    const cx = dx * (i % cols) + dx / 2;
    const cy = dy * Math.floor(i / cols) + dy / 2 - r * 0.4;
    return { segment, kind: "circle", cx, cy, r, labelX: cx, labelY: cy + r + 7 };
  });
  return { width: CELL_WIDTH, height: CELL_HEIGHT, shapes };
}

/** A figure scaled to the cell height; the names sit under dots and on bars and polylines. */
function figureShapes(figure: CellFigure, segments: readonly string[]): CellDrawing {
  const k = CELL_HEIGHT / figure.height;
  const shapes = segments.flatMap((segment): DrawnSegment[] => {
    const shape = figure.shapes[segment];
    if (!shape) return [];
    const o = shapeOutline(shape);
    const a = shapeAnchor(shape);
    if (o.kind === "circle") {
      const cx = r2(o.centre.x * k);
      const cy = r2(o.centre.y * k);
      const r = r2(o.r * k);
      // The name inside a pip big enough to hold it (the editor's labels are 6 units high), else under it.
      return [{ segment, kind: "circle", cx, cy, r, labelX: cx, labelY: r >= 6 ? cy + 2 : cy + r + 6, labelInside: r >= 6 }];
    }
    const points = o.points.map((p) => `${r2(p.x * k)},${r2(p.y * k)}`).join(" ");
    return [{ segment, kind: "polygon", points, labelX: r2(a.x * k), labelY: r2(a.y * k) + 2, labelInside: true }];
  });
  return { width: r2(figure.width * k), height: CELL_HEIGHT, shapes };
}
