import { describe, expect, it } from "vitest";
import {
  currentRanges,
  offTargetPct,
  overallSpread,
  spreadPct,
  trimSegments,
  windowDistancePct,
} from "../../../../src/core/budget/segmentTrim.ts";
import { preferredNeighbours } from "../../../../src/core/budget/eSeries.ts";
import { readSweep } from "../../../../src/core/budget/sweepReading.ts";
import { sharedDieRoller } from "../../../support/budgetFixtures.ts";

describe("the trim", () => {
  it("computes spreads as 100 (max - min) / max", () => {
    expect(spreadPct(90, 100)).toBeCloseTo(10, 12);
    expect(spreadPct(0, 0)).toBe(0);
    expect(
      overallSpread(
        new Map([
          ["a", { minA: 80, maxA: 100, spreadPct: 20 }],
          ["b", { minA: 95, maxA: 120, spreadPct: 0 }],
        ]),
      ),
    ).toBeCloseTo((100 * 40) / 120, 12);
  });

  it("measures how far outside the target window the farthest lit segment runs, percent of the target", () => {
    const ranges = new Map([
      ["a", { minA: 70, maxA: 100, spreadPct: 30 }],
      ["b", { minA: 95, maxA: 125, spreadPct: 24 }],
    ]);
    expect(windowDistancePct(ranges, 100, 20)).toBeCloseTo(10, 12);
    expect(windowDistancePct(ranges, 100, 30)).toBe(0);
    expect(windowDistancePct(new Map([["a", { minA: 90, maxA: 130, spreadPct: 0 }]]), 100, 20)).toBeCloseTo(10, 12);
  });

  it("measures the farthest lit segment from the target, percent of the target", () => {
    const ranges = new Map([
      ["a", { minA: 80, maxA: 100, spreadPct: 20 }],
      ["b", { minA: 95, maxA: 130, spreadPct: 0 }],
    ]);
    expect(offTargetPct(ranges, 100)).toBeCloseTo(30, 12);
    expect(offTargetPct(ranges, 120)).toBeCloseTo((100 * 40) / 120, 12);
    expect(offTargetPct(new Map(), 100)).toBe(0);
  });

  it("picks one of the two preferred values around the ideal, the one centred nearer the target", () => {
    const d = sharedDieRoller();
    const e = d.project.electrical;
    const nominal = readSweep(d.spec, d.matrix, e, "nominal");
    if (!nominal.ok) throw new Error(nominal.error.message);
    const t = trimSegments({ spec: d.spec, matrix: d.matrix, model: e, nominal: nominal.value, series: "E24" });
    if (!t.ok) throw new Error(t.error.message);
    for (const [o, x] of Object.entries(t.value.outputs)) {
      expect(preferredNeighbours(x.idealOhms, "E24")).toContain(x.ohms);
      // Either neighbour, tried alone on this output, would not be centred better.
      const [lo, hi] = preferredNeighbours(x.idealOhms, "E24");
      const other = x.ohms === lo ? hi : lo;
      const alt = readSweep(d.spec, d.matrix, e, "check", { design: new Map([...t.value.ohms, [o, other]]) });
      if (!alt.ok) throw new Error(alt.error.message);
      const r = currentRanges(d.spec, alt.value).get(o);
      const mid = (a: { minA: number; maxA: number }): number => (a.minA + a.maxA) / 2;
      expect(Math.abs(mid(x) - e.segment.targetA)).toBeLessThanOrEqual(Math.abs(mid(r ?? x) - e.segment.targetA) + 1e-9);
    }
    expect(t.value.solutions.states).toHaveLength(d.spec.states.length);
  });

  it("trims the series resistor of a switch, a follower and direct drive the same way", () => {
    for (const preset of ["bench-5v-switch", "cathode-5v-follower", "line-direct"]) {
      const d = sharedDieRoller({ preset });
      const e = d.project.electrical;
      const nominal = readSweep(d.spec, d.matrix, e, "nominal");
      if (!nominal.ok) throw new Error(nominal.error.message);
      const t = trimSegments({ spec: d.spec, matrix: d.matrix, model: e, nominal: nominal.value, series: "E96" });
      if (!t.ok) throw new Error(t.error.message);
      for (const [o, x] of Object.entries(t.value.outputs)) {
        expect(preferredNeighbours(x.idealOhms, "E96"), `${preset} ${o}`).toContain(x.ohms);
        expect(Math.abs((x.minA + x.maxA) / 2 - e.segment.targetA) / e.segment.targetA, `${preset} ${o}`).toBeLessThan(0.05);
      }
    }
  });

  it("leaves an output whose segment never lights without a trim, rather than an infinite resistor", () => {
    // 19 LEDs behind a follower on a 5 V line stay dark whatever the series resistor: nothing to centre.
    const d = sharedDieRoller({ preset: "cathode-5v-follower" });
    const dark = { ...d.project.electrical, segment: { ...d.project.electrical.segment, leds: 19 } };
    const nominal = readSweep(d.spec, d.matrix, dark, "nominal");
    if (!nominal.ok) throw new Error(nominal.error.message);
    const t = trimSegments({ spec: d.spec, matrix: d.matrix, model: dark, nominal: nominal.value, series: "E24" });
    if (!t.ok) throw new Error(t.error.message);
    expect(t.value.outputs).toEqual({});
  });
});
