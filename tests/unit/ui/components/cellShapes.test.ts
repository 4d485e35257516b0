import { describe, expect, it } from "vitest";
import { CELL_HEIGHT, CELL_WIDTH, cellShapes } from "../../../../src/ui/components/cellShapes.ts";

const centre = (s: ReturnType<typeof cellShapes>[number]) => {
  if (s.kind === "circle") return { x: s.cx, y: s.cy };
  const pts = s.points.split(" ").map((p) => p.split(",").map(Number) as [number, number]);
  return { x: pts.reduce((a, p) => a + p[0], 0) / pts.length, y: pts.reduce((a, p) => a + p[1], 0) / pts.length };
};

describe("cell shapes", () => {
  it("places the seven segments as the trade names them: a top, b-f clockwise, g middle", () => {
    // Segment naming: encyclopedia article "Seven-segment display" (source in docs/sources.md).
    const at = Object.fromEntries(cellShapes("seg7", []).map((s) => [s.segment, centre(s)]));
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
  it("adds the decimal point for seg7dp and gives every custom segment a pad inside the cell", () => {
    expect(cellShapes("seg7dp", []).map((s) => s.segment)).toContain("dp");
    const pads = cellShapes("custom", ["tl", "tr", "ml", "c", "mr", "bl", "br"]);
    expect(pads.map((p) => p.segment)).toEqual(["tl", "tr", "ml", "c", "mr", "bl", "br"]);
    for (const p of pads) {
      const c = centre(p);
      expect(c.x).toBeGreaterThan(0);
      expect(c.x).toBeLessThan(CELL_WIDTH);
      expect(c.y).toBeGreaterThan(0);
      expect(c.y).toBeLessThan(CELL_HEIGHT);
    }
  });
});
