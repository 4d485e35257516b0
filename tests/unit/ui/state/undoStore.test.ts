import { describe, expect, it } from "vitest";
import { validateInstrument } from "../../../../src/core/project/instrument.ts";
import { projectKey } from "../../../../src/ui/state/autosave.ts";
import { draftFromProject, type Draft } from "../../../../src/ui/state/draft.ts";
import * as edits from "../../../../src/ui/state/draftEdits.ts";
import {
  addDecoder,
  instrumentData,
  projectInstrumentDraft,
  putDecoderDraft,
  singleDraft,
  type InstrumentDraft,
} from "../../../../src/ui/state/instrumentDraft.ts";
import { record, startHistory, undo } from "../../../../src/ui/state/undoHistory.ts";
import {
  isDraftShape,
  isInstrumentDraftShape,
  readUndo,
  UNDO_STORE_KEY,
  UNDO_STORE_MAX_CHARS,
  writeUndo,
} from "../../../../src/ui/state/undoStore.ts";
import { newProject } from "../../../../src/ui/state/examples.ts";
import { memoryStore } from "../../../support/memoryStore.ts";

const base = projectInstrumentDraft(newProject());
/** An edit of the first decoder, as the panels make it. */
const first = (i: InstrumentDraft, change: (d: Draft) => Draft) => putDecoderDraft(i, 0, change(i.decoders[0]!.draft));
const setTitle = (i: InstrumentDraft, title: string) => first(i, (d) => edits.setTitle(d, title));
const setText = (i: InstrumentDraft, state: number, text: string) => first(i, (d) => edits.setText(d, state, text));
const keyOf = (i: InstrumentDraft) => {
  const v = validateInstrument(instrumentData(i));
  if (!v.ok) throw new Error("bad fixture");
  return projectKey(v.value);
};

describe("the undo history over a reload", () => {
  it("gives back the steps, the present and the redo steps for the project the autosave holds", () => {
    const store = memoryStore();
    let h = startHistory(base);
    h = record(h, setTitle(base, "Workshop clock"));
    h = record(h, setText(h.present, 3, "8"));
    h = undo(h);
    expect(writeUndo(store, h, keyOf(h.present))).toBe(true);
    const back = readUndo(store, keyOf(h.present));
    expect(back?.past).toEqual(h.past);
    expect(back?.present).toEqual(h.present);
    expect(back?.future).toEqual(h.future);
    expect(back?.lastKey).toBeNull();
  });

  it("keeps a present draft that does not validate, tied to the last project that did", () => {
    const store = memoryStore();
    const bad = setText(base, 0, "000");
    expect(validateInstrument(instrumentData(bad)).ok).toBe(false);
    const h = record(startHistory(base), bad);
    writeUndo(store, h, keyOf(base));
    expect(readUndo(store, keyOf(base))?.present.decoders[0]?.draft.show[0]).toBe("000");
  });

  it("gives nothing back when the autosave holds another project (another tab, a newer edit)", () => {
    const store = memoryStore();
    const h = record(startHistory(base), setTitle(base, "A"));
    writeUndo(store, h, keyOf(h.present));
    expect(readUndo(store, keyOf(base))).toBeNull();
  });

  it("gives nothing back from an unreadable or foreign entry", () => {
    const store = memoryStore();
    for (const text of [
      "{",
      "null",
      '{"format":"diodeloom/undo@0"}',
      JSON.stringify({ format: "diodeloom/undo@1", savedKey: "k", past: [], present: { title: 1 }, future: [] }),
    ]) {
      store.setItem(UNDO_STORE_KEY, text);
      expect(readUndo(store, "k")).toBeNull();
    }
    const plain = draftFromProject(newProject());
    expect(isDraftShape(plain)).toBe(true);
    expect(isDraftShape({ ...plain, show: [1] })).toBe(false);
    expect(isInstrumentDraftShape(base)).toBe(true);
    expect(isInstrumentDraftShape({ ...base, decoders: [] })).toBe(false);
    expect(isInstrumentDraftShape({ ...base, decoders: [{ name: "a", draft: { ...plain, show: [1] } }] })).toBe(false);
  });

  it("keeps an instrument's decoders, and gives back a history of plain drafts written before instruments (format 1)", () => {
    const store = memoryStore();
    const two = addDecoder(base, draftFromProject(newProject()));
    const h = record(startHistory(base), two);
    writeUndo(store, h, keyOf(two));
    expect(readUndo(store, keyOf(two))?.present.decoders.map((d) => d.name)).toEqual(["main", "decoder 2"]);
    const plain = draftFromProject(newProject());
    const old = { ...plain, title: "Kept over the update" };
    store.setItem(UNDO_STORE_KEY, JSON.stringify({ format: "diodeloom/undo@1", savedKey: "k", past: [plain], present: old, future: [] }));
    const back = readUndo(store, "k");
    expect(back?.present).toEqual(singleDraft(old));
    expect(back?.past).toEqual([singleDraft(plain)]);
  });

  it("leaves out the oldest steps to stay within its size, and keeps the newest", () => {
    const store = memoryStore();
    // Each step carries a title of about 100 000 characters: far more steps than fit.
    let h = startHistory(base);
    for (let i = 0; i < 40; i++) h = record(h, setTitle(base, `${i} ${"x".repeat(100_000)}`));
    expect(writeUndo(store, h, "k")).toBe(true);
    expect((store.getItem(UNDO_STORE_KEY) ?? "").length).toBeLessThanOrEqual(UNDO_STORE_MAX_CHARS);
    const back = readUndo(store, "k");
    expect(back?.present.title.startsWith("39 ")).toBe(true);
    expect(back!.past.length).toBeGreaterThan(5);
    expect(back!.past.length).toBeLessThan(40);
    expect(back!.past[back!.past.length - 1]?.title.startsWith("38 ")).toBe(true);
  });

  it("says so, and never throws, when the store refuses the write", () => {
    const store = memoryStore({ capacityChars: 100 });
    expect(writeUndo(store, startHistory(base), "k")).toBe(false);
  });
});
