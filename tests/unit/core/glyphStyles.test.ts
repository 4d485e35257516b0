import { describe, expect, it } from "vitest";
import { compareGlyphStyles, variantChoices } from "../../../src/core/glyphStyles.ts";
import { parseProject } from "../../../src/core/projectSchema.ts";

function project(show: string[], extra: object = {}) {
  const r = parseProject(JSON.stringify({ schema: "diodeloom/project@1", counter: { states: show.length }, display: {}, show, ...extra }));
  if (!r.ok) throw new Error(JSON.stringify(r.error));
  return r.value;
}

describe("glyphStyles", () => {
  it("varies only the shown characters that have built-in variants", () => {
    expect(variantChoices(project(["6", "7", "8"])).map((c) => c.char)).toEqual(["6", "7"]);
    expect(variantChoices(project(["1", "2"]))).toEqual([]);
  });
  it("keeps a file's own glyph as an option", () => {
    const c = variantChoices(project(["7", "1"], { glyphs: { "7": "abcfg" } }));
    expect(c[0]?.options).toEqual(["abcfg", "abc", "abcf"]);
  });
  it("sorts combinations by count, best first", async () => {
    const r = await compareGlyphStyles(project(["6", "7", "9", "0"]), { mode: "fast" });
    expect(r.ok).toBe(true);
    if (!r.ok) return;
    expect(r.value).toHaveLength(8);
    for (let i = 1; i < r.value.length; i++) expect(r.value[i - 1]!.count).toBeLessThanOrEqual(r.value[i]!.count);
  });
});
