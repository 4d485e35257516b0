import { describe, expect, it } from "vitest";
import { canRedo, canUndo, record, redo, seal, startHistory, undo, UNDO_LIMIT } from "../../../../src/ui/state/undoHistory.ts";

describe("undo history", () => {
  it("undoes and redoes in order", () => {
    let h = startHistory(1);
    h = record(h, 2);
    h = record(h, 3);
    expect(canRedo(h)).toBe(false);
    h = undo(h);
    expect(h.present).toBe(2);
    h = undo(h);
    expect(h.present).toBe(1);
    expect(canUndo(h)).toBe(false);
    expect(undo(h)).toBe(h);
    h = redo(redo(h));
    expect(h.present).toBe(3);
    expect(redo(h)).toBe(h);
  });
  it("drops the redo branch on a new edit", () => {
    let h = record(record(startHistory("a"), "b"), "c");
    h = record(undo(h), "d");
    expect(canRedo(h)).toBe(false);
    expect(undo(h).present).toBe("b");
  });
  it("coalesces a run of edits with the same key into one step", () => {
    let h = startHistory("");
    for (const t of ["1", "12", "123"]) h = record(h, t, "show[0]");
    expect(h.past).toEqual([""]);
    h = record(h, "x", "show[1]");
    expect(undo(h).present).toBe("123");
    expect(undo(undo(h)).present).toBe("");
  });
  it("starts a new step after a seal even with the same key", () => {
    let h = record(startHistory(0), 1, "k");
    h = record(seal(h), 2, "k");
    expect(undo(h).present).toBe(1);
  });
  it("keeps at most the step limit", () => {
    let h = startHistory(0);
    for (let i = 1; i <= UNDO_LIMIT + 50; i++) h = record(h, i);
    expect(h.past).toHaveLength(UNDO_LIMIT);
    expect(h.past[0]).toBe(50);
  });
});
