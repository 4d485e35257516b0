import { describe, expect, it } from "vitest";
import { E24, E96, nearestPreferred, preferredNeighbours } from "../../../../src/core/budget/eSeries.ts";

describe("E-series", () => {
  it("holds the full tables", () => {
    expect(E24).toHaveLength(24);
    expect(E96).toHaveLength(96);
    // The series are tables: the rounded geometric value 10^(5/12) * 10 would be 26, the table has 27.
    expect(E24).toContain(27);
    expect(E24).not.toContain(26);
    expect([...E24].sort((a, b) => a - b)).toEqual(E24);
    expect([...E96].sort((a, b) => a - b)).toEqual(E96);
  });

  it("finds the preferred values around a resistance, exact in every decade", () => {
    expect(preferredNeighbours(5000, "E24")).toEqual([4700, 5100]);
    expect(preferredNeighbours(4700, "E24")).toEqual([4700, 4700]);
    expect(preferredNeighbours(9990, "E24")).toEqual([9100, 10_000]);
    expect(preferredNeighbours(10_300, "E96")).toEqual([10_200, 10_500]);
    expect(preferredNeighbours(0.5, "E24")).toEqual([0.47, 0.51]);
    expect(preferredNeighbours(2.2e6, "E24")).toEqual([2_200_000, 2_200_000]);
  });

  it("picks the nearer on a log scale", () => {
    expect(nearestPreferred(10_400, "E96")).toBe(10_500);
    expect(nearestPreferred(9_500, "E24")).toBe(9_100);
    expect(nearestPreferred(9_600, "E24")).toBe(10_000);
  });

  it("rejects a non-positive resistance", () => {
    expect(() => preferredNeighbours(0, "E24")).toThrow(RangeError);
    expect(() => preferredNeighbours(Number.NaN, "E96")).toThrow(RangeError);
  });
});
