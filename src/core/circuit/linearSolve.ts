/**
 * Sparse elimination for the nodal matrices of the DC solver.
 */

/**
 * The non-zero positions a circuit's nodal matrix can ever hold: one entry
 * per stamp of a conductance, junction or transistor, and the diagonal.
 * Fixed by the circuit's elements, so it is worked out once per circuit and
 * every Newton iteration clears, checks and solves only these positions.
 */
export class SparsePattern {
  /** Row r's columns are `cols[rowStart[r] .. rowStart[r + 1])`, ascending, each once. */
  readonly rowStart: Int32Array;
  readonly cols: Int32Array;

  /** @param entries (row, column) pairs, repeats allowed; the diagonal is always included */
  constructor(
    readonly n: number,
    entries: Iterable<readonly [number, number]>,
  ) {
    const rs: number[] = [];
    const cs: number[] = [];
    for (let i = 0; i < n; i++) {
      rs.push(i);
      cs.push(i);
    }
    for (const [r, c] of entries) {
      if (r < 0 || c < 0 || r >= n || c >= n) throw new RangeError(`pattern entry (${r}, ${c}) outside ${n} by ${n}`);
      rs.push(r);
      cs.push(c);
    }
    // Bucket by row, then sort and drop repeats within each row.
    const count = new Int32Array(n + 1);
    for (const r of rs) count[r + 1] = (count[r + 1] as number) + 1;
    for (let r = 0; r < n; r++) count[r + 1] = (count[r + 1] as number) + (count[r] as number);
    const bucket = new Int32Array(rs.length);
    const fillAt = count.slice(0, n);
    for (let i = 0; i < rs.length; i++) {
      const r = rs[i] as number;
      bucket[fillAt[r] as number] = cs[i] as number;
      fillAt[r] = (fillAt[r] as number) + 1;
    }
    this.rowStart = new Int32Array(n + 1);
    let total = 0;
    for (let r = 0; r < n; r++) {
      const row = bucket.subarray(count[r] as number, count[r + 1] as number).sort();
      this.rowStart[r] = total;
      for (let i = 0; i < row.length; i++) if (i === 0 || row[i] !== row[i - 1]) bucket[total++] = row[i] as number;
    }
    this.rowStart[n] = total;
    this.cols = bucket.slice(0, total);
  }

  /** Zeroes the pattern's positions of a dense row-major matrix. */
  clear(a: Float64Array): void {
    const { n, rowStart, cols } = this;
    for (let r = 0; r < n; r++) {
      const end = rowStart[r + 1] as number;
      for (let c = rowStart[r] as number; c < end; c++) a[r * n + (cols[c] as number)] = 0;
    }
  }
}

/**
 * Gaussian elimination with partial pivoting over a dense row-major matrix
 * whose non-zeros lie in a known pattern. It keeps, per row and per column,
 * a linked list of the positions that may be non-zero (the pattern, then the
 * fill-in the elimination creates), so a pivot step visits only the rows
 * under the pivot that hold an entry and only the columns the pivot row
 * holds; nothing scans or clears a whole row or column. Columns are
 * eliminated in order, each choosing the largest entry among the rows not
 * yet used, as the textbook dense elimination does (the tests check the two
 * agree to rounding).
 *
 * After a solve the matrix holds nothing outside the pattern, so a caller
 * that clears the pattern (`SparsePattern.clear`) has a zero matrix again.
 */
/** The last solver built on each work space: the only one that may use it. */
const latestOn = new WeakMap<ArrayBufferLike, SparseSolver>();

export class SparseSolver {
  readonly #n: number;
  /** Per row, the first entry of its list; entries chain through `#nextInRow`. */
  readonly #rowHead: Int32Array;
  readonly #colHead: Int32Array;
  readonly #patternRowHead: Int32Array;
  readonly #patternColHead: Int32Array;
  readonly #patternSize: number;
  readonly #patternNextInRow: Int32Array;
  #row: Int32Array;
  #col: Int32Array;
  #nextInRow: Int32Array;
  #nextInCol: Int32Array;
  #size: number;
  /** `#listed[r * n + c] === 1` when (r, c) is listed (one byte per position of the n by n matrix). */
  readonly #listed: Uint8Array;
  readonly #done: Uint8Array;
  readonly #pivotRow: Int32Array;
  /** The column each row was the pivot of. */
  readonly #stepOf: Int32Array;
  readonly #x: Float64Array;
  /** The matrix `factor` left its elimination in, until `release`. */
  #factored: Float64Array | null = null;
  /**
   * The held elimination packed for `substitute`: per column k, the rows it
   * eliminated and their multipliers (`#lowStart`, `#lowRow`, `#lowValue`),
   * then per pivot row its entries right of the diagonal (`#upStart`,
   * `#upCol`, `#upValue`) and its diagonal (`#diagonal`).
   */
  readonly #lowStart: Int32Array;
  readonly #upStart: Int32Array;
  readonly #diagonal: Float64Array;
  #lowRow = new Int32Array(0);
  #lowValue = new Float64Array(0);
  #upCol = new Int32Array(0);
  #upValue = new Float64Array(0);

  /**
   * @param listed optional n * n bytes of work space, shared by the solvers
   *   of one thread one after another: building a solver retires the last
   *   one built on the same space and clears the marks of its pattern (a
   *   solve clears those of its fill-in), so the space is clear again
   */
  constructor(pattern: SparsePattern, listed: Uint8Array = new Uint8Array(pattern.n * pattern.n)) {
    const n = pattern.n;
    if (listed.length < n * n) throw new RangeError(`SparseSolver needs ${n * n} bytes of work space, got ${listed.length}`);
    this.#n = n;
    this.#listed = listed;
    const retired = latestOn.get(listed.buffer);
    if (retired !== undefined) retired.#unlist();
    latestOn.set(listed.buffer, this);
    const capacity = Math.max(16, 2 * pattern.cols.length);
    this.#row = new Int32Array(capacity);
    this.#col = new Int32Array(capacity);
    this.#nextInRow = new Int32Array(capacity);
    this.#nextInCol = new Int32Array(capacity);
    this.#rowHead = new Int32Array(n).fill(-1);
    this.#colHead = new Int32Array(n).fill(-1);
    this.#size = 0;
    for (let r = 0; r < n; r++) {
      const end = pattern.rowStart[r + 1] as number;
      for (let c = pattern.rowStart[r] as number; c < end; c++) this.#add(r, pattern.cols[c] as number);
    }
    this.#patternSize = this.#size;
    this.#patternNextInRow = this.#nextInRow.slice(0, this.#size);
    this.#patternRowHead = this.#rowHead.slice();
    this.#patternColHead = this.#colHead.slice();
    this.#done = new Uint8Array(n);
    this.#pivotRow = new Int32Array(n);
    this.#stepOf = new Int32Array(n);
    this.#lowStart = new Int32Array(n + 1);
    this.#upStart = new Int32Array(n + 1);
    this.#diagonal = new Float64Array(n);
    this.#x = new Float64Array(n);
  }

  #add(r: number, c: number): void {
    if (this.#size === this.#row.length) {
      const grow = (a: Int32Array): Int32Array => {
        const b = new Int32Array(2 * a.length);
        b.set(a);
        return b;
      };
      this.#row = grow(this.#row);
      this.#col = grow(this.#col);
      this.#nextInRow = grow(this.#nextInRow);
      this.#nextInCol = grow(this.#nextInCol);
    }
    const e = this.#size++;
    this.#row[e] = r;
    this.#col[e] = c;
    this.#nextInRow[e] = this.#rowHead[r] as number;
    this.#rowHead[r] = e;
    this.#nextInCol[e] = this.#colHead[c] as number;
    this.#colHead[c] = e;
    this.#listed[r * this.#n + c] = 1;
  }

  /** Clears the marks of the pattern in the work space (the fill-in's are cleared after every solve). */
  #unlist(): void {
    for (let e = 0; e < this.#patternSize; e++) this.#listed[(this.#row[e] as number) * this.#n + (this.#col[e] as number)] = 0;
  }

  /**
   * Solves `a x = b`: `a` (row-major n by n, zero outside the pattern) is
   * overwritten inside the pattern and zeroed outside it; the solution is
   * returned in `b`. Returns false for a singular matrix.
   */
  solve(a: Float64Array, b: Float64Array): boolean {
    if (latestOn.get(this.#listed.buffer) !== this) throw new Error("bug: a newer SparseSolver took this work space");
    if (this.#factored !== null) throw new Error("bug: solve while a factorization is held; release it first");
    const ok = this.#eliminate(a, b);
    this.#forgetFill(a);
    return ok;
  }

  /**
   * Eliminates `a` (as `solve` does, with the same pivots) and keeps the
   * elimination in it, so that `substitute` solves for any number of
   * right-hand sides; `release` ends that. Returns false for a singular
   * matrix (the elimination is held all the same, to be released).
   */
  factor(a: Float64Array): boolean {
    if (latestOn.get(this.#listed.buffer) !== this) throw new Error("bug: a newer SparseSolver took this work space");
    if (this.#factored !== null) throw new Error("bug: factor while a factorization is held; release it first");
    this.#factored = a;
    // A pivot of 0 or a non-finite one stops the elimination short of the last column.
    if (!this.#eliminate(a, this.#x.fill(0), true)) return false;
    this.#pack(a);
    return true;
  }

  /** Packs the held elimination into the arrays `substitute` walks in order. */
  #pack(a: Float64Array): void {
    const n = this.#n;
    if (this.#lowRow.length < this.#size) {
      this.#lowRow = new Int32Array(this.#size);
      this.#lowValue = new Float64Array(this.#size);
      this.#upCol = new Int32Array(this.#size);
      this.#upValue = new Float64Array(this.#size);
    }
    let low = 0;
    let up = 0;
    for (let k = 0; k < n; k++) {
      this.#lowStart[k] = low;
      for (let e = this.#colHead[k] as number; e >= 0; e = this.#nextInCol[e] as number) {
        const r = this.#row[e] as number;
        if ((this.#stepOf[r] as number) <= k) continue;
        const f = a[r * n + k] as number;
        if (f === 0) continue;
        this.#lowRow[low] = r;
        this.#lowValue[low++] = f;
      }
      const p = this.#pivotRow[k] as number;
      this.#upStart[k] = up;
      this.#diagonal[k] = a[p * n + k] as number;
      for (let q = this.#rowHead[p] as number; q >= 0; q = this.#nextInRow[q] as number) {
        const j = this.#col[q] as number;
        if (j <= k) continue;
        const v = a[p * n + j] as number;
        if (v === 0) continue;
        this.#upCol[up] = j;
        this.#upValue[up++] = v;
      }
    }
    this.#lowStart[n] = low;
    this.#upStart[n] = up;
  }

  /** Solves with the elimination `factor` holds: the solution is returned in `b`. False when it is not finite. */
  substitute(b: Float64Array): boolean {
    if (this.#factored === null) throw new Error("bug: substitute without a factorization");
    const n = this.#n;
    const pivotRow = this.#pivotRow;
    const lowStart = this.#lowStart;
    const lowRow = this.#lowRow;
    const lowValue = this.#lowValue;
    for (let k = 0; k < n; k++) {
      const bp = b[pivotRow[k] as number] as number;
      if (bp === 0) continue;
      const end = lowStart[k + 1] as number;
      for (let e = lowStart[k] as number; e < end; e++) {
        const r = lowRow[e] as number;
        b[r] = (b[r] as number) - (lowValue[e] as number) * bp;
      }
    }
    const x = this.#x;
    const upStart = this.#upStart;
    const upCol = this.#upCol;
    const upValue = this.#upValue;
    for (let k = n - 1; k >= 0; k--) {
      let s = b[pivotRow[k] as number] as number;
      const end = upStart[k + 1] as number;
      for (let e = upStart[k] as number; e < end; e++) s -= (upValue[e] as number) * (x[upCol[e] as number] as number);
      x[k] = s / (this.#diagonal[k] as number);
    }
    for (let k = 0; k < n; k++) if (!Number.isFinite(x[k] as number)) return false;
    b.set(x);
    return true;
  }

  /** Lets the held elimination go: `a` holds nothing outside the pattern again. */
  release(): void {
    if (this.#factored === null) return;
    this.#forgetFill(this.#factored);
    this.#factored = null;
  }

  /** @param keep leave each multiplier where it eliminated (for `substitute`), and solve nothing */
  #eliminate(a: Float64Array, b: Float64Array, keep = false): boolean {
    const n = this.#n;
    const done = this.#done;
    done.fill(0);
    this.#stepOf.fill(n);
    for (let k = 0; k < n; k++) {
      let p = -1;
      let best = 0;
      for (let e = this.#colHead[k] as number; e >= 0; e = this.#nextInCol[e] as number) {
        const r = this.#row[e] as number;
        if (done[r] === 1) continue;
        const v = Math.abs(a[r * n + k] as number);
        if (v > best) {
          best = v;
          p = r;
        }
      }
      if (p < 0 || !Number.isFinite(best)) return false;
      done[p] = 1;
      this.#pivotRow[k] = p;
      this.#stepOf[p] = k;
      const rowP = p * n;
      const pivot = a[rowP + k] as number;
      const bp = b[p] as number;
      // The pivot row is final now and is walked once per row under it: unlink
      // its entries in columns already eliminated (the reset relinks them).
      for (let q = this.#rowHead[p] as number, prev = -1; q >= 0; q = this.#nextInRow[q] as number) {
        if ((this.#col[q] as number) > k) prev = q;
        else if (prev < 0) this.#rowHead[p] = this.#nextInRow[q] as number;
        else this.#nextInRow[prev] = this.#nextInRow[q] as number;
      }
      for (let e = this.#colHead[k] as number; e >= 0; e = this.#nextInCol[e] as number) {
        const r = this.#row[e] as number;
        if (done[r] === 1) continue;
        const rowR = r * n;
        const ark = a[rowR + k] as number;
        if (ark === 0) continue;
        const f = ark / pivot;
        a[rowR + k] = keep ? f : 0;
        for (let q = this.#rowHead[p] as number; q >= 0; q = this.#nextInRow[q] as number) {
          const j = this.#col[q] as number;
          if (j <= k) continue;
          const apj = a[rowP + j] as number;
          if (apj === 0) continue;
          const at = rowR + j;
          if (this.#listed[at] !== 1) this.#add(r, j);
          a[at] = (a[at] as number) - f * apj;
        }
        b[r] = (b[r] as number) - f * bp;
      }
    }
    return keep || this.#backSubstitute(a, b);
  }

  /** Solves the eliminated (upper) system for `b` already reduced; the solution is returned in `b`. */
  #backSubstitute(a: Float64Array, b: Float64Array): boolean {
    const n = this.#n;
    const x = this.#x;
    for (let k = n - 1; k >= 0; k--) {
      const p = this.#pivotRow[k] as number;
      const rowP = p * n;
      let s = b[p] as number;
      for (let q = this.#rowHead[p] as number; q >= 0; q = this.#nextInRow[q] as number) {
        const j = this.#col[q] as number;
        if (j > k) s -= (a[rowP + j] as number) * (x[j] as number);
      }
      x[k] = s / (a[rowP + k] as number);
    }
    for (let k = 0; k < n; k++) if (!Number.isFinite(x[k] as number)) return false;
    b.set(x);
    return true;
  }

  /** Zeroes and unlists the fill-in, so the lists hold the pattern again. */
  #forgetFill(a: Float64Array): void {
    const n = this.#n;
    for (let e = this.#patternSize; e < this.#size; e++) {
      const at = (this.#row[e] as number) * n + (this.#col[e] as number);
      a[at] = 0;
      this.#listed[at] = 0;
    }
    this.#size = this.#patternSize;
    this.#nextInRow.set(this.#patternNextInRow);
    this.#rowHead.set(this.#patternRowHead);
    this.#colHead.set(this.#patternColHead);
  }
}

/**
 * A fill-reducing elimination order for a structurally symmetric pattern:
 * minimum degree (Tinney and Walker's scheme 2, 1967; recalled from memory),
 * ties to the lower index. Each step eliminates the node with the fewest
 * neighbours in the elimination graph and joins those neighbours into a
 * clique, the fill its elimination makes. The graph is held as one bit row
 * per node, so a step costs its neighbours times n / 32 words.
 *
 * @param entries (row, column) pairs; each is taken in both directions, the diagonal ignored
 * @returns `order[k]`, the node eliminated k-th: a permutation of 0 .. n-1
 * @example
 * // A star: the hub (0) last, so no fill at all.
 * minimumDegreeOrder(4, [[0, 1], [0, 2], [0, 3]]); // Int32Array [1, 2, 3, 0]
 */
export function minimumDegreeOrder(n: number, entries: Iterable<readonly [number, number]>): Int32Array {
  return minimumDegree(n, entries).order;
}

/**
 * `minimumDegreeOrder`, with the work its elimination takes: the sum over
 * the steps of the eliminated node's degree squared, the multiply-adds a
 * symmetric elimination in that order does (without pivoting).
 *
 * @example
 * minimumDegree(4, [[0, 1], [0, 2], [0, 3]]).work; // 1 + 1 + 1 + 0: the leaves, then the hub alone
 */
export function minimumDegree(
  n: number,
  entries: Iterable<readonly [number, number]>,
): { readonly order: Int32Array; readonly work: number } {
  const words = (n + 31) >>> 5;
  const adj = new Uint32Array(n * words);
  const set = (r: number, c: number): void => {
    const at = r * words + (c >>> 5);
    adj[at] = (adj[at] as number) | (1 << (c & 31));
  };
  for (const [r, c] of entries) {
    if (r === c) continue;
    set(r, c);
    set(c, r);
  }
  const degree = new Int32Array(n);
  const popcount = (v: number): number => {
    v = v - ((v >>> 1) & 0x55555555);
    v = (v & 0x33333333) + ((v >>> 2) & 0x33333333);
    return (Math.imul((v + (v >>> 4)) & 0x0f0f0f0f, 0x01010101) >>> 24) as number;
  };
  const count = (r: number): number => {
    let s = 0;
    for (let w = r * words, end = w + words; w < end; w++) s += popcount(adj[w] as number);
    return s;
  };
  for (let r = 0; r < n; r++) degree[r] = count(r);
  const gone = new Uint8Array(n);
  const order = new Int32Array(n);
  const nbrs = new Int32Array(n);
  let work = 0;
  for (let k = 0; k < n; k++) {
    let v = -1;
    for (let r = 0; r < n; r++) if (gone[r] === 0 && (v < 0 || (degree[r] as number) < (degree[v] as number))) v = r;
    order[k] = v;
    work += (degree[v] as number) ** 2;
    gone[v] = 1;
    // v's neighbours, then each joined to all the others (and v dropped from each).
    let m = 0;
    const base = v * words;
    for (let w = 0; w < words; w++) {
      let bits = adj[base + w] as number;
      while (bits !== 0) {
        const low = bits & -bits;
        nbrs[m++] = (w << 5) + (31 - Math.clz32(low));
        bits ^= low;
      }
    }
    for (let i = 0; i < m; i++) {
      const u = nbrs[i] as number;
      const ub = u * words;
      for (let w = 0; w < words; w++) adj[ub + w] = (adj[ub + w] as number) | (adj[base + w] as number);
      adj[ub + (u >>> 5)] = (adj[ub + (u >>> 5)] as number) & ~(1 << (u & 31));
      adj[ub + (v >>> 5)] = (adj[ub + (v >>> 5)] as number) & ~(1 << (v & 31));
      degree[u] = count(u);
    }
  }
  return { order, work };
}
