/**
 * Autosave to a key-value store (localStorage in the browser) in a
 * versioned format, `diodeloom/autosave@1`.
 *
 * Two slots: `current` holds the newest good copy and `previous` the last
 * good copy that differs from it. Only drafts that validate are written, and
 * only when the project changed: reloading the page writes the same project
 * again, which must not push the last good copy out of `previous`. Before a
 * write replaces `current`, a good `current` moves to `previous`; an
 * unreadable one (corrupt, or written by a newer version) is kept aside under
 * `rescued` rather than destroyed, unless it is too large to be a project, so
 * that a rescue can never take the room the user's own saves need. Reading
 * falls back from `current` to `previous`, so one bad entry never loses the
 * last good copy.
 *
 * The project may be an instrument of several decoders; a plain project is
 * written in the single-decoder form, as before instruments, so an autosave
 * of either kind opens in this version and a plain one in older ones.
 *
 * Projects replaced by another one from outside (a share link, a file, a
 * recent project) live on in the recent list (recentProjects.ts).
 */
import { LIMITS } from "../../core/project/limits.ts";
import { validateInstrument, type Instrument } from "../../core/project/instrument.ts";
import { instrumentData, instrumentDraftOf, type InstrumentDraft } from "./instrumentDraft.ts";

export const AUTOSAVE_FORMAT = "diodeloom/autosave@1";

export const AUTOSAVE_KEYS = {
  current: "diodeloom.autosave.current",
  previous: "diodeloom.autosave.previous",
  rescued: "diodeloom.autosave.rescued",
} as const;

/**
 * The longest unreadable entry kept aside, UTF-16 code units (what browsers
 * count against the storage quota). An entry this app wrote holds one project
 * of at most 1 MiB; anything longer is not one, and keeping it would only use
 * up the quota.
 */
export const RESCUE_MAX_CHARS = LIMITS.fileBytes;

/** The part of the Web Storage interface autosave uses. */
export interface KeyValueStore {
  getItem(key: string): string | null;
  setItem(key: string, value: string): void;
  removeItem(key: string): void;
}

interface AutosaveEntry {
  readonly format: typeof AUTOSAVE_FORMAT;
  /** Counts writes, so the newer of two copies is known without a clock. */
  readonly sequence: number;
  readonly project: unknown;
}

export type AutosaveRead =
  | {
      readonly found: true;
      readonly project: Instrument;
      readonly draft: InstrumentDraft;
      readonly slot: "current" | "previous";
      readonly sequence: number;
      readonly notes: readonly string[];
    }
  | { readonly found: false; readonly notes: readonly string[] };

/** Why a store refused a write: `full` (the quota) or `refused` (storage disabled or denied). */
export type StoreFailure = { readonly reason: "full" | "refused"; readonly message: string };

export type AutosaveWrite =
  | {
      readonly ok: true;
      /** False when the store already held this project (a reload, an undo back to it). */
      readonly wrote: boolean;
      readonly notes: readonly string[];
    }
  | ({ readonly ok: false } & StoreFailure);

type Decoded =
  { readonly ok: true; readonly entry: AutosaveEntry; readonly project: Instrument } | { readonly ok: false; readonly why: string };

function decode(text: string | null): Decoded {
  if (text === null) return { ok: false, why: "empty" };
  let data: unknown;
  try {
    data = JSON.parse(text);
  } catch {
    return { ok: false, why: "not valid JSON" };
  }
  if (typeof data !== "object" || data === null) return { ok: false, why: "not an autosave entry" };
  const e = data as Partial<AutosaveEntry>;
  if (e.format !== AUTOSAVE_FORMAT) return { ok: false, why: `format ${JSON.stringify(e.format)} is not ${AUTOSAVE_FORMAT}` };
  const p = validateInstrument(e.project);
  if (!p.ok) return { ok: false, why: "the saved project does not validate" };
  return { ok: true, entry: { format: AUTOSAVE_FORMAT, sequence: Number(e.sequence) || 0, project: e.project }, project: p.value };
}

/**
 * The project (a plain one or an instrument) as the text autosave compares
 * and stores: equal texts, same project. A plain project's is its draft's,
 * as before instruments, so an undo history tied to it still comes back.
 */
export function projectKey(project: Instrument): string {
  return JSON.stringify(instrumentData(instrumentDraftOf(project)));
}

/**
 * What a failed `setItem` means for the person: a full quota, or a browser
 * that refuses storage (private mode, a setting, a sandboxed frame).
 */
export function storeFailure(e: unknown): StoreFailure {
  const name = typeof e === "object" && e !== null && "name" in e ? String((e as { name: unknown }).name) : "";
  const code = typeof e === "object" && e !== null && "code" in e ? Number((e as { code: unknown }).code) : NaN;
  if (name === "QuotaExceededError" || name === "NS_ERROR_DOM_QUOTA_REACHED" || code === 22 || code === 1014) {
    return { reason: "full", message: "the browser's storage for this page is full" };
  }
  return { reason: "refused", message: "the browser does not let this page store data (private mode, or a site setting)" };
}

/** Reads the newest good copy, falling back to the previous one. */
export function readAutosave(store: KeyValueStore): AutosaveRead {
  const notes: string[] = [];
  for (const slot of ["current", "previous"] as const) {
    let text: string | null = null;
    try {
      text = store.getItem(AUTOSAVE_KEYS[slot]);
    } catch {
      notes.push(`the ${slot} autosave could not be read`);
      continue;
    }
    const d = decode(text);
    if (d.ok) return { found: true, project: d.project, draft: instrumentDraftOf(d.project), slot, sequence: d.entry.sequence, notes };
    if (d.why !== "empty") notes.push(`the ${slot} autosave was skipped: ${d.why}`);
  }
  return { found: false, notes };
}

/**
 * Writes a validated project as the newest copy, unless the store holds it
 * already. When the store refuses, the result says why; the copies already
 * stored are then as they were (or `previous` holds the old `current`).
 *
 * @example
 * const w = writeAutosave(localStorage, project);
 * if (!w.ok) showNotice(`not saved: ${w.message}`);
 */
export function writeAutosave(store: KeyValueStore, project: Instrument): AutosaveWrite {
  const notes: string[] = [];
  try {
    const oldText = store.getItem(AUTOSAVE_KEYS.current);
    const old = decode(oldText);
    const key = projectKey(project);
    if (old.ok && projectKey(old.project) === key) return { ok: true, wrote: false, notes };
    const text = JSON.stringify({ format: AUTOSAVE_FORMAT, sequence: old.ok ? old.entry.sequence + 1 : 1, project: JSON.parse(key) });
    let rescued = false;
    if (old.ok && oldText !== null) store.setItem(AUTOSAVE_KEYS.previous, oldText);
    else if (oldText !== null) rescued = rescue(store, oldText, notes);
    try {
      store.setItem(AUTOSAVE_KEYS.current, text);
    } catch (e) {
      if (!rescued) throw e;
      // The rescue must never be what keeps the user's newest work out.
      store.removeItem(AUTOSAVE_KEYS.rescued);
      notes.push("an unreadable autosave kept aside was dropped to make room");
      store.setItem(AUTOSAVE_KEYS.current, text);
    }
    return { ok: true, wrote: true, notes };
  } catch (e) {
    return { ok: false, ...storeFailure(e) };
  }
}

/** Keeps an unreadable current entry aside, if it may be a project and there is room; never fails the save. */
function rescue(store: KeyValueStore, text: string, notes: string[]): boolean {
  if (text.length > RESCUE_MAX_CHARS) {
    notes.push(`an unreadable autosave of ${text.length} characters was replaced; it was too large to be a project`);
    return false;
  }
  try {
    store.setItem(AUTOSAVE_KEYS.rescued, text);
    return true;
  } catch {
    // An older rescue is the first thing to give up for room.
  }
  try {
    store.removeItem(AUTOSAVE_KEYS.rescued);
    store.setItem(AUTOSAVE_KEYS.rescued, text);
    return true;
  } catch (e) {
    notes.push(`an unreadable autosave was replaced without a copy: ${storeFailure(e).message}`);
    return false;
  }
}
