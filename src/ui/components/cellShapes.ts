/**
 * Geometry of a drawn display cell for the glyph editor and the previews:
 * one shape per segment, in a 60 x 100 box.
 *
 * Seven-segment cells get the usual bars (a top, b-f clockwise, g middle,
 * dp a dot at the lower right). A custom cell has no known arrangement, so
 * its segments sit on a grid of round pads, each labelled with its name.
 */
import type { CellKind } from "../../core/project/project.ts";

export const CELL_WIDTH = 60;
export const CELL_HEIGHT = 100;

export type SegmentShape =
  | { readonly segment: string; readonly kind: "polygon"; readonly points: string; readonly labelX: number; readonly labelY: number }
  | {
      readonly segment: string;
      readonly kind: "circle";
      readonly cx: number;
      readonly cy: number;
      readonly r: number;
      readonly labelX: number;
      readonly labelY: number;
    };

const T = 8; // bar thickness

function bar(segment: string, x1: number, y1: number, x2: number, y2: number, lx: number, ly: number): SegmentShape {
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

const SEG7: readonly SegmentShape[] = [
  bar("a", 12, 10, 48, 10, 30, 4),
  bar("b", 50, 12, 50, 48, 57, 30),
  bar("c", 50, 52, 50, 88, 57, 70),
  bar("d", 12, 90, 48, 90, 30, 99),
  bar("e", 10, 52, 10, 88, 3, 70),
  bar("f", 10, 12, 10, 48, 3, 30),
  bar("g", 12, 50, 48, 50, 30, 44),
];

/** The segment shapes of a cell, in the cell's segment order. */
export function cellShapes(kind: CellKind, segments: readonly string[]): readonly SegmentShape[] {
  if (kind !== "custom") {
    const shapes = [...SEG7];
    if (kind === "seg7dp") shapes.push({ segment: "dp", kind: "circle", cx: 56, cy: 94, r: 3.5, labelX: 56, labelY: 84 });
    return shapes;
  }
  const cols = Math.max(1, Math.ceil(Math.sqrt(segments.length)));
  const rows = Math.max(1, Math.ceil(segments.length / cols));
  const dx = CELL_WIDTH / cols;
  const dy = CELL_HEIGHT / rows;
  const r = Math.min(dx, dy) * 0.28;
  return segments.map((segment, i) => {
    const cx = dx * (i % cols) + dx / 2;
    const cy = dy * Math.floor(i / cols) + dy / 2 - r * 0.4;
    return { segment, kind: "circle", cx, cy, r, labelX: cx, labelY: cy + r + 7 };
  });
}
