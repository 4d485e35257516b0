import { describe, expect, it } from "vitest";
import { glyphKey, glyphKeyHeight } from "../../../src/render/glyphKey.ts";
import { boxesOverlap } from "../../../src/render/drawingModel.ts";
import { example } from "../../support/projects.ts";

describe("the drawing's glyph key", () => {
  it("draws the die roller's pips where a die face has them, each named inside its pip", () => {
    // Before, a custom cell's key listed its names in a framed grid, four to a row, in name order.
    const cell = example("die-roller").display.cell;
    const key = glyphKey(cell, { cx: 50, top: 20, widthMm: 70 });
    expect(key.circles).toHaveLength(7);
    const at = Object.fromEntries(key.labels.map((l) => [l.text, l.at]));
    const pip = (name: string) => key.circles.find((c) => Math.hypot(c.at.x - at[name]!.x, c.at.y - at[name]!.y) < c.r)!;
    // A die face's pips (common practice, no source): three columns and three rows, c in the middle.
    const x = (n: string) => at[n]!.x;
    const y = (n: string) => at[n]!.y;
    expect(x("tl")).toBeCloseTo(x("ml"), 6);
    expect(x("ml")).toBeCloseTo(x("bl"), 6);
    expect(x("tr")).toBeCloseTo(x("br"), 6);
    expect(x("c")).toBeCloseTo((x("tl") + x("tr")) / 2, 6);
    expect(y("tl")).toBeCloseTo(y("tr"), 6);
    expect(y("ml")).toBeCloseTo(y("c"), 6);
    expect(y("c")).toBeCloseTo(y("mr"), 6);
    expect(y("bl")).toBeCloseTo(y("br"), 6);
    expect(y("tl")).toBeLessThan(y("c"));
    expect(y("c")).toBeLessThan(y("bl"));
    // Each name inside its own pip, no two names touching.
    for (const l of key.labels) {
      const c = pip(l.text);
      expect(l.box.x).toBeGreaterThanOrEqual(c.at.x - c.r);
      expect(l.box.x + l.box.w).toBeLessThanOrEqual(c.at.x + c.r);
    }
    for (const [i, a] of key.labels.entries()) for (const b of key.labels.slice(i + 1)) expect(boxesOverlap(a.box, b.box)).toBe(false);
    // The height the grid reserves holds the key.
    expect(key.box.y + key.box.h).toBeLessThanOrEqual(20 + glyphKeyHeight(cell, 70));
  });

  it("draws bars and polylines as outlines with every name clear of the other names", () => {
    const cell = example("antenna-rotator").display.cell;
    const key = glyphKey(cell, { cx: 0, top: 0, widthMm: 160 });
    expect(key.polygons).toHaveLength(16);
    expect(key.labels.map((l) => l.text).sort()).toEqual([...cell.segments].sort());
    for (const [i, a] of key.labels.entries()) for (const b of key.labels.slice(i + 1)) expect(boxesOverlap(a.box, b.box)).toBe(false);
    // The head at north is above the centre, the one at south below it.
    const label = (n: string) => key.labels.find((l) => l.text === n)!;
    expect(label("hn").at.y).toBeLessThan(label("hs").at.y);
    expect(label("hw").at.x).toBeLessThan(label("he").at.x);
  });

  it("keeps the framed grid of names for a custom cell without a figure", () => {
    const key = glyphKey({ kind: "custom", segments: ["p", "q", "r"] }, { cx: 0, top: 0, widthMm: 40 });
    expect(key.rects).toHaveLength(1);
    expect(key.labels.map((l) => l.text)).toEqual(["p", "q", "r"]);
  });
});
