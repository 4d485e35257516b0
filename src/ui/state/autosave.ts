/**
 * Autosave to a key-value store (localStorage in the browser) in a
 * versioned format, `diodeloom/autosave@1`.
 *
 * Two slots: `current` holds the newest good copy and `previous` the one
 * before it. Only drafts that validate are written. Before a write replaces
 * `current`, a good `current` moves to `previous`; an unreadable one (corrupt,
 * or written by a newer version) is kept aside under `rescued` rather than
 * destroyed. Reading falls back from `current` to `previous`, so one bad entry
 * never loses the last good copy.
 */
import { validateProject } from "../../core/project/projectSchema.ts";
import type { Project } from "../../core/project/project.ts";
import type { Draft } from "./draft.ts";
import { draftFromProject } from "./draft.ts";

export const AUTOSAVE_FORMAT = "diodeloom/autosave@1";

export const AUTOSAVE_KEYS = {
  current: "diodeloom.autosave.current",
  previous: "diodeloom.autosave.previous",
  rescued: "diodeloom.autosave.rescued",
} as const;

/** The part of the Web Storage interface autosave uses. */
export interface KeyValueStore {
  getItem(key: string): string | null;
  setItem(key: string, value: string): void;
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
      readonly project: Project;
      readonly draft: Draft;
      readonly slot: "current" | "previous";
      readonly sequence: number;
      readonly notes: readonly string[];
    }
  | { readonly found: false; readonly notes: readonly string[] };

type Decoded =
  { readonly ok: true; readonly entry: AutosaveEntry; readonly project: Project } | { readonly ok: false; readonly why: string };

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
  const p = validateProject(e.project);
  if (!p.ok) return { ok: false, why: "the saved project does not validate" };
  return { ok: true, entry: { format: AUTOSAVE_FORMAT, sequence: Number(e.sequence) || 0, project: e.project }, project: p.value };
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
    if (d.ok) return { found: true, project: d.project, draft: draftFromProject(d.project), slot, sequence: d.entry.sequence, notes };
    if (d.why !== "empty") notes.push(`the ${slot} autosave was skipped: ${d.why}`);
  }
  return { found: false, notes };
}

/**
 * Writes a validated project as the newest copy. Returns false when the
 * store refuses (full, or disabled); the older copies are then untouched.
 */
export function writeAutosave(store: KeyValueStore, project: Project): boolean {
  try {
    const oldText = store.getItem(AUTOSAVE_KEYS.current);
    const old = decode(oldText);
    const entry: AutosaveEntry = {
      format: AUTOSAVE_FORMAT,
      sequence: old.ok ? old.entry.sequence + 1 : 1,
      project: draftFromProject(project),
    };
    const text = JSON.stringify(entry);
    if (old.ok && oldText === text) return true;
    if (old.ok && oldText !== null) store.setItem(AUTOSAVE_KEYS.previous, oldText);
    else if (oldText !== null) store.setItem(AUTOSAVE_KEYS.rescued, oldText);
    store.setItem(AUTOSAVE_KEYS.current, text);
    return true;
  } catch {
    return false;
  }
}
