import { describe, expect, it } from "vitest";
import { compareGlyphStyles, variantChoices } from "../../../../src/core/compare/glyphStyles.ts";
import { parseProject } from "../../../../src/core/project/projectSchema.ts";

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

describe("glyphStyles against single runs", () => {
  it("works every row out as a synth run of that glyph set would (0-9, per-segment)", async () => {
    const { compileSpec } = await import("../../../../src/core/spec/decodeSpec.ts");
    const { synthesize, synthSettings } = await import("../../../../src/core/synth/synthesize.ts");
    const { segmentsOfString } = await import("../../../../src/core/glyphs/glyphs.ts");
    const p = project([..."0123456789"]);
    const r = await compareGlyphStyles(p);
    if (!r.ok) throw new Error(JSON.stringify(r.error));
    expect(r.value).toHaveLength(8);
    for (const row of r.value) {
      const glyphs = { ...p.glyphs, ...Object.fromEntries(Object.entries(row.glyphs).map(([ch, lit]) => [ch, segmentsOfString(lit)])) };
      const single = await synthesize(compileSpec({ ...p, glyphs }), synthSettings(p));
      if (!single.ok) throw new Error(JSON.stringify(single.error));
      expect([row.count, row.optimal]).toEqual([single.value.count, single.value.optimal]);
    }
  });

  it("gives the hex monitor's own glyphs the proven count a synth run gives (0-F, per-segment)", async () => {
    const { compileSpec } = await import("../../../../src/core/spec/decodeSpec.ts");
    const { synthesize, synthSettings } = await import("../../../../src/core/synth/synthesize.ts");
    const { example } = await import("../../../support/projects.ts");
    const p = example("relay-hex-monitor");
    const single = await synthesize(compileSpec(p), synthSettings(p));
    if (!single.ok) throw new Error(JSON.stringify(single.error));
    const r = await compareGlyphStyles(p);
    if (!r.ok) throw new Error(JSON.stringify(r.error));
    const own = r.value.find((row) => row.glyphs["6"] === "acdefg" && row.glyphs["7"] === "abc" && row.glyphs["9"] === "abcdfg");
    expect(own && [own.count, own.optimal]).toEqual([single.value.count, single.value.optimal]);
    expect(single.value.optimal).toBe(true);
  }, 120_000);
});
