/**
 * The undo history kept over a reload, as `diodeloom/undo@1`.
 *
 * It lives in the tab's session storage: it survives a reload of the page
 * but not the tab, two tabs never mix their histories, and it never takes
 * the room the autosave and the recent list need in local storage. The
 * history is tied to the project the autosave last wrote (`savedKey`): it is
 * given back only when the autosave still holds that project, so a history
 * never lands on another tab's or another version's project. The present
 * step may be a draft that does not validate (someone was fixing a field):
 * it comes back as it was typed.
 *
 * The stored history is bounded in size: the oldest undo steps, then the
 * farthest redo steps, are left out until it fits.
 */
import type { KeyValueStore } from "./autosave.ts";
import type { Draft } from "./draft.ts";
import { singleDraft, type InstrumentDraft } from "./instrumentDraft.ts";
import type { UndoHistory } from "./undoHistory.ts";

/** Format 2 keeps instrument drafts (instrumentDraft.ts); a format-1 history of plain drafts still comes back. */
export const UNDO_STORE_FORMAT = "diodeloom/undo@2";
const UNDO_STORE_FORMAT_V1 = "diodeloom/undo@1";
export const UNDO_STORE_KEY = "diodeloom.undo";
/** Most UTF-16 code units the stored history may take. */
export const UNDO_STORE_MAX_CHARS = 2 * 1024 * 1024;

/**
 * Writes the history, tied to the project the autosave holds (its
 * `projectKey`). Returns false when the store refused it or the present
 * draft alone is too big; the history on screen is unchanged either way.
 */
export function writeUndo(store: KeyValueStore, h: UndoHistory<InstrumentDraft>, savedKey: string): boolean {
  const text = (d: InstrumentDraft) => JSON.stringify(d);
  const present = text(h.present);
  let past = h.past.map(text);
  let future = h.future.map(text);
  const size = () => present.length + savedKey.length + [...past, ...future].reduce((n, t) => n + t.length + 1, 0) + 100;
  while (size() > UNDO_STORE_MAX_CHARS && past.length > 0) past = past.slice(1);
  while (size() > UNDO_STORE_MAX_CHARS && future.length > 0) future = future.slice(0, -1);
  try {
    if (size() > UNDO_STORE_MAX_CHARS) {
      store.removeItem(UNDO_STORE_KEY);
      return false;
    }
    store.setItem(
      UNDO_STORE_KEY,
      `{"format":"${UNDO_STORE_FORMAT}","savedKey":${JSON.stringify(savedKey)},"past":[${past.join(",")}],"present":${present},"future":[${future.join(",")}]}`,
    );
    return true;
  } catch {
    return false;
  }
}

/**
 * The stored history, when it belongs to the project the autosave holds
 * (`savedKey`, its `projectKey`); otherwise null (none, another project's,
 * unreadable or of another format).
 */
export function readUndo(store: KeyValueStore, savedKey: string): UndoHistory<InstrumentDraft> | null {
  let data: unknown;
  try {
    data = JSON.parse(store.getItem(UNDO_STORE_KEY) ?? "null");
  } catch {
    return null;
  }
  if (typeof data !== "object" || data === null) return null;
  const o = data as Record<string, unknown>;
  if ((o.format !== UNDO_STORE_FORMAT && o.format !== UNDO_STORE_FORMAT_V1) || o.savedKey !== savedKey) return null;
  const { past, present, future } = o;
  if (!Array.isArray(past) || !Array.isArray(future)) return null;
  if (o.format === UNDO_STORE_FORMAT_V1) {
    if (!isDraftShape(present) || !past.every(isDraftShape) || !future.every(isDraftShape)) return null;
    return { past: past.map(singleDraft), present: singleDraft(present), future: future.map(singleDraft), lastKey: null };
  }
  if (!isInstrumentDraftShape(present) || !past.every(isInstrumentDraftShape) || !future.every(isInstrumentDraftShape)) return null;
  return { past, present, future, lastKey: null };
}

/** True when a stored value has the instrument draft's shape: a title, the shared electrical section and decoders of draft shape. */
export function isInstrumentDraftShape(x: unknown): x is InstrumentDraft {
  if (!isRecord(x)) return false;
  const { title, electrical, decoders, single } = x;
  return (
    typeof title === "string" &&
    isRecord(electrical) &&
    typeof single === "boolean" &&
    Array.isArray(decoders) &&
    decoders.length > 0 &&
    decoders.every((d) => isRecord(d) && typeof d.name === "string" && isDraftShape(d.draft))
  );
}

const isRecord = (x: unknown): x is Record<string, unknown> => typeof x === "object" && x !== null && !Array.isArray(x);

/**
 * True when a stored value has the draft's shape, so the panels can show it
 * (its values may still be ones the project's checks refuse, as while typing).
 */
export function isDraftShape(x: unknown): x is Draft {
  if (!isRecord(x)) return false;
  const { title, counter, display, glyphs, show, synthesis, electrical } = x;
  return (
    typeof title === "string" &&
    isRecord(counter) &&
    typeof counter.states === "number" &&
    typeof counter.code === "string" &&
    isRecord(display) &&
    typeof display.positions === "number" &&
    typeof display.cell === "string" &&
    isRecord(glyphs) &&
    Array.isArray(show) &&
    show.every((t) => typeof t === "string") &&
    isRecord(synthesis) &&
    isRecord(electrical) &&
    isRecord(electrical.supply)
  );
}
