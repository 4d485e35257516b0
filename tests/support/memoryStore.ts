import type { KeyValueStore } from "../../src/ui/state/autosave.ts";

/** A quota error as browsers throw it (a DOMException named QuotaExceededError). */
export function quotaError(): Error {
  const e = new Error("The quota has been exceeded.");
  e.name = "QuotaExceededError";
  return e;
}

/**
 * A Web Storage stand-in. With `capacityChars`, it refuses a write that would
 * take the keys and values past that many UTF-16 code units, as browsers
 * count their quota; `used()` tells how many are taken.
 */
export function memoryStore(opts: { capacityChars?: number } = {}): KeyValueStore & { data: Map<string, string>; used(): number } {
  const data = new Map<string, string>();
  const used = () => [...data].reduce((n, [k, v]) => n + k.length + v.length, 0);
  return {
    data,
    used,
    getItem: (k) => data.get(k) ?? null,
    setItem(k, v) {
      const after = used() - (data.has(k) ? k.length + (data.get(k) as string).length : 0) + k.length + v.length;
      if (opts.capacityChars !== undefined && after > opts.capacityChars) throw quotaError();
      data.set(k, v);
    },
    removeItem: (k) => void data.delete(k),
  };
}
