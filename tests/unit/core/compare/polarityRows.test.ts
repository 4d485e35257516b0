import { describe, expect, it } from "vitest";
import { comparePolarities } from "../../../../src/core/compare/polarityRows.ts";
import { compileSpec } from "../../../../src/core/spec/decodeSpec.ts";
import { synthesize, synthSettings } from "../../../../src/core/synth/synthesize.ts";
import { matrixObjective } from "../../../../src/core/matrix/matrix.ts";
import { makeProject2 } from "../../../support/projects.ts";

const project = (electrical: Record<string, unknown> = {}, synthesis: Record<string, unknown> = {}) =>
  makeProject2({
    counter: { states: 6 },
    display: {},
    show: ["0", "1", "2", "3", "4", "5"],
    synthesis: { depth: "mixed", ...synthesis },
    electrical,
  });

describe("comparePolarities", () => {
  it("decodes every glyph style lit, dark and either on complementary lines, either never worse than the better of the two", async () => {
    const r = await comparePolarities(project(), { settings: { timeLimitMs: 5000 } });
    expect(r.ok).toBe(true);
    if (!r.ok) return;
    // 0-5 shows no 6, 7 or 9: one glyph style, three polarities.
    expect(r.value.map((x) => x.decode)).toEqual(["lit", "dark", "either"]);
    const [lit, dark, either] = r.value;
    for (const x of r.value) {
      expect(x.refused).toBeNull();
      expect(x.optimal).toBe(true);
      expect(x.diodes).toBe((x.matrixDiodes ?? 0) + (x.inputDiodes ?? 0));
    }
    expect(either?.diodes ?? Infinity).toBeLessThanOrEqual(Math.min(lit?.diodes ?? 0, dark?.diodes ?? 0));
    // Lit: the project's own matrix on its source-drive lines, and no level shift.
    const own = await synthesize(compileSpec(project()), synthSettings(project(), { timeLimitMs: 5000 }));
    expect(own.ok && matrixObjective(own.value)).toBe(lit?.diodes);
    expect(lit).toMatchObject({ inputDiodes: 0, darkOutputs: 0, resistors: 7 });
    // Dark: every output pulled up, each with two level-shift diodes on the 5 V preset and a bleed resistor.
    expect(dark).toMatchObject({ darkOutputs: 7, inputDiodes: 14, resistors: 14 });
  });

  it("with a high-side switch: lit on the nS lines (the same count as the NPN's lit on S lines), dark refused with the fix, either the lit decoder", async () => {
    const highSide = makeProject2({
      counter: { states: 6, drive: "sink" },
      display: {},
      show: ["0", "1", "2", "3", "4", "5"],
      synthesis: { depth: "mixed" },
      electrical: { preset: "bench-5v-high-side" },
    });
    const r = await comparePolarities(highSide, { settings: { timeLimitMs: 5000 } });
    expect(r.ok).toBe(true);
    if (!r.ok) return;
    const [lit, dark, either] = r.value;
    const npn = await comparePolarities(project(), { settings: { timeLimitMs: 5000 } });
    const npnLit = npn.ok ? npn.value[0] : undefined;
    // The same covering problem turned round onto the active-low lines: the same proven minimum.
    expect(lit).toMatchObject({ diodes: npnLit?.diodes, inputDiodes: 0, darkOutputs: 0, resistors: 7, optimal: true, refused: null });
    expect(dark?.diodes).toBeNull();
    expect(dark?.refused).toContain('use "decode": "lit"');
    expect(either).toMatchObject({ diodes: lit?.diodes, darkOutputs: 0, refused: null });
  });

  it("counts a divider's resistors and no level-shift diode", async () => {
    const r = await comparePolarities(project({}, { darkInput: "divider" }), { settings: { mode: "fast" } });
    expect(r.ok).toBe(true);
    if (!r.ok) return;
    const dark = r.value.find((x) => x.decode === "dark");
    expect(dark).toMatchObject({ inputDiodes: 0, darkOutputs: 7, resistors: 21 });
  });

  it("says why a polarity has no circuit with direct drive", async () => {
    const r = await comparePolarities(project({ preset: "line-direct" }), { settings: { mode: "fast" } });
    expect(r.ok).toBe(true);
    if (!r.ok) return;
    expect(r.value[0]?.refused).toBeNull();
    for (const x of r.value.slice(1)) {
      expect(x.diodes).toBeNull();
      expect(x.refused).toContain("direct drive");
    }
  });
});
