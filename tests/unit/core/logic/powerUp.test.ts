import { describe, expect, it } from "vitest";
import { glyphNamer, powerUpTable, powerUpText, POWER_UP_MAX_STAGES } from "../../../../src/core/logic/powerUp.ts";
import { synthesizeCoded } from "../../../../src/core/logic/synthesizeCoded.ts";
import { synthesize } from "../../../../src/core/synth/synthesize.ts";
import { codedProject, customProject, exactSettings, specOf } from "../../../support/codedProjects.ts";
import { decoderLights } from "../../../support/logicCheck.ts";
import { makeProject } from "../../../support/projects.ts";
import type { DiodeMatrix } from "../../../../src/core/matrix/matrix.ts";

describe("powerUpTable", () => {
  it("lists every code BCD never reaches, each lighting what the decoder's logic lights", async () => {
    const project = codedProject("binary", "0123456789");
    const spec = specOf(project);
    const r = await synthesizeCoded(spec, exactSettings({ mode: "fast" }), { oneHot: synthesize });
    if (!r.ok) throw new Error(r.error.message);
    const table = powerUpTable(spec, r.value.matrix, project.glyphs);
    expect(table.unusedCodes).toBe(6);
    expect(table.entries.map((e) => e.code)).toEqual(["1010", "1011", "1100", "1101", "1110", "1111"]);
    for (const e of table.entries) {
      const lit = [...decoderLights(r.value.matrix, e.code)].map((o) => o.slice(1)).sort();
      expect([...(e.segments[0] ?? [])].sort()).toEqual(lit);
      const ch = e.chars[0];
      if (ch !== null && ch !== undefined) expect([...(project.glyphs[ch] ?? [])].sort()).toEqual(lit);
    }
  });

  it("lists the 22 codes a 5-stage Johnson counter never reaches", async () => {
    const project = codedProject("johnson", "0123456789");
    const spec = specOf(project);
    const r = await synthesizeCoded(spec, exactSettings({ mode: "fast" }), { oneHot: synthesize });
    if (!r.ok) throw new Error(r.error.message);
    const table = powerUpTable(spec, r.value.matrix, project.glyphs);
    expect(table.unusedCodes).toBe(22);
    expect(table.entries).toHaveLength(22);
    expect(new Set(table.entries.map((e) => e.code)).size).toBe(22);
    for (const e of table.entries) expect(spec.counter.codes).not.toContain(e.code);
  });

  it("prefers a character the project shows when two glyphs look alike (5 and S)", () => {
    const shows5 = customProject(["00", "01"], ["5", "1"]);
    const showsS = customProject(["00", "01"], ["S", "1"]);
    expect(glyphNamer(specOf(shows5), shows5.glyphs)(["a", "c", "d", "f", "g"])).toBe("5");
    expect(glyphNamer(specOf(showsS), showsS.glyphs)(["a", "c", "d", "f", "g"])).toBe("S");
    expect(glyphNamer(specOf(shows5), shows5.glyphs)([])).toBe(" ");
    expect(glyphNamer(specOf(shows5), shows5.glyphs)(["a", "b", "d"])).toBeNull();
  });

  it("does not list counters of more stages than it can print", () => {
    const codes = Array.from({ length: 2 }, (_, k) => String(k).padStart(POWER_UP_MAX_STAGES + 1, "0"));
    const project = customProject(codes, ["0", "1"]);
    const spec = specOf(project);
    const none = { outputs: [], lines: [], gates: [], diodes: [], buses: [], tiedOn: [] } as unknown as DiodeMatrix;
    const table = powerUpTable(spec, none, project.glyphs);
    expect(table.listed).toBe(false);
    expect(table.unusedCodes).toBe(2 ** (POWER_UP_MAX_STAGES + 1) - 2);
  });
});

describe("powerUpText", () => {
  it("says what a code shows in words", () => {
    expect(powerUpText({ code: "1011", segments: [["c", "d", "e", "f", "g"]], chars: ["b"] })).toBe("code 1011 shows b");
    expect(powerUpText({ code: "1111", segments: [[]], chars: [" "] })).toBe("code 1111 lights nothing");
    expect(
      powerUpText({
        code: "0110",
        segments: [
          ["b", "c"],
          ["a", "b", "g"],
        ],
        chars: ["1", null],
      }),
    ).toBe('code 0110 shows "1?" (position 2 lights a b g, no glyph)');
  });

  it("adds the decimal point to the glyph on a seg7dp cell", () => {
    const project = makeProject({ counter: { states: 3, code: "binary" }, display: { cell: "seg7dp" }, show: ["1.", "2", "3"] });
    expect(glyphNamer(specOf(project), project.glyphs)(["b", "c", "dp"])).toBe("1.");
    expect(glyphNamer(specOf(project), project.glyphs)(["dp"])).toBe(" .");
  });
});
