/**
 * The trim never widens a spread: for random projects of every driver kind
 * (random glyph tables, random presets with random current-setting
 * resistors, counter-line resistances and targets), the design the budget
 * settles by default has a display spread no wider than the project's own
 * values give, never runs a segment over its rating where the project's
 * values do not, and, when it takes the trim, comes no further from the
 * target window.
 */
import fc from "fast-check";
import { describe, expect, it } from "vitest";
import { solveBudget } from "../../src/core/budget/budget.ts";
import { PRESET_NAMES } from "../../src/core/project/electricalPresets.ts";
import { directDesign } from "../support/budgetFixtures.ts";
import { makeProject2 } from "../support/projects.ts";

const SEED = 1010;
const SEGMENTS = ["p", "q", "r", "s", "t"];

const logUniform = (lo: number, hi: number) => fc.double({ min: Math.log10(lo), max: Math.log10(hi), noNaN: true }).map((x) => 10 ** x);

const projectArb = fc
  .record({
    preset: fc.constantFrom(...PRESET_NAMES),
    states: fc.integer({ min: 2, max: 6 }),
    bits: fc.array(fc.integer({ min: 1, max: 31 }), { minLength: 6, maxLength: 6 }),
    scale: logUniform(0.5, 2),
    lineOhms: logUniform(10, 2000),
    perOutput: fc.array(logUniform(0.7, 1.4), { minLength: 5, maxLength: 5 }),
  })
  .map((r) => {
    const glyphs: Record<string, string[]> = {};
    const show: string[] = [];
    for (let k = 0; k < r.states; k++) {
      const ch = String.fromCharCode(65 + k);
      glyphs[ch] = SEGMENTS.filter((_, i) => (r.bits[k] ?? 1) & (1 << i));
      show.push(ch);
    }
    // The preset's own current-setting resistor, scaled, and per output a little off it.
    const sink = r.preset === "panel-12v-sink" || r.preset === "string-hv-sink";
    const base = {
      "panel-12v-sink": 180,
      "string-hv-sink": 3300,
      "bench-5v-switch": 300,
      "cathode-5v-follower": 110,
      "bench-5v-high-side": 300,
      "line-direct": 820,
    }[r.preset];
    const each = Object.fromEntries(SEGMENTS.map((s, i) => [`1${s}`, Math.round(base * r.scale * (r.perOutput[i] ?? 1))]));
    const electrical = {
      preset: r.preset,
      counterOutput: { resistance: r.lineOhms },
      ...(sink ? { driver: { emitterResistors: each } } : { segment: { seriesResistors: each } }),
    };
    return makeProject2({
      // A high-side switch's lit cells sit on active-low lines: a sink-drive counter.
      counter: { states: r.states, drive: r.preset === "bench-5v-high-side" ? "sink" : "source" },
      display: { positions: 1, cell: "custom", segments: SEGMENTS },
      glyphs,
      show,
      electrical,
    });
  });

describe(`the trim (fast-check seed ${SEED})`, () => {
  it("never widens the display's spread, never pushes a segment over its rating, and never moves the design away from the target window", () => {
    const seen = { applied: 0, refused: 0 };
    fc.assert(
      fc.property(projectArb, (project) => {
        const d = directDesign("random", project);
        const b = solveBudget(d.project, d.spec, d.matrix);
        if (!b.ok) return;
        const t = b.value.trim;
        const own = solveBudget(d.project, d.spec, d.matrix, { trim: "off" });
        if (!own.ok) return;
        expect(b.value.spreadPct).toBeLessThanOrEqual(own.value.spreadPct + 1e-9);
        const peak = (x: typeof b.value) => Math.max(x.corners.high.maxCurrentA, ...Object.values(x.outputs).map((o) => o.maxA));
        if (peak(b.value) > project.electrical.segment.maxA) expect(peak(b.value)).toBeLessThanOrEqual(peak(own.value) + 1e-12);
        if (t.applied) {
          seen.applied++;
          expect(t.effect).toBe("improves");
          expect(t.windowDistancePct).toBeLessThanOrEqual(t.windowDistancePctBefore + 1e-9);
          expect(t.spreadPct).toBeLessThanOrEqual(t.spreadPctBefore + 1e-9);
        } else {
          seen.refused++;
          expect(b.value.spreadPct).toBe(own.value.spreadPct);
        }
      }),
      { seed: SEED, numRuns: 40 },
    );
    // The runs must have seen the trim both taken and refused.
    expect(seen.applied).toBeGreaterThan(5);
    expect(seen.refused).toBeGreaterThan(2);
    console.info(`trim: ${JSON.stringify(seen)} of 40 runs`);
  });
});
