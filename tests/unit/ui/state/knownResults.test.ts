import { describe, expect, it } from "vitest";
import { KnownResults } from "../../../../src/ui/state/knownResults.ts";

describe("known results by glyph set", () => {
  it("keeps the smaller count with its matrix, and combines the bounds", () => {
    const k = new KnownResults();
    expect(k.remember("a", { figure: { count: 53, lowerBound: 49, status: "best found" }, matrix: "m53" })).toBe(true);
    expect(k.remember("a", { figure: { count: 54, lowerBound: 51, status: "best found" }, matrix: "m54" })).toBe(true);
    expect(k.get("a")).toEqual({ figure: { count: 53, lowerBound: 51, status: "best found" }, matrix: "m53" });
    expect(k.remember("a", { figure: { count: 51, lowerBound: 51, status: "proven" }, matrix: "m51" })).toBe(true);
    expect(k.get("a")).toEqual({ figure: { count: 51, lowerBound: 51, status: "proven" }, matrix: "m51" });
    // Nothing new: no change reported.
    expect(k.remember("a", { figure: { count: 52, lowerBound: null, status: "heuristic" }, matrix: "m52" })).toBe(false);
    expect(k.proven()).toEqual([["a", { count: 51, lowerBound: 51, status: "proven" }]]);
  });

  it("forgets the least recently used glyph set beyond its capacity", () => {
    const k = new KnownResults(2);
    const f = { count: 1, lowerBound: 1, status: "proven" as const };
    k.remember("a", { figure: f, matrix: 1 });
    k.remember("b", { figure: f, matrix: 2 });
    k.remember("c", { figure: f, matrix: 3 });
    expect(k.get("a")).toBeUndefined();
    expect(k.get("b")?.matrix).toBe(2);
    expect(k.get("c")?.matrix).toBe(3);
  });
});
