import { describe, expect, it } from "vitest";
import { parseProject, validateProject } from "../../../../src/core/project/projectSchema.ts";
import { draftFromProject, draftToJson } from "../../../../src/ui/state/draft.ts";
import { serializeProject } from "../../../../src/core/project/projectWriter.ts";
import { EXAMPLES, example, makeProject } from "../../../support/projects.ts";

function showingDp() {
  return makeProject({ counter: { states: 2 }, display: { cell: "seg7dp" }, glyphs: { "7": "abc." }, show: ["7", "1"] });
}

describe("draft", () => {
  it.each(EXAMPLES)("round-trips the %s example through the draft and its JSON", (name) => {
    const p = example(name);
    const d = draftFromProject(p);
    const v = validateProject(d);
    expect(v.ok && v.value).toEqual(p);
    const again = parseProject(draftToJson(d));
    expect(again.ok && again.value).toEqual(p);
  });
  it.each(EXAMPLES)("saves the %s example in the same form, byte for byte, as the Project JSON export", (name) => {
    // Before, Save wrote seven-segment glyphs as strings ("cdefg") and the export as arrays.
    const p = example(name);
    expect(draftToJson(draftFromProject(p))).toBe(serializeProject(p));
  });
  it("writes glyph overrides as arrays of segment names, the one form for every cell", () => {
    const json = JSON.parse(draftToJson(draftFromProject(example("relay-hex-monitor"))));
    expect(json.glyphs).toEqual({ b: ["c", "d", "e", "f", "g"] });
    const dp = showingDp();
    expect(JSON.parse(draftToJson(draftFromProject(dp))).glyphs).toEqual({ "7": ["a", "b", "c", "dp"] });
  });
  it("writes a draft that does not validate as it stands, in the same form", () => {
    const d = { ...draftFromProject(example("relay-hex-monitor")), show: ["0"] };
    expect(JSON.parse(draftToJson(d)).show).toEqual(["0"]);
    expect(JSON.parse(draftToJson(d)).glyphs).toEqual({ b: ["c", "d", "e", "f", "g"] });
  });
});
