/**
 * Recent projects: the projects the app had open before another one
 * replaced them from outside (a share link, an opened file, a recent
 * project), newest first, so that opening something never loses the
 * person's own work. Stored as `diodeloom/recent@1` beside the autosave.
 *
 * The list is short and bounded in size as well as in count, so it can
 * never take the room the autosave needs.
 */
import { validateInstrument, type Instrument } from "../../core/project/instrument.ts";
import { projectKey, readAutosave, storeFailure, type KeyValueStore, type StoreFailure } from "./autosave.ts";

export const RECENT_FORMAT = "diodeloom/recent@1";
export const RECENT_KEY = "diodeloom.recent";
/** Most projects in the list. */
export const RECENT_MAX = 5;
/** Most UTF-16 code units the stored list may take. */
export const RECENT_MAX_CHARS = 1024 * 1024;

export interface RecentProject {
  readonly title: string;
  /** A plain project or an instrument of several decoders. */
  readonly project: Instrument;
}

/** The stored list, newest first; entries that no longer validate are left out. */
export function readRecent(store: KeyValueStore): RecentProject[] {
  let data: unknown;
  try {
    data = JSON.parse(store.getItem(RECENT_KEY) ?? "null");
  } catch {
    return [];
  }
  if (typeof data !== "object" || data === null || (data as { format?: unknown }).format !== RECENT_FORMAT) return [];
  const entries = (data as { projects?: unknown }).projects;
  if (!Array.isArray(entries)) return [];
  const out: RecentProject[] = [];
  for (const e of entries) {
    const p = validateInstrument(e);
    if (p.ok) out.push({ title: p.value.title, project: p.value });
  }
  return out;
}

function writeList(store: KeyValueStore, projects: readonly Instrument[]): void {
  store.setItem(RECENT_KEY, JSON.stringify({ format: RECENT_FORMAT, projects: projects.map((p) => JSON.parse(projectKey(p))) }));
}

/**
 * Puts a project at the top of the list (once: an equal project further down
 * moves up), then drops the oldest beyond `RECENT_MAX` or beyond
 * `RECENT_MAX_CHARS`, and, when the store is full, as many more of the oldest
 * as it takes. Fails only when not even this project fits.
 *
 * @example
 * const kept = rememberProject(localStorage, project);
 * if (!kept.ok) offerDownload(project, kept.message);
 */
export function rememberProject(
  store: KeyValueStore,
  project: Instrument,
  without: readonly Instrument[] = [],
): { readonly ok: true } | ({ readonly ok: false } & StoreFailure) {
  const key = projectKey(project);
  const drop = new Set([key, ...without.map(projectKey)]);
  let list = [
    project,
    ...readRecent(store)
      .map((r) => r.project)
      .filter((p) => !drop.has(projectKey(p))),
  ].slice(0, RECENT_MAX);
  while (list.length > 1 && list.reduce((n, p) => n + projectKey(p).length, 0) > RECENT_MAX_CHARS) list = list.slice(0, -1);
  for (;;) {
    try {
      writeList(store, list);
      return { ok: true };
    } catch (e) {
      if (list.length <= 1) return { ok: false, ...storeFailure(e) };
      list = list.slice(0, -1);
    }
  }
}

/**
 * Before another project replaces the one on screen: keeps the newest
 * autosaved project in the recent list, unless it is the incoming one. The
 * saved copy is the person's last valid state, also while a draft on screen
 * is invalid.
 */
export function keepCurrentProject(
  store: KeyValueStore,
  incoming: Instrument,
): { readonly ok: true; readonly kept: Instrument | null } | ({ readonly ok: false; readonly kept: Instrument } & StoreFailure) {
  const saved = readAutosave(store);
  const current = saved.found ? saved.project : null;
  if (!current || projectKey(current) === projectKey(incoming)) return { ok: true, kept: null };
  const r = rememberProject(store, current, [incoming]);
  return r.ok ? { ok: true, kept: current } : { ...r, kept: current };
}
