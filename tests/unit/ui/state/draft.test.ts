import { describe, expect, it } from "vitest";
import { parseProject, validateProject } from "../../../../src/core/project/projectSchema.ts";
import { draftFromProject, draftToJson } from "../../../../src/ui/state/draft.ts";
import { EXAMPLES, example } from "../../../support/projects.ts";

describe("draft", () => {
  it.each(EXAMPLES)("round-trips the %s example through the draft and its JSON", (name) => {
    const p = example(name);
    const d = draftFromProject(p);
    const v = validateProject(d);
    expect(v.ok && v.value).toEqual(p);
    const again = parseProject(draftToJson(d));
    expect(again.ok && again.value).toEqual(p);
  });
  it("writes seven-segment glyph overrides as lit-segment strings", () => {
    const json = JSON.parse(draftToJson(draftFromProject(example("relay-hex-monitor"))));
    expect(json.glyphs).toEqual({ b: "cdefg" });
  });
});
