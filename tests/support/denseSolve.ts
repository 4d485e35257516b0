/**
 * The textbook dense elimination the sparse solver is checked against.
 */

/** Length of the integer scratch `solveInPlace` needs for an n by n system. */
export function scratchLength(n: number): number {
  return n * n + 2 * n + 1;
}

/**
 * Solves `a x = b` in place: `a` (row-major n by n) and `b` are overwritten;
 * the solution is returned in `b`. Returns false for a singular matrix.
 *
 * @param scratch optional integer work space of `scratchLength(n)`, so that a
 *   caller solving many systems allocates it once
 */
export function solveInPlace(a: Float64Array, b: Float64Array, n: number, scratch: Int32Array = new Int32Array(scratchLength(n))): boolean {
  if (scratch.length < scratchLength(n))
    throw new RangeError(`solveInPlace needs ${scratchLength(n)} scratch integers, got ${scratch.length}`);
  const rows = scratch.subarray(0, n);
  // Row k of U keeps its non-zero columns at cols[start[k] .. start[k + 1]).
  const start = scratch.subarray(n, 2 * n + 1);
  const cols = scratch.subarray(2 * n + 1);
  let used = 0;
  for (let k = 0; k < n; k++) {
    // Partial pivoting: the largest entry of column k at or below the diagonal;
    // the same pass lists the rows that need eliminating.
    let p = k;
    let best = Math.abs(a[k * n + k] as number);
    let r = 0;
    for (let i = k + 1; i < n; i++) {
      const aik = a[i * n + k] as number;
      if (aik === 0) continue;
      rows[r++] = i;
      const v = Math.abs(aik);
      if (v > best) {
        best = v;
        p = i;
      }
    }
    if (!(best > 0) || !Number.isFinite(best)) return false;
    if (p !== k) {
      for (let j = k; j < n; j++) {
        const t = a[k * n + j] as number;
        a[k * n + j] = a[p * n + j] as number;
        a[p * n + j] = t;
      }
      const t = b[k] as number;
      b[k] = b[p] as number;
      b[p] = t;
      // Row p now holds the old row k, which may be zero in column k.
      for (let c = 0; c < r; c++) if (rows[c] === p) rows[c] = a[p * n + k] !== 0 ? p : -1;
    }
    const rowK = k * n;
    const pivot = a[rowK + k] as number;
    start[k] = used;
    for (let j = k + 1; j < n; j++) if (a[rowK + j] !== 0) cols[used++] = j;
    const first = start[k] as number;
    const bk = b[k] as number;
    for (let c0 = 0; c0 < r; c0++) {
      const i = rows[c0] as number;
      if (i < 0) continue;
      const rowI = i * n;
      const aik = a[rowI + k] as number;
      if (aik === 0) continue;
      const f = aik / pivot;
      a[rowI + k] = 0;
      for (let c = first; c < used; c++) {
        const j = cols[c] as number;
        a[rowI + j] = (a[rowI + j] as number) - f * (a[rowK + j] as number);
      }
      b[i] = (b[i] as number) - f * bk;
    }
  }
  start[n] = used;
  for (let k = n - 1; k >= 0; k--) {
    const rowK = k * n;
    let s = b[k] as number;
    const end = start[k + 1] as number;
    for (let c = start[k] as number; c < end; c++) {
      const j = cols[c] as number;
      s -= (a[rowK + j] as number) * (b[j] as number);
    }
    b[k] = s / (a[rowK + k] as number);
  }
  for (let k = 0; k < n; k++) if (!Number.isFinite(b[k] as number)) return false;
  return true;
}
