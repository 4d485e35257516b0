import { describe, expect, it } from "vitest";
import { solveInPlace } from "../../../../src/core/circuit/linearSolve.ts";

/** A small deterministic generator, so the matrices are the same every run. */
function lcg(seed: number): () => number {
  let s = seed >>> 0;
  return () => ((s = (Math.imul(s, 1664525) + 1013904223) >>> 0) / 2 ** 32) * 2 - 1;
}

describe("solveInPlace", () => {
  it("solves sparse and dense systems to rounding", () => {
    const rnd = lcg(7);
    for (const [n, density] of [
      [1, 1],
      [5, 1],
      [30, 0.1],
      [60, 0.5],
    ] as const) {
      const a = new Float64Array(n * n);
      for (let i = 0; i < n; i++) for (let j = 0; j < n; j++) if (i === j || Math.abs(rnd()) < density) a[i * n + j] = rnd();
      for (let i = 0; i < n; i++) a[i * n + i] = (a[i * n + i] as number) + 0.1;
      const x = Array.from({ length: n }, () => rnd());
      const b = new Float64Array(n);
      for (let i = 0; i < n; i++) for (let j = 0; j < n; j++) b[i] = (b[i] as number) + (a[i * n + j] as number) * (x[j] as number);
      expect(solveInPlace(a.slice(), b, n)).toBe(true);
      for (let i = 0; i < n; i++) expect(b[i]).toBeCloseTo(x[i] as number, 8);
    }
  });

  it("pivots past a zero on the diagonal", () => {
    const a = Float64Array.from([0, 1, 1, 0]);
    const b = Float64Array.from([2, 3]);
    expect(solveInPlace(a, b, 2)).toBe(true);
    expect([...b]).toEqual([3, 2]);
  });

  it("reports a singular matrix", () => {
    expect(solveInPlace(Float64Array.from([1, 2, 2, 4]), Float64Array.from([1, 1]), 2)).toBe(false);
    expect(solveInPlace(Float64Array.from([0, 0, 0, 1]), Float64Array.from([1, 1]), 2)).toBe(false);
  });
});
