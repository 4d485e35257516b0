import { describe, expect, it } from "vitest";
import { minimumDegree, minimumDegreeOrder, SparsePattern, SparseSolver } from "../../../../src/core/circuit/linearSolve.ts";
import { solveInPlace } from "../../../support/denseSolve.ts";

/** A small deterministic generator, so the matrices are the same every run. */
function lcg(seed: number): () => number {
  let s = seed >>> 0;
  return () => ((s = (Math.imul(s, 1664525) + 1013904223) >>> 0) / 2 ** 32) * 2 - 1;
}

describe("solveInPlace (the dense reference)", () => {
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

describe("SparseSolver", () => {
  /** A random system with its pattern, diagonally weighted like a nodal matrix. */
  function system(n: number, density: number, seed: number): { a: Float64Array; entries: [number, number][] } {
    const rnd = lcg(seed);
    const a = new Float64Array(n * n);
    const entries: [number, number][] = [];
    for (let i = 0; i < n; i++)
      for (let j = 0; j < n; j++)
        if (i === j || Math.abs(rnd()) < density) {
          a[i * n + j] = rnd();
          entries.push([i, j]);
        }
    for (let i = 0; i < n; i++) a[i * n + i] = (a[i * n + i] as number) + 0.1;
    return { a, entries };
  }

  it("agrees with the dense elimination, and leaves nothing outside the pattern, solve after solve", () => {
    for (const [n, density, seed] of [
      [1, 1, 3],
      [8, 0.3, 4],
      [40, 0.05, 5],
      [90, 0.02, 6],
    ] as const) {
      const { a, entries } = system(n, density, seed);
      const pattern = new SparsePattern(n, entries);
      const solver = new SparseSolver(pattern);
      const rnd = lcg(seed + 100);
      const work = new Float64Array(n * n);
      for (let round = 0; round < 3; round++) {
        const b = Float64Array.from({ length: n }, () => rnd());
        const dense = b.slice();
        expect(solveInPlace(a.slice(), dense, n)).toBe(true);
        pattern.clear(work);
        for (const [i, j] of entries) work[i * n + j] = a[i * n + j] as number;
        const sparse = b.slice();
        expect(solver.solve(work, sparse)).toBe(true);
        for (let i = 0; i < n; i++) expect(sparse[i]).toBeCloseTo(dense[i] as number, 9);
        pattern.clear(work);
        expect(work.every((v) => v === 0)).toBe(true);
      }
    }
  });

  it("shares one work space among solvers one after another: the same numbers as with a space of its own, the retired one refused", () => {
    const space = new Uint8Array(90 * 90);
    let retired: SparseSolver | null = null;
    // Different sizes and patterns in turn, so a solver would see the last one's marks if they were left behind.
    for (const [n, density, seed] of [
      [90, 0.02, 6],
      [40, 0.05, 5],
      [90, 0.03, 7],
      [8, 0.3, 4],
      [90, 0.02, 6],
    ] as const) {
      const { a, entries } = system(n, density, seed);
      const pattern = new SparsePattern(n, entries);
      const own = new SparseSolver(pattern);
      const shared = new SparseSolver(pattern, space);
      if (retired !== null) expect(() => retired?.solve(new Float64Array(1), new Float64Array(1))).toThrow(/newer SparseSolver/);
      const rnd = lcg(seed + 200);
      for (let round = 0; round < 2; round++) {
        const b = Float64Array.from({ length: n }, () => rnd());
        const x1 = b.slice();
        const x2 = b.slice();
        expect(own.solve(a.slice(), x1)).toBe(true);
        expect(shared.solve(a.slice(), x2)).toBe(true);
        expect([...x2]).toEqual([...x1]);
      }
      retired = shared;
    }
  });

  it("pivots past a zero on the diagonal and reports a singular matrix", () => {
    const pattern = new SparsePattern(2, [
      [0, 1],
      [1, 0],
    ]);
    const solver = new SparseSolver(pattern);
    const b = Float64Array.from([2, 3]);
    expect(solver.solve(Float64Array.from([0, 1, 1, 0]), b)).toBe(true);
    expect([...b]).toEqual([3, 2]);
    expect(solver.solve(Float64Array.from([1, 2, 2, 4]), Float64Array.from([1, 1]))).toBe(false);
  });

  it("factors once and substitutes for many right-hand sides: the same numbers as a solve each, bit for bit; release leaves nothing outside the pattern", () => {
    for (const [n, density, seed] of [
      [1, 1, 3],
      [8, 0.3, 4],
      [40, 0.05, 5],
      [90, 0.02, 6],
    ] as const) {
      const { a, entries } = system(n, density, seed);
      const pattern = new SparsePattern(n, entries);
      const solver = new SparseSolver(pattern);
      const rnd = lcg(seed + 300);
      const work = new Float64Array(n * n);
      for (let round = 0; round < 2; round++) {
        pattern.clear(work);
        for (const [i, j] of entries) work[i * n + j] = a[i * n + j] as number;
        expect(solver.factor(work)).toBe(true);
        // Neither solve nor a second factor while the elimination is held.
        expect(() => solver.solve(work, new Float64Array(n))).toThrow(/release it first/);
        expect(() => solver.factor(work)).toThrow(/release it first/);
        for (let rhs = 0; rhs < 3; rhs++) {
          const b = Float64Array.from({ length: n }, () => rnd());
          const once = b.slice();
          expect(solver.substitute(b)).toBe(true);
          const dense = once.slice();
          expect(solveInPlace(a.slice(), dense, n)).toBe(true);
          for (let i = 0; i < n; i++) expect(b[i]).toBeCloseTo(dense[i] as number, 9);
          // The forward pass takes the multipliers in the order the elimination made them, so it is the solve's own arithmetic.
          const fresh = new SparseSolver(pattern);
          expect(fresh.solve(a.slice(), once)).toBe(true);
          expect([...b]).toEqual([...once]);
        }
        solver.release();
        pattern.clear(work);
        expect(work.every((v) => v === 0)).toBe(true);
      }
      expect(() => solver.substitute(new Float64Array(n))).toThrow(/without a factorization/);
    }
  });

  it("reports a singular matrix to factor, and takes a release after it", () => {
    const pattern = new SparsePattern(2, [
      [0, 1],
      [1, 0],
    ]);
    const solver = new SparseSolver(pattern);
    expect(solver.factor(Float64Array.from([1, 2, 2, 4]))).toBe(false);
    solver.release();
    const b = Float64Array.from([2, 3]);
    expect(solver.solve(Float64Array.from([0, 1, 1, 0]), b)).toBe(true);
    expect([...b]).toEqual([3, 2]);
  });

  it("refuses a pattern entry outside the matrix", () => {
    expect(() => new SparsePattern(2, [[0, 2]])).toThrow(RangeError);
  });
});

describe("minimumDegreeOrder", () => {
  /** Fill entries (new off-diagonal pairs) that eliminating in `order` makes, by the elimination graph. */
  function fill(n: number, edges: readonly (readonly [number, number])[], order: ArrayLike<number>): number {
    const adj = Array.from({ length: n }, () => new Set<number>());
    for (const [a, b] of edges) {
      if (a === b) continue;
      adj[a]?.add(b);
      adj[b]?.add(a);
    }
    let made = 0;
    for (let k = 0; k < order.length; k++) {
      const v = order[k] as number;
      const nb = [...(adj[v] as Set<number>)];
      for (const u of nb) adj[u]?.delete(v);
      for (let i = 0; i < nb.length; i++)
        for (let j = i + 1; j < nb.length; j++) {
          const a = nb[i] as number;
          const b = nb[j] as number;
          if (!adj[a]?.has(b)) {
            adj[a]?.add(b);
            adj[b]?.add(a);
            made++;
          }
        }
    }
    return made;
  }

  it("is a permutation, the same every run", () => {
    const rnd = lcg(11);
    for (const n of [1, 2, 17, 70]) {
      const edges: [number, number][] = [];
      for (let i = 0; i < n; i++) for (let j = 0; j < i; j++) if (Math.abs(rnd()) < 0.08) edges.push([i, j]);
      const order = minimumDegreeOrder(n, edges);
      expect([...order].sort((a, b) => a - b)).toEqual(Array.from({ length: n }, (_, i) => i));
      expect([...minimumDegreeOrder(n, edges)]).toEqual([...order]);
    }
  });

  it("counts the work of its elimination: the squared degree of every node it eliminates", () => {
    // A star of 9 leaves: each leaf has degree 1 when taken; the last leaf and the hub 1 and 0.
    const star = Array.from({ length: 9 }, (_, i) => [0, i + 1] as const);
    expect(minimumDegree(10, star).work).toBe(9);
    expect([...minimumDegree(10, star).order]).toEqual([...minimumDegreeOrder(10, star)]);
    // A clique of 5 (every pair joined): degrees 4, 3, 2, 1, 0 in turn.
    const clique: [number, number][] = [];
    for (let i = 0; i < 5; i++) for (let j = 0; j < i; j++) clique.push([i, j]);
    expect(minimumDegree(5, clique).work).toBe(16 + 9 + 4 + 1);
  });

  it("eliminates a hub last: a star and a path fill nothing in, where hub-first fills every pair", () => {
    // A hub joined to every other node (a counter line to its diodes, say): taken first, it joins
    // all 9 others into a clique, 36 fill entries; minimum degree leaves it to the end (common
    // practice, no source: the textbook arrow-matrix example of ordering).
    const star = Array.from({ length: 9 }, (_, i) => [0, i + 1] as const);
    expect(
      fill(
        10,
        star,
        Array.from({ length: 10 }, (_, i) => i),
      ),
    ).toBe(36);
    const order = minimumDegreeOrder(10, star);
    // Its place: after every leaf but the last (two nodes of degree 1 remain, the lower index first).
    expect([...order].indexOf(0)).toBe(8);
    expect(fill(10, star, order)).toBe(0);
    const path = Array.from({ length: 11 }, (_, i) => [i, i + 1] as const);
    expect(fill(12, path, minimumDegreeOrder(12, path))).toBe(0);
  });

  it("fills no more than the natural order on bipartite patterns like a diode matrix's", () => {
    // Lines joined to outputs at random, each output to one driver node: the shape of a direct matrix.
    const rnd = lcg(23);
    for (const [lines, outputs] of [
      [10, 7],
      [24, 14],
      [40, 28],
    ] as const) {
      const n = lines + 2 * outputs;
      const edges: [number, number][] = [];
      for (let l = 0; l < lines; l++) for (let o = 0; o < outputs; o++) if (rnd() > 0) edges.push([l, lines + o]);
      for (let o = 0; o < outputs; o++) edges.push([lines + o, lines + outputs + o]);
      const natural = fill(
        n,
        edges,
        Array.from({ length: n }, (_, i) => i),
      );
      const md = fill(n, edges, minimumDegreeOrder(n, edges));
      expect(md).toBeLessThanOrEqual(natural);
    }
  });
});
