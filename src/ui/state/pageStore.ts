/**
 * The page's localStorage as a KeyValueStore. Merely reading
 * `window.localStorage` throws where the browser denies storage (some
 * private modes, blocked site data, sandboxed frames); here every such
 * failure surfaces as a failed read or write, which autosave reports, and
 * never as an exception that would stop the app from starting.
 */
import type { KeyValueStore } from "./autosave.ts";

export function pageStore(): KeyValueStore {
  const storage = (): Storage => window.localStorage;
  return {
    getItem: (key) => storage().getItem(key),
    setItem: (key, value) => storage().setItem(key, value),
    removeItem: (key) => storage().removeItem(key),
  };
}

/** The tab's sessionStorage as a KeyValueStore, with the same care: kept over a reload, not beyond the tab. */
export function sessionPageStore(): KeyValueStore {
  const storage = (): Storage => window.sessionStorage;
  return {
    getItem: (key) => storage().getItem(key),
    setItem: (key, value) => storage().setItem(key, value),
    removeItem: (key) => storage().removeItem(key),
  };
}
