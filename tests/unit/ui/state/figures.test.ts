import { describe, expect, it } from "vitest";
import {
  combineFigures,
  figureText,
  isBetter,
  matrixFigure,
  shownFigure,
  tableCaption,
  type Figure,
} from "../../../../src/ui/state/figures.ts";

const heuristic = (count: number, lowerBound: number | null = null): Figure => ({ count, lowerBound, status: "heuristic" });
const proven = (count: number): Figure => ({ count, lowerBound: count, status: "proven" });

describe("figures: one figure per glyph set, whichever run found it", () => {
  it("gives the row in use the result line's exact figure, not its own heuristic one (52 proven beside 54)", () => {
    // The case the comparison table got wrong: the header said 52 (exact), the row in use said 54 (its heuristic count).
    expect(combineFigures([heuristic(54), proven(52)])).toEqual(proven(52));
  });

  it("keeps the smallest count and the largest bound; proven only when they meet", () => {
    expect(combineFigures([heuristic(54, 40), { count: 53, lowerBound: 48, status: "best found" }])).toEqual({
      count: 53,
      lowerBound: 48,
      status: "best found",
    });
    expect(combineFigures([heuristic(51), { count: 53, lowerBound: 51, status: "best found" }])).toEqual(proven(51));
    expect(combineFigures([null, undefined])).toBeNull();
  });

  it("prefers the better-worked status on a tie", () => {
    expect(combineFigures([heuristic(50), { count: 50, lowerBound: 44, status: "best found" }])?.status).toBe("best found");
    expect(isBetter(proven(50), heuristic(50))).toBe(true);
    expect(isBetter(heuristic(49), proven(50))).toBe(true);
  });

  it("reads a matrix's figure from its method and proof", () => {
    expect(matrixFigure({ count: 52, lowerBound: 52, optimal: true, method: "exact" }).status).toBe("proven");
    expect(matrixFigure({ count: 221, lowerBound: 142, optimal: false, method: "exact" }).status).toBe("best found");
    expect(matrixFigure({ count: 54, lowerBound: null, optimal: false, method: "heuristic" }).status).toBe("heuristic");
  });

  it("shows the matrix on screen with the best bound known, never a count it does not show", () => {
    expect(shownFigure(heuristic(53), proven(51))).toEqual({ count: 53, lowerBound: 51, status: "heuristic" });
    expect(shownFigure(heuristic(51), proven(51))).toEqual(proven(51));
  });

  it("labels the table 'heuristic counts' only while every row is a heuristic figure", () => {
    expect(tableCaption(["heuristic", "heuristic"])).toBe("heuristic counts");
    expect(tableCaption(["heuristic", "proven"])).toBe("figures of mixed status");
    expect(tableCaption(["proven", "proven"])).toBe("proven minimums");
    expect(figureText({ count: 53, lowerBound: 49, status: "best found" })).toBe("53 best found (bound 49)");
  });
});
