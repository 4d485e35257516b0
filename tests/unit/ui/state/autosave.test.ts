import { describe, expect, it } from "vitest";
import {
  AUTOSAVE_FORMAT,
  AUTOSAVE_KEYS,
  RESCUE_MAX_CHARS,
  readAutosave,
  writeAutosave,
  type KeyValueStore,
} from "../../../../src/ui/state/autosave.ts";
import { example, showing } from "../../../support/projects.ts";
import { plainInstrument } from "../../../../src/ui/state/instrumentDraft.ts";
import { memoryStore, quotaError } from "../../../support/memoryStore.ts";

/** The project in a slot, as its show list (enough to tell the fixtures apart). */
function slotShow(store: ReturnType<typeof memoryStore>, slot: keyof typeof AUTOSAVE_KEYS): unknown {
  const text = store.data.get(AUTOSAVE_KEYS[slot]);
  return text === undefined ? undefined : JSON.parse(text).project.show;
}

describe("autosave", () => {
  it("reads back what it wrote", () => {
    const store = memoryStore();
    const w = writeAutosave(store, plainInstrument(example("relay-hex-monitor")));
    expect(w).toEqual({ ok: true, wrote: true, notes: [] });
    const r = readAutosave(store);
    expect(r.found).toBe(true);
    if (r.found) {
      expect(r.slot).toBe("current");
      expect(r.project).toEqual(plainInstrument(example("relay-hex-monitor")));
    }
    const entry = JSON.parse(store.data.get(AUTOSAVE_KEYS.current) ?? "");
    expect(entry.format).toBe(AUTOSAVE_FORMAT);
  });
  it("keeps the previous good copy and falls back to it when the newest is corrupt", () => {
    const store = memoryStore();
    writeAutosave(store, plainInstrument(showing(["0", "1"])));
    writeAutosave(store, plainInstrument(showing(["0", "1", "2"])));
    store.data.set(AUTOSAVE_KEYS.current, '{"format":"diodeloom/autosave@1","proj');
    const r = readAutosave(store);
    expect(r.found).toBe(true);
    if (r.found) {
      expect(r.slot).toBe("previous");
      expect(r.project.decoders[0]?.project.show).toEqual(["0", "1"]);
      expect(r.notes.join()).toMatch(/current autosave was skipped/);
    }
  });
  it("keeps the last good copy distinct from the current one over any number of reloads", () => {
    const store = memoryStore();
    writeAutosave(store, plainInstrument(showing(["0", "1"])));
    writeAutosave(store, plainInstrument(showing(["0", "1", "2"])));
    // A reload reads the newest copy and saves the same project again, as the page does on start.
    for (let reload = 0; reload < 5; reload++) {
      const r = readAutosave(store);
      if (!r.found) throw new Error("nothing saved");
      expect(writeAutosave(store, r.project)).toEqual({ ok: true, wrote: false, notes: [] });
    }
    expect(slotShow(store, "current")).toEqual(["0", "1", "2"]);
    expect(slotShow(store, "previous")).toEqual(["0", "1"]);
    // The next real change moves the current copy down, as before.
    writeAutosave(store, plainInstrument(showing(["0", "1", "2", "3"])));
    expect(slotShow(store, "previous")).toEqual(["0", "1", "2"]);
  });
  it("never overwrites the last good copy with a corrupt one, and keeps the unreadable entry aside", () => {
    const store = memoryStore();
    writeAutosave(store, plainInstrument(showing(["0", "1"])));
    store.data.set(AUTOSAVE_KEYS.current, "garbage");
    writeAutosave(store, plainInstrument(showing(["7", "8"])));
    expect(store.data.get(AUTOSAVE_KEYS.rescued)).toBe("garbage");
    const r = readAutosave(store);
    expect(r.found && r.project.decoders[0]?.project.show).toEqual(["7", "8"]);
  });
  it("never lets a rescue copy fill the quota: too large to be a project, it is not kept", () => {
    // 3 M code units of junk in `current` on a 5 M quota: a copy would leave no room for the save.
    const store = memoryStore({ capacityChars: 5_000_000 });
    store.data.set(AUTOSAVE_KEYS.current, "x".repeat(3_000_000));
    const w = writeAutosave(store, plainInstrument(showing(["7", "8"])));
    expect(w.ok).toBe(true);
    expect(w.ok && w.notes.join()).toMatch(/too large to be a project/);
    expect(store.data.has(AUTOSAVE_KEYS.rescued)).toBe(false);
    expect(slotShow(store, "current")).toEqual(["7", "8"]);
    expect(store.used()).toBeLessThan(5_000_000);
  });
  it("gives up a rescue copy, never the newest work, when the store is nearly full", () => {
    // An unreadable entry that may be a project fits aside, but then the save itself would not.
    const junk = "y".repeat(RESCUE_MAX_CHARS - 100);
    const store = memoryStore({ capacityChars: 2 * junk.length + 200 });
    store.data.set(AUTOSAVE_KEYS.current, junk);
    const w = writeAutosave(store, plainInstrument(showing(["7", "8"])));
    expect(w.ok).toBe(true);
    expect(slotShow(store, "current")).toEqual(["7", "8"]);
    expect(store.used()).toBeLessThanOrEqual(2 * junk.length + 200);
  });
  it("rejects an entry whose project does not validate, or of another format version", () => {
    const store = memoryStore();
    store.data.set(
      AUTOSAVE_KEYS.current,
      JSON.stringify({ format: AUTOSAVE_FORMAT, sequence: 1, project: { schema: "diodeloom/project@1" } }),
    );
    store.data.set(AUTOSAVE_KEYS.previous, JSON.stringify({ format: "diodeloom/autosave@9", sequence: 1, project: {} }));
    const r = readAutosave(store);
    expect(r.found).toBe(false);
    expect(r.notes).toHaveLength(2);
  });
  it("says whether the store is full or refuses, without throwing", () => {
    const full = memoryStore({ capacityChars: 100 });
    expect(writeAutosave(full, plainInstrument(showing(["0", "1"])))).toEqual({
      ok: false,
      reason: "full",
      message: "the browser's storage for this page is full",
    });
    const refusing: KeyValueStore = {
      getItem: () => null,
      setItem: () => {
        throw new DOMException("The operation is insecure.", "SecurityError");
      },
      removeItem: () => {},
    };
    const r = writeAutosave(refusing, plainInstrument(showing(["0", "1"])));
    expect(r.ok).toBe(false);
    expect(!r.ok && r.reason).toBe("refused");
    expect(!r.ok && r.message).toMatch(/does not let this page store data/);
    expect(quotaError().name).toBe("QuotaExceededError");
  });
});
