import { describe, expect, it } from "vitest";
import { AUTOSAVE_KEYS, readAutosave, writeAutosave } from "../../../../src/ui/state/autosave.ts";
import { keepCurrentProject, readRecent, RECENT_KEY, RECENT_MAX, rememberProject } from "../../../../src/ui/state/recentProjects.ts";
import { draftFromProject } from "../../../../src/ui/state/draft.ts";
import { example, showing } from "../../../support/projects.ts";
import { plainInstrument } from "../../../../src/ui/state/instrumentDraft.ts";
import { memoryStore } from "../../../support/memoryStore.ts";

describe("recent projects", () => {
  it("keeps the person's project when a shared one replaces it, over any number of reloads and edits", () => {
    const store = memoryStore();
    const own = showing(["0", "1", "2"], 1, { title: "My lap counter" });
    writeAutosave(store, plainInstrument(showing(["0", "1"], 1, { title: "My lap counter" })));
    writeAutosave(store, plainInstrument(own));
    const shared = example("die-roller");
    // Opening the link: the app keeps the saved project, then saves the shared one. Reloads with the
    // link still in the address bar repeat both steps; edits of the shared project save over it.
    for (let reload = 0; reload < 4; reload++) {
      expect(keepCurrentProject(store, plainInstrument(shared)).ok).toBe(true);
      writeAutosave(store, plainInstrument(shared));
    }
    writeAutosave(store, plainInstrument({ ...shared, title: "Die roller, edited once" }));
    writeAutosave(store, plainInstrument({ ...shared, title: "Die roller, edited twice" }));
    const recent = readRecent(store);
    expect(recent.map((r) => r.title)).toEqual(["My lap counter"]);
    expect(recent[0]?.project).toEqual(plainInstrument(own));
    expect(JSON.parse(store.data.get(AUTOSAVE_KEYS.previous) ?? "").project.title).toBe("Die roller, edited once");
  });

  it("keeps nothing when the incoming project is the saved one, and nothing when none is saved", () => {
    const store = memoryStore();
    expect(keepCurrentProject(store, plainInstrument(showing(["0", "1"])))).toEqual({ ok: true, kept: null });
    writeAutosave(store, plainInstrument(showing(["0", "1"])));
    expect(keepCurrentProject(store, plainInstrument(showing(["0", "1"])))).toEqual({ ok: true, kept: null });
    expect(store.data.has(RECENT_KEY)).toBe(false);
  });

  it("falls back to the previous autosave when the current one is unreadable", () => {
    const store = memoryStore();
    writeAutosave(store, plainInstrument(showing(["4", "2"], 1, { title: "Older" })));
    writeAutosave(store, plainInstrument(showing(["4", "3"], 1, { title: "Newer" })));
    store.data.set(AUTOSAVE_KEYS.current, "{broken");
    const r = keepCurrentProject(store, plainInstrument(example("die-roller")));
    expect(r.ok && r.kept?.title).toBe("Older");
    expect(readAutosave(store).found).toBe(true);
  });

  it("lists each project once, newest first, at most RECENT_MAX, without the one being opened", () => {
    const store = memoryStore();
    const projects = Array.from({ length: RECENT_MAX + 2 }, (_, k) => showing(["0", String(k)], 1, { title: `P${k}` }));
    for (const p of projects) rememberProject(store, plainInstrument(p));
    rememberProject(store, plainInstrument(projects[3]!));
    expect(readRecent(store).map((r) => r.title)).toEqual(["P3", "P6", "P5", "P4", "P2"]);
    rememberProject(store, plainInstrument(projects[0]!), [plainInstrument(projects[6]!)]);
    expect(readRecent(store).map((r) => r.title)).toEqual(["P0", "P3", "P5", "P4", "P2"]);
  });

  it("drops the oldest entries to fit a full store, and fails only when the newest does not fit", () => {
    const a = showing(["0", "1"], 1, { title: "A" });
    const b = showing(["0", "2"], 1, { title: "B" });
    const roomy = memoryStore();
    rememberProject(roomy, plainInstrument(a));
    rememberProject(roomy, plainInstrument(b));
    const twoEntries = roomy.used();
    const tight = memoryStore({ capacityChars: twoEntries - 10 });
    expect(rememberProject(tight, plainInstrument(a)).ok).toBe(true);
    expect(rememberProject(tight, plainInstrument(b)).ok).toBe(true);
    expect(readRecent(tight).map((r) => r.title)).toEqual(["B"]);
    const tiny = memoryStore({ capacityChars: 50 });
    const r = rememberProject(tiny, plainInstrument(a));
    expect(r.ok).toBe(false);
    expect(!r.ok && r.reason).toBe("full");
  });

  it("ignores a stored list of another format or with entries that do not validate", () => {
    const store = memoryStore();
    store.data.set(RECENT_KEY, JSON.stringify({ format: "diodeloom/recent@9", projects: [] }));
    expect(readRecent(store)).toEqual([]);
    store.data.set(
      RECENT_KEY,
      JSON.stringify({ format: "diodeloom/recent@1", projects: [{ schema: "nope" }, draftFromProject(example("die-roller"))] }),
    );
    expect(readRecent(store).map((r) => r.title)).toEqual([example("die-roller").title]);
    store.data.set(RECENT_KEY, "{");
    expect(readRecent(store)).toEqual([]);
  });
});
