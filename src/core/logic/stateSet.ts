/**
 * Sets of counter states as bit sets: the states a term is high in, an
 * output's on-set and off-set. A counter has at most 256 states, so a set is
 * a few 32-bit words and intersection, subset and emptiness tests are a
 * handful of word operations.
 */

/** A set of state indices 0..size-1, one bit a state. Treat as immutable once built. */
export type StateSet = Uint32Array;

/** Words needed for `size` states. */
export function setWords(size: number): number {
  return Math.max(1, Math.ceil(size / 32));
}

/** The set holding the given states. */
export function setOf(size: number, states: Iterable<number>): StateSet {
  const s = new Uint32Array(setWords(size));
  for (const k of states) s[k >>> 5] = (s[k >>> 5] as number) | (1 << (k & 31));
  return s;
}

/** The set of all `size` states. */
export function fullSet(size: number): StateSet {
  return setOf(
    size,
    Array.from({ length: size }, (_, k) => k),
  );
}

/** a ∩ b, as a new set. */
export function intersect(a: StateSet, b: StateSet): StateSet {
  const r = new Uint32Array(a.length);
  for (let i = 0; i < a.length; i++) r[i] = (a[i] as number) & (b[i] as number);
  return r;
}

/** The union of sets of `size` states. */
export function union(size: number, sets: readonly StateSet[]): StateSet {
  const r = new Uint32Array(setWords(size));
  for (const s of sets) for (let i = 0; i < r.length; i++) r[i] = (r[i] as number) | (s[i] as number);
  return r;
}

/** True when a ∩ b is empty. */
export function disjoint(a: StateSet, b: StateSet): boolean {
  for (let i = 0; i < a.length; i++) if (((a[i] as number) & (b[i] as number)) !== 0) return false;
  return true;
}

/** True when every state of a is in b. */
export function isSubset(a: StateSet, b: StateSet): boolean {
  for (let i = 0; i < a.length; i++) if (((a[i] as number) & ~(b[i] as number)) !== 0) return false;
  return true;
}

export function isEmpty(a: StateSet): boolean {
  for (let i = 0; i < a.length; i++) if (a[i] !== 0) return false;
  return true;
}

export function sameSet(a: StateSet, b: StateSet): boolean {
  for (let i = 0; i < a.length; i++) if (a[i] !== b[i]) return false;
  return true;
}

export function hasState(a: StateSet, k: number): boolean {
  return (((a[k >>> 5] as number) >>> (k & 31)) & 1) === 1;
}

/** Number of states in the set. */
export function setSize(a: StateSet): number {
  let c = 0;
  for (let i = 0; i < a.length; i++) {
    let w = a[i] as number;
    while (w !== 0) {
      w &= w - 1;
      c++;
    }
  }
  return c;
}

/** The states in the set, ascending. */
export function statesOf(a: StateSet): number[] {
  const out: number[] = [];
  for (let i = 0; i < a.length; i++) {
    let w = a[i] as number;
    while (w !== 0) {
      const b = 31 - Math.clz32(w & -w);
      out.push(i * 32 + b);
      w &= w - 1;
    }
  }
  return out;
}

/** A key that names the set, for maps. */
export function setKey(a: StateSet): string {
  return Array.from(a, (w) => w.toString(36)).join(",");
}
