import { describe, expect, it } from "vitest";
import { AUTOSAVE_FORMAT, AUTOSAVE_KEYS, readAutosave, writeAutosave, type KeyValueStore } from "../../../../src/ui/state/autosave.ts";
import { example, showing } from "../../../support/projects.ts";

function memoryStore(): KeyValueStore & { data: Map<string, string> } {
  const data = new Map<string, string>();
  return { data, getItem: (k) => data.get(k) ?? null, setItem: (k, v) => void data.set(k, v) };
}

describe("autosave", () => {
  it("reads back what it wrote", () => {
    const store = memoryStore();
    expect(writeAutosave(store, example("relay-hex-monitor"))).toBe(true);
    const r = readAutosave(store);
    expect(r.found).toBe(true);
    if (r.found) {
      expect(r.slot).toBe("current");
      expect(r.project).toEqual(example("relay-hex-monitor"));
    }
    const entry = JSON.parse(store.data.get(AUTOSAVE_KEYS.current) ?? "");
    expect(entry.format).toBe(AUTOSAVE_FORMAT);
  });
  it("keeps the previous good copy and falls back to it when the newest is corrupt", () => {
    const store = memoryStore();
    writeAutosave(store, showing(["0", "1"]));
    writeAutosave(store, showing(["0", "1", "2"]));
    store.data.set(AUTOSAVE_KEYS.current, '{"format":"diodeloom/autosave@1","proj');
    const r = readAutosave(store);
    expect(r.found).toBe(true);
    if (r.found) {
      expect(r.slot).toBe("previous");
      expect(r.project.show).toEqual(["0", "1"]);
      expect(r.notes.join()).toMatch(/current autosave was skipped/);
    }
  });
  it("never overwrites the last good copy with a corrupt one, and keeps the unreadable entry aside", () => {
    const store = memoryStore();
    writeAutosave(store, showing(["0", "1"]));
    store.data.set(AUTOSAVE_KEYS.current, "garbage");
    writeAutosave(store, showing(["7", "8"]));
    expect(store.data.get(AUTOSAVE_KEYS.rescued)).toBe("garbage");
    const r = readAutosave(store);
    expect(r.found && r.project.show).toEqual(["7", "8"]);
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
  it("reports a refusing store without throwing", () => {
    const store: KeyValueStore = {
      getItem: () => null,
      setItem: () => {
        throw new Error("QuotaExceededError");
      },
    };
    expect(writeAutosave(store, showing(["0", "1"]))).toBe(false);
  });
});
