import { describe, expect, it } from "vitest";
import { compareGlyphStyles, rowKey, variantChoices, withGlyphs } from "../../../../src/core/compare/glyphStyles.ts";
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
    const r = await compareGlyphStyles(project(["6", "7", "9", "0"]), { settings: { mode: "fast" } });
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

  it("works every row out in the fast mode as the live result would, however many rows share the limit (00-23, two positions)", async () => {
    const { compileSpec } = await import("../../../../src/core/spec/decodeSpec.ts");
    const { synthesize, synthSettings } = await import("../../../../src/core/synth/synthesize.ts");
    const { segmentsOfString } = await import("../../../../src/core/glyphs/glyphs.ts");
    // 14 outputs: a limit shared out would give each of the 8 rows 1 s, and the heuristic a smaller work budget
    // than the live result's (00-23 per-segment: 91 diodes at 1 s, 89 at 8 s).
    const p = project(
      Array.from({ length: 24 }, (_, k) => String(k).padStart(2, "0")),
      { display: { positions: 2 }, synthesis: { depth: "per-segment", timeLimitMs: 8000 } },
    );
    const r = await compareGlyphStyles(p, { settings: { mode: "fast" } });
    if (!r.ok) throw new Error(JSON.stringify(r.error));
    expect(r.value).toHaveLength(8);
    for (const row of r.value) {
      const glyphs = { ...p.glyphs, ...Object.fromEntries(Object.entries(row.glyphs).map(([ch, lit]) => [ch, segmentsOfString(lit)])) };
      const live = await synthesize(compileSpec({ ...p, glyphs }), synthSettings(p, { mode: "fast" }));
      if (!live.ok) throw new Error(JSON.stringify(live.error));
      expect(row.count).toBe(live.value.count);
    }
  }, 120_000);

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

describe("glyphStyles: row status, row by row, and rows already known", () => {
  it("marks heuristic rows 'heuristic' unless proven, and exact rows 'proven' or 'best found'", async () => {
    const p = project(["6", "7", "9", "0"]);
    const fast = await compareGlyphStyles(p, { settings: { mode: "fast" } });
    if (!fast.ok) throw new Error(JSON.stringify(fast.error));
    for (const r of fast.value) expect(r.status).toBe(r.optimal ? "proven" : "heuristic");
    const exact = await compareGlyphStyles(p);
    if (!exact.ok) throw new Error(JSON.stringify(exact.error));
    for (const r of exact.value) expect(r.status).toBe(r.optimal ? "proven" : "best found");
    expect(exact.value.some((r) => r.status === "proven")).toBe(true);
  }, 60_000);

  it("reports each row as it starts and finishes, with the verified matrix of the row", async () => {
    const p = project(["6", "7", "1"]);
    const starts: number[] = [];
    const done: { index: number; total: number; count: number; matrixCount: number | undefined }[] = [];
    const r = await compareGlyphStyles(p, {
      settings: { mode: "fast" },
      onRowStart: (s) => starts.push(s.index),
      onRow: (d) => done.push({ index: d.index, total: d.total, count: d.row.count, matrixCount: d.matrix?.count }),
    });
    if (!r.ok) throw new Error(JSON.stringify(r.error));
    expect(starts).toEqual([0, 1, 2, 3]);
    expect(done.map((d) => [d.index, d.total])).toEqual([
      [0, 4],
      [1, 4],
      [2, 4],
      [3, 4],
    ]);
    for (const d of done) expect(d.matrixCount).toBe(d.count);
  });

  it("takes a proven row it is given as it is, without synthesizing it again", async () => {
    const p = project(["6", "7", "1"]);
    const key = rowKey(p, { "6": "cdefg", "7": "abc" });
    const given = { glyphs: {}, count: 3, lowerBound: 3, optimal: true, status: "proven" as const };
    const starts: string[] = [];
    const r = await compareGlyphStyles(p, {
      settings: { mode: "fast" },
      known: new Map([[key, given]]),
      onRowStart: (s) => starts.push(s.key),
    });
    if (!r.ok) throw new Error(JSON.stringify(r.error));
    expect(starts).toHaveLength(3);
    expect(starts).not.toContain(key);
    const row = r.value.find((x) => x.glyphs["6"] === "cdefg" && x.glyphs["7"] === "abc");
    expect(row).toMatchObject({ count: 3, status: "proven" });
  });

  it("gives a row and the project with that row's glyphs adopted the same key", () => {
    const p = project(["6", "7", "9", "0"]);
    const combo = { "6": "cdefg", "7": "abcf", "9": "abcfg" };
    expect(rowKey(p, combo)).toBe(rowKey(withGlyphs(p, combo)));
    expect(rowKey(p, combo)).not.toBe(rowKey(p));
    // The rules a matrix must keep are part of the key: another depth limit is another problem.
    const deeper = project(["6", "7", "9", "0"], { synthesis: { maxDepth: 3 } });
    expect(rowKey(deeper)).not.toBe(rowKey(p));
  });
});
