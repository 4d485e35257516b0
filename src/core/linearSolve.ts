/**
 * Dense Gaussian elimination with partial pivoting that skips zeros.
 *
 * A decoder's nodal matrix is mostly empty: a counter line touches only the
 * lines its diodes reach. Stored densely (small enough), but each pivot row
 * updates only the columns where it is non-zero, and only the rows that have
 * an entry under the pivot, so eliminating the counter lines first costs
 * little and fill-in stays in the block of buses and output lines.
 */

/**
 * Solves `a x = b` in place: `a` (row-major n by n) and `b` are overwritten;
 * the solution is returned in `b`. Returns false for a singular matrix.
 */
export function solveInPlace(a: Float64Array, b: Float64Array, n: number): boolean {
  const cols = new Int32Array(n);
  const rows = new Int32Array(n);
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
    let m = 0;
    for (let j = k + 1; j < n; j++) if (a[rowK + j] !== 0) cols[m++] = j;
    const bk = b[k] as number;
    for (let c0 = 0; c0 < r; c0++) {
      const i = rows[c0] as number;
      if (i < 0) continue;
      const rowI = i * n;
      const aik = a[rowI + k] as number;
      if (aik === 0) continue;
      const f = aik / pivot;
      a[rowI + k] = 0;
      for (let c = 0; c < m; c++) {
        const j = cols[c] as number;
        a[rowI + j] = (a[rowI + j] as number) - f * (a[rowK + j] as number);
      }
      b[i] = (b[i] as number) - f * bk;
    }
  }
  for (let k = n - 1; k >= 0; k--) {
    const rowK = k * n;
    let s = b[k] as number;
    for (let j = k + 1; j < n; j++) {
      const akj = a[rowK + j] as number;
      if (akj !== 0) s -= akj * (b[j] as number);
    }
    b[k] = s / (a[rowK + k] as number);
  }
  for (let k = 0; k < n; k++) if (!Number.isFinite(b[k] as number)) return false;
  return true;
}
