/**
 * The minimum diode count of a small lit matrix at depth limit 2, by brute
 * force, independent of src/core/synth: for checking the optimizer's optima
 * and every lower bound on random matrices of up to about 5 x 5 cells.
 */
import type { DepthPolicy } from "../../src/core/project/project.ts";

// Independent brute force, depth limit 2. Every path is a direct diode
// (length 1), a bus S x T fed by counter lines, or a link from an output fed
// only by direct diodes (length 2). So: every subset of outputs that take
// two-diode paths ("long" outputs), every set of links from short to long
// outputs, then the cheapest set of blocks S x T inside the lit long cells
// (cost |S| + |T|, a single state allowed) covering what the links leave,
// by exhaustive search over cell sets. Mixed lets long outputs take direct
// diodes too; uniform allows all-long or all-short only.
export function bruteMinimum(lit: readonly (readonly boolean[])[], depth: DepthPolicy): number {
  const n = lit.length;
  const m = lit[0]?.length ?? 0;
  const on = (k: number, o: number): boolean => lit[k]?.[o] === true;
  let best = Infinity;
  for (let long = 0; long < 1 << m; long++) {
    if (depth === "uniform" && long !== 0 && long !== (1 << m) - 1) continue;
    const isLong = (o: number): boolean => ((long >> o) & 1) === 1;
    let base = 0;
    for (let k = 0; k < n; k++) for (let o = 0; o < m; o++) if (on(k, o) && !isLong(o)) base++;
    const pairs: [number, number][] = [];
    if (depth !== "uniform") {
      for (let a = 0; a < m; a++) {
        for (let b = 0; b < m; b++) {
          if (a === b || isLong(a) || !isLong(b)) continue;
          let some = false;
          let all = true;
          for (let k = 0; k < n; k++) {
            if (!on(k, a)) continue;
            some = true;
            if (!on(k, b)) all = false;
          }
          if (some && all) pairs.push([a, b]);
        }
      }
    }
    for (let chosen = 0; chosen < 1 << pairs.length; chosen++) {
      const left: number[] = [];
      let links = 0;
      const linked = new Set<number>();
      pairs.forEach(([a, b], i) => {
        if (((chosen >> i) & 1) === 0) return;
        links++;
        for (let k = 0; k < n; k++) if (on(k, a)) linked.add(k * m + b);
      });
      for (let k = 0; k < n; k++) for (let o = 0; o < m; o++) if (on(k, o) && isLong(o) && !linked.has(k * m + o)) left.push(k * m + o);
      best = Math.min(best, base + links + blockCover(lit, left, isLong, depth === "mixed"));
    }
  }
  return best;
}

function blockCover(
  lit: readonly (readonly boolean[])[],
  cells: readonly number[],
  isLong: (o: number) => boolean,
  direct: boolean,
): number {
  const n = lit.length;
  const m = lit[0]?.length ?? 0;
  const index = new Map(cells.map((c, i) => [c, i]));
  const blocks: { cells: number; cost: number }[] = [];
  for (let s = 1; s < 1 << n; s++) {
    for (let t = 1; t < 1 << m; t++) {
      let mask = 0;
      let fits = true;
      for (let k = 0; k < n && fits; k++) {
        if (((s >> k) & 1) === 0) continue;
        for (let o = 0; o < m; o++) {
          if (((t >> o) & 1) === 0) continue;
          if (!isLong(o) || lit[k]?.[o] !== true) fits = false;
          const i = index.get(k * m + o);
          if (i !== undefined) mask |= 1 << i;
        }
      }
      let size = 0;
      for (let x = s; x; x &= x - 1) size++;
      for (let x = t; x; x &= x - 1) size++;
      if (fits && mask !== 0) blocks.push({ cells: mask, cost: size });
    }
  }
  if (direct) cells.forEach((_, i) => blocks.push({ cells: 1 << i, cost: 1 }));
  const all = (1 << cells.length) - 1;
  const memo = new Map<number, number>();
  const go = (done: number): number => {
    if (done === all) return 0;
    const hit = memo.get(done);
    if (hit !== undefined) return hit;
    let first = 0;
    while ((done >> first) & 1) first++;
    let best = Infinity;
    for (const b of blocks) if ((b.cells >> first) & 1) best = Math.min(best, b.cost + go(done | b.cells));
    memo.set(done, best);
    return best;
  };
  return go(0);
}
