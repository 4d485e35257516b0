import { describe, expect, it } from "vitest";
import { historyAction, isTextEntry } from "../../../../src/ui/state/undoKeys.ts";

const key = (k: string, mods: Partial<{ ctrlKey: boolean; metaKey: boolean; shiftKey: boolean; altKey: boolean }> = {}) => ({
  key: k,
  ctrlKey: false,
  metaKey: false,
  shiftKey: false,
  altKey: false,
  ...mods,
});

describe("undo keys", () => {
  it("maps Ctrl/Cmd+Z, Ctrl/Cmd+Shift+Z and Ctrl+Y", () => {
    expect(historyAction(key("z", { ctrlKey: true }))).toBe("undo");
    expect(historyAction(key("z", { metaKey: true }))).toBe("undo");
    expect(historyAction(key("Z", { ctrlKey: true, shiftKey: true }))).toBe("redo");
    expect(historyAction(key("z", { metaKey: true, shiftKey: true }))).toBe("redo");
    expect(historyAction(key("y", { ctrlKey: true }))).toBe("redo");
  });
  it("ignores plain keys and other chords", () => {
    expect(historyAction(key("z"))).toBeNull();
    expect(historyAction(key("z", { ctrlKey: true, altKey: true }))).toBeNull();
    expect(historyAction(key("s", { ctrlKey: true }))).toBeNull();
  });
  it("treats text fields as text entry, but not checkboxes or buttons", () => {
    expect(isTextEntry({ tagName: "INPUT", type: "text" })).toBe(true);
    expect(isTextEntry({ tagName: "input", type: "number" })).toBe(true);
    expect(isTextEntry({ tagName: "TEXTAREA" })).toBe(true);
    expect(isTextEntry({ tagName: "DIV", isContentEditable: true })).toBe(true);
    expect(isTextEntry({ tagName: "INPUT", type: "checkbox" })).toBe(false);
    expect(isTextEntry({ tagName: "BUTTON" })).toBe(false);
    expect(isTextEntry(null)).toBe(false);
  });
});
