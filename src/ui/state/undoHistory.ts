/**
 * Undo and redo as an immutable history of values.
 *
 * Typing into one field would otherwise push one step per key; an edit may
 * carry a coalescing key (such as `show[3]`), and consecutive edits with the
 * same key replace the newest step instead of adding one. No clock is read,
 * so the same edits always give the same history.
 */

export interface UndoHistory<T> {
  readonly past: readonly T[];
  readonly present: T;
  readonly future: readonly T[];
  /** Coalescing key of the edit that made `present`, or null. */
  readonly lastKey: string | null;
}

/** Steps kept before the oldest is forgotten. */
export const UNDO_LIMIT = 200;

export function startHistory<T>(present: T): UndoHistory<T> {
  return { past: [], present, future: [], lastKey: null };
}

/**
 * Records a new present value. With a key equal to the last edit's key the
 * newest step is replaced (one undo step for a run of typing).
 *
 * @example
 * let h = startHistory("a");
 * h = record(h, "ab", "title"); h = record(h, "abc", "title");
 * undo(h).present; // "a"
 */
export function record<T>(h: UndoHistory<T>, next: T, key: string | null = null): UndoHistory<T> {
  if (key !== null && key === h.lastKey) return { ...h, present: next, future: [] };
  const past = [...h.past, h.present];
  return { past: past.slice(Math.max(0, past.length - UNDO_LIMIT)), present: next, future: [], lastKey: key };
}

/** Ends a run of coalesced edits, so the next edit makes a step of its own. */
export function seal<T>(h: UndoHistory<T>): UndoHistory<T> {
  return h.lastKey === null ? h : { ...h, lastKey: null };
}

export function canUndo<T>(h: UndoHistory<T>): boolean {
  return h.past.length > 0;
}

export function canRedo<T>(h: UndoHistory<T>): boolean {
  return h.future.length > 0;
}

export function undo<T>(h: UndoHistory<T>): UndoHistory<T> {
  const prev = h.past[h.past.length - 1];
  if (prev === undefined) return h;
  return { past: h.past.slice(0, -1), present: prev, future: [h.present, ...h.future], lastKey: null };
}

export function redo<T>(h: UndoHistory<T>): UndoHistory<T> {
  const next = h.future[0];
  if (next === undefined) return h;
  return { past: [...h.past, h.present], present: next, future: h.future.slice(1), lastKey: null };
}
