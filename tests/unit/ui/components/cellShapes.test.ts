import { describe, expect, it } from "vitest";
import { CELL_HEIGHT, CELL_WIDTH, cellShapes, type DrawnSegment } from "../../../../src/ui/components/cellShapes.ts";
import { example } from "../../../support/projects.ts";

const centre = (s: DrawnSegment) => {
  if (s.kind === "circle") return { x: s.cx, y: s.cy };
  const pts = s.points.split(" ").map((p) => p.split(",").map(Number) as [number, number]);
  return { x: pts.reduce((a, p) => a + p[0], 0) / pts.length, y: pts.reduce((a, p) => a + p[1], 0) / pts.length };
};

describe("cell shapes", () => {
  it("places the seven segments as the trade names them: a top, b-f clockwise, g middle", () => {
    // Segment naming: encyclopedia article "Seven-segment display" (source in docs/sources.md).
    const at = Object.fromEntries(cellShapes({ kind: "seg7", segments: [] }).shapes.map((s) => [s.segment, centre(s)]));
    const mid = { x: CELL_WIDTH / 2, y: CELL_HEIGHT / 2 };
    expect(at["a"]?.y).toBeLessThan(at["g"]?.y ?? 0);
    expect(at["d"]?.y).toBeGreaterThan(at["g"]?.y ?? 0);
    expect(at["b"]?.x).toBeGreaterThan(mid.x);
    expect(at["c"]?.x).toBeGreaterThan(mid.x);
    expect(at["e"]?.x).toBeLessThan(mid.x);
    expect(at["f"]?.x).toBeLessThan(mid.x);
    expect(at["b"]?.y).toBeLessThan(mid.y);
    expect(at["c"]?.y).toBeGreaterThan(mid.y);
    expect(at["f"]?.y).toBeLessThan(mid.y);
    expect(at["e"]?.y).toBeGreaterThan(mid.y);
  });
  it("adds the decimal point for seg7dp and gives every custom segment without a figure a pad inside the cell", () => {
    expect(cellShapes({ kind: "seg7dp", segments: [] }).shapes.map((s) => s.segment)).toContain("dp");
    const pads = cellShapes({ kind: "custom", segments: ["tl", "tr", "ml", "c", "mr", "bl", "br"] }).shapes;
    expect(pads.map((p) => p.segment)).toEqual(["tl", "tr", "ml", "c", "mr", "bl", "br"]);
    for (const p of pads) {
      const c = centre(p);
      expect(c.x).toBeGreaterThan(0);
      expect(c.x).toBeLessThan(CELL_WIDTH);
      expect(c.y).toBeGreaterThan(0);
      expect(c.y).toBeLessThan(CELL_HEIGHT);
    }
  });
  it("draws the die roller's pips where a die face has them, so its 5 looks like a five", () => {
    // A die face's pips: common practice, no source. Before, the pips sat in name order on a 3x3 grid,
    // so tl, tr, ml filled the top row and the "5" (tl tr c bl br) did not read as a die face.
    const cell = example("die-roller").display.cell;
    const drawing = cellShapes(cell);
    expect(drawing.width).toBe(drawing.height);
    const at = Object.fromEntries(drawing.shapes.map((s) => [s.segment, centre(s)]));
    const w = drawing.width;
    const near = (v: number | undefined, target: number) => expect(Math.abs((v ?? NaN) - target)).toBeLessThan(w * 0.1);
    for (const [name, col, row] of [
      ["tl", 0, 0],
      ["tr", 2, 0],
      ["ml", 0, 1],
      ["c", 1, 1],
      ["mr", 2, 1],
      ["bl", 0, 2],
      ["br", 2, 2],
    ] as const) {
      // A 3 x 3 grid of pip places over the face, from a quarter to three quarters of the way across and down.
      near(at[name]?.x, (w * (1 + col)) / 4);
      near(at[name]?.y, (w * (1 + row)) / 4);
    }
    expect(drawing.shapes.every((s) => s.kind === "circle")).toBe(true);
  });
  it("draws bars and polylines of a figure as one closed shape each", () => {
    const drawing = cellShapes(example("antenna-rotator").display.cell);
    expect(drawing.shapes).toHaveLength(16);
    const head = drawing.shapes.find((s) => s.segment === "hn")!;
    expect(head.kind).toBe("polygon");
    // A chevron's outline: three points on each side of the stroke.
    expect(head.kind === "polygon" && head.points.split(" ").length).toBe(6);
    const spoke = drawing.shapes.find((s) => s.segment === "n")!;
    expect(spoke.kind === "polygon" && spoke.points.split(" ").length).toBe(6);
    expect(centre(spoke).y).toBeLessThan(drawing.height / 2);
  });
});
