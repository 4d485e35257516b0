import { describe, expect, it } from "vitest";
import { validateProject } from "../../../../src/core/project/projectSchema.ts";
import { draftFromProject, type Draft } from "../../../../src/ui/state/draft.ts";
import {
  addCharacter,
  builtinShape,
  charactersShown,
  sameShapes,
  draftFigure,
  effectiveGlyphs,
  setCell,
  setCounterCode,
  setCounterCodes,
  setCustomSegments,
  setPositions,
  setStates,
  setText,
  setTexts,
  toggleSegment,
} from "../../../../src/ui/state/draftEdits.ts";
import { example, showing } from "../../../support/projects.ts";

const valid = (d: Draft) => {
  const r = validateProject(d);
  if (!r.ok) throw new Error(JSON.stringify(r.error));
  return r.value;
};

describe("draft edits", () => {
  const hex = draftFromProject(example("relay-hex-monitor"));

  it("sets the counter code; a custom code starts from the binary codes, so the project stays valid", () => {
    const binary = setCounterCode(hex, "binary");
    expect(valid(binary).counter).toEqual({ states: 16, drive: "source", code: "binary", codes: [] });
    const custom = setCounterCode(hex, "custom");
    expect(custom.counter.codes?.slice(0, 3)).toEqual(["0000", "0001", "0010"]);
    expect(valid(custom).counter.code).toBe("custom");
    const back = setCounterCode(custom, "johnson");
    expect(back.counter.codes).toBeUndefined();
    expect(valid(back).counter.code).toBe("johnson");
  });

  it("reads a custom code table from text, and the schema names a bad one", () => {
    const gray = setCounterCodes(setCounterCode(setStates(hex, 4), "custom"), "00, 01\n11 10");
    expect(gray.counter.codes).toEqual(["00", "01", "11", "10"]);
    expect(valid(gray).counter.codes).toEqual(["00", "01", "11", "10"]);
    const short = setCounterCodes(gray, "00 01 11");
    const r = validateProject(short);
    expect(!r.ok && r.error[0]?.path).toBe("counter.codes");
  });

  it("sets one text without touching the others", () => {
    const d = setText(hex, 3, "8");
    expect(d.show[3]).toBe("8");
    expect(hex.show[3]).toBe("3");
    expect(valid(d).show[3]).toBe("8");
    expect(() => setText(hex, 16, "1")).toThrow(RangeError);
  });
  it("grows and shrinks the state count with the texts", () => {
    expect(valid(setStates(hex, 18)).show.slice(16)).toEqual([" ", " "]);
    expect(valid(setStates(hex, 10)).show).toHaveLength(10);
    expect(setStates(hex, 1).counter.states).toBe(2);
  });
  it("pads texts on the left when positions grow, and cuts from the left when they shrink", () => {
    const two = setPositions(hex, 2);
    expect(valid(two).show[10]).toBe(" A");
    expect(valid(setPositions(two, 1)).show[10]).toBe("A");
  });
  it("toggles a segment into an override and back out", () => {
    const d = toggleSegment(hex, "7", "f");
    expect(d.glyphs["7"]).toEqual(["a", "b", "c", "f"]);
    expect(valid(d).glyphs["7"]).toEqual(["a", "b", "c", "f"]);
    const back = toggleSegment(d, "7", "f");
    expect(back.glyphs["7"]).toBeUndefined();
  });
  it("switches to a custom cell keeping the shapes in use", () => {
    const d = setCell(hex, "custom");
    const p = valid(d);
    expect(p.display.cell.kind).toBe("custom");
    expect(p.glyphs["8"]).toEqual(["a", "b", "c", "d", "e", "f", "g"]);
    const fewer = setCustomSegments(d, ["a", "b", "c", "d"]);
    expect(valid(fewer).glyphs["8"]).toEqual(["a", "b", "c", "d"]);
    expect(valid(setCell(d, "seg7")).display.cell.kind).toBe("seg7");
  });
  it("lists the characters shown, blank excluded", () => {
    const d = draftFromProject(showing([" 1", "12", " 1."], 2, { display: { positions: 2, cell: "seg7dp" } }));
    expect(charactersShown(d)).toEqual(["1", "2"]);
    expect(effectiveGlyphs(d)["1"]).toEqual(["b", "c"]);
  });
  it("replaces all texts and the state count", () => {
    expect(valid(setTexts(hex, ["0", "1", "2"])).counter.states).toBe(3);
  });
});

describe("draft edits of a custom cell's figure", () => {
  it("gives a cell switched to custom the figure of the seven bars it had, so it keeps its look", () => {
    const d = setCell(draftFromProject(example("relay-hex-monitor")), "custom");
    const v = validateProject(d);
    if (!v.ok) throw new Error(JSON.stringify(v.error));
    const f = v.value.display.cell.figure;
    expect(Object.keys(f?.shapes ?? {})).toEqual(["a", "b", "c", "d", "e", "f", "g"]);
    expect(f?.shapes["a"]).toEqual({
      kind: "bar",
      points: [
        [12, 10],
        [48, 10],
      ],
      width: 8,
    });
    expect(draftFigure(d)).toEqual(f);
  });

  it("keeps the shapes of the names that remain and gives a new name a dot inside the box", () => {
    const d = setCustomSegments(draftFromProject(example("die-roller")), ["tl", "tr", "c", "bl", "br", "x"]);
    const v = validateProject({ ...d, glyphs: { ...d.glyphs, "6": ["tl", "tr", "bl", "br"] } });
    if (!v.ok) throw new Error(JSON.stringify(v.error));
    const shapes = v.value.display.cell.figure?.shapes ?? {};
    expect(Object.keys(shapes)).toEqual(["tl", "tr", "c", "bl", "br", "x"]);
    expect(shapes["c"]).toEqual({ kind: "dot", at: [15, 15], r: 3 });
    expect(shapes["x"]?.kind).toBe("dot");
  });
});

describe("the glyph editor's rules", () => {
  const hex = () => draftFromProject(example("relay-hex-monitor"));

  it("offers the built-in shape back only for a character that has one, never on a custom cell", () => {
    // Before, "Back to built-in shape" showed for every own glyph, "W" and custom cells included.
    expect(builtinShape(hex(), "7")).toEqual(["a", "b", "c"]);
    expect(builtinShape(hex(), "W")).toBeUndefined();
    expect(builtinShape(draftFromProject(example("die-roller")), "1")).toBeUndefined();
    expect(builtinShape(draftFromProject(example("die-roller")), "c")).toBeUndefined();
  });

  it("opens a character that exists for editing and says so, and a new one unlit", () => {
    // Before, adding "P" did nothing and said nothing, and adding "W" made a glyph that lit nothing.
    expect(addCharacter(hex(), "P")).toEqual({ char: "P", message: '"P" has a built-in shape (abefg); it is open for editing' });
    expect(addCharacter(hex(), "b")).toEqual({ char: "b", message: '"b" is already in the project (cdefg); it is open for editing' });
    expect(addCharacter(hex(), "W")).toEqual({ char: "W", message: '"W" is new: click the segments it lights' });
    expect(addCharacter(hex(), "PQ").char).toBeNull();
    expect(addCharacter(hex(), " ").char).toBeNull();
    // A new character gets a glyph entry only once it lights something.
    const lit = toggleSegment(hex(), "W", "b");
    expect(lit.glyphs["W"]).toEqual(["b"]);
  });

  it("warns when two shown characters have the same shape (a 4 edited into the shape of a 9)", () => {
    const d = draftFromProject(showing(["4", "9", "1"]));
    expect(sameShapes(d)).toEqual([]);
    let four = d;
    for (const s of ["a", "d"]) four = toggleSegment(four, "4", s);
    expect(sameShapes(four)).toEqual([{ chars: ["4", "9"], segments: ["a", "b", "c", "d", "f", "g"] }]);
  });

  it("counts a character that lights nothing as the same as a blank the texts show", () => {
    const d = draftFromProject(showing([" 1", " W", "11"], 2, { glyphs: { W: [] } }));
    expect(sameShapes(d)).toEqual([{ chars: [" ", "W"], segments: [] }]);
  });
});
