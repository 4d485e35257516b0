import { describe, expect, it } from "vitest";
import {
  appliesTrim,
  designNote,
  designSource,
  keepsSpreads,
  projectDesign,
  settleDesign,
  trimEffect,
  type SegmentDesign,
} from "../../../../src/core/budget/segmentDesign.ts";
import { directDesign, sharedDieRoller } from "../../../support/budgetFixtures.ts";
import { exampleFormat1, showingWith } from "../../../support/projects.ts";

const figures = (spreadPct: number, offTargetPct: number, windowDistancePct = 0) => ({ spreadPct, offTargetPct, windowDistancePct });
const judged = { sameValues: false, overRating: false };

describe("the design rule", () => {
  it("improves when the segments come nearer the target window without a wider spread, or as near with a narrower spread or nearer the target", () => {
    expect(trimEffect(figures(36.7, 39, 19), figures(8.4, 5.6, 0), judged)).toBe("improves");
    expect(trimEffect(figures(6.8, 11.5), figures(6.8, 4.0), judged)).toBe("improves");
    expect(trimEffect(figures(6.8, 11.5), figures(6.2, 11.5), judged)).toBe("improves");
    expect(trimEffect(figures(10, 5), figures(10, 5), judged)).toBe("no-help");
    expect(trimEffect(figures(10, 5), figures(9, 8, 3), judged)).toBe("no-help");
  });

  it("never takes a wider spread, however much nearer the target it comes", () => {
    // The format-1 hex monitor's case: 40 % off target brought to 8 %, the spread 11.9 % to 12.2 %.
    expect(trimEffect(figures(11.9, 40, 20), figures(12.2, 7.8, 0), judged)).toBe("widens-spread");
    expect(trimEffect(figures(6.77, 11.5), figures(6.81, 4.0), judged)).toBe("widens-spread");
    expect(keepsSpreads(figures(6.77, 0), figures(6.77, 0))).toBe(true);
  });

  it("never pushes a segment over its rating, and calls the project's own values no change", () => {
    expect(trimEffect(figures(20, 30, 10), figures(5, 1), { sameValues: false, overRating: true })).toBe("over-rating");
    expect(trimEffect(figures(10, 5), figures(1, 1), { sameValues: true, overRating: true })).toBe("no-change");
  });

  it("is applied by auto only where it improves, by on wherever it changes something but never over the rating, by off never", () => {
    expect(appliesTrim("auto", "improves")).toBe(true);
    for (const e of ["widens-spread", "no-help", "over-rating", "no-change"] as const) expect(appliesTrim("auto", e)).toBe(false);
    for (const e of ["improves", "widens-spread", "no-help"] as const) expect(appliesTrim("on", e)).toBe(true);
    for (const e of ["over-rating", "no-change"] as const) expect(appliesTrim("on", e)).toBe(false);
    for (const e of ["improves", "widens-spread", "no-help", "over-rating", "no-change"] as const)
      expect(appliesTrim("off", e)).toBe(false);
  });
});

describe("settleDesign", () => {
  it("takes the trim where it improves the design: the die roller with a bus and links at depth 2 (format 1's sink)", () => {
    const d = sharedDieRoller();
    const s = settleDesign(d.project, d.spec, d.matrix, { series: "E24", mode: "auto" });
    if (!s.ok) throw new Error(s.error.message);
    expect(s.value.design.effect).toBe("improves");
    expect(s.value.design.trimmed).toBe(true);
    expect(s.value.design.role).toBe("emitter");
    expect(s.value.after.spreadPct).toBeLessThan(s.value.before.spreadPct);
    expect(s.value.after.windowDistancePct).toBeLessThan(s.value.before.windowDistancePct);
    expect(Object.fromEntries(s.value.design.ohms)).toEqual(Object.fromEntries(s.value.judged));
  });

  it("keeps the project's values where the trim would widen the spread, and applies it only when asked (hex monitor as format 1)", () => {
    const d = directDesign("hex monitor", exampleFormat1("relay-hex-monitor"));
    const own = projectDesign(d.project.electrical, d.matrix).ohms;
    const auto = settleDesign(d.project, d.spec, d.matrix, { series: "E24", mode: "auto" });
    if (!auto.ok) throw new Error(auto.error.message);
    expect(auto.value.design.effect).toBe("widens-spread");
    expect(auto.value.after.spreadPct).toBeGreaterThan(auto.value.before.spreadPct);
    expect(auto.value.design.trimmed).toBe(false);
    expect([...auto.value.design.ohms]).toEqual([...own]);
    expect(auto.value.solutions).toBe(auto.value.nominal);
    const on = settleDesign(d.project, d.spec, d.matrix, { series: "E24", mode: "on" });
    if (!on.ok) throw new Error(on.error.message);
    expect(on.value.design.trimmed).toBe(true);
    expect(Object.fromEntries(on.value.design.ohms)).toEqual(Object.fromEntries(on.value.trim.ohms));
    const off = settleDesign(d.project, d.spec, d.matrix, { series: "E24", mode: "off" });
    if (!off.ok) throw new Error(off.error.message);
    expect(off.value.design.trimmed).toBe(false);
    expect([...off.value.design.ohms]).toEqual([...own]);
  });

  it("moves a common value as one when that keeps the spread: a 12 V sink whose emitter resistors all run it dim", () => {
    const d = directDesign("dim sink", showingWith(["1", "7", "4", "8"], { preset: "panel-12v-sink", driver: { emitterResistor: 330 } }));
    const s = settleDesign(d.project, d.spec, d.matrix, { series: "E24", mode: "auto" });
    if (!s.ok) throw new Error(s.error.message);
    expect(s.value.design.effect).toBe("improves");
    expect(s.value.after.spreadPct).toBeLessThanOrEqual(s.value.before.spreadPct);
    expect(s.value.after.windowDistancePct).toBeLessThan(s.value.before.windowDistancePct);
  });

  it("refuses a trim that would run a segment over its rating, even when asked", () => {
    // A rating just above the target: centring puts the high corner over it, the project's dim values do not reach it.
    const d = directDesign("tight rating", showingWith(["1", "7"], { segment: { seriesResistor: 470, maxA: 0.0105 } }));
    for (const mode of ["auto", "on"] as const) {
      const s = settleDesign(d.project, d.spec, d.matrix, { series: "E24", mode });
      if (!s.ok) throw new Error(s.error.message);
      expect(s.value.design.effect, mode).toBe("over-rating");
      expect(s.value.design.trimmed, mode).toBe(false);
    }
  });
});

describe("the design in words", () => {
  const design = (over: Partial<SegmentDesign>): SegmentDesign => ({
    mode: "auto",
    series: "E24",
    role: "emitter",
    trimmed: false,
    effect: "widens-spread",
    ohms: new Map(),
    ...over,
  });
  it("says whether the trim is applied and why, never calling a worse trim an improvement", () => {
    expect(designNote(design({ trimmed: true, effect: "improves" }))).toBe(
      "Emitter resistors: the E24 trim, applied because it brings the segments nearer the target without widening a spread.",
    );
    expect(designNote(design({ role: "series", trimmed: true, effect: "improves" }))).toBe(
      "Series resistors: the E24 trim, applied because it brings the segments nearer the target without widening a spread.",
    );
    expect(designNote(design({}))).toBe(
      "Emitter resistors as in the project: the E24 trim is not applied because it would widen the brightness spread.",
    );
    expect(designNote(design({ mode: "on", trimmed: true }))).toBe(
      "Emitter resistors: the E24 trim, applied on request; it widens the brightness spread.",
    );
    expect(designNote(design({ mode: "off", effect: null }))).toBe("Emitter resistors as in the project (the trim is turned off).");
    expect(designNote(design({ effect: null }))).toBe("Emitter resistors as in the project (the trim could not be worked out).");
    expect(designNote(design({ effect: "over-rating" }))).toBe(
      "Emitter resistors as in the project: the E24 trim is not applied because it would run a segment over its rating at the high corner.",
    );
    expect(designSource(design({ trimmed: true, effect: "improves", series: "E96" }))).toBe("trimmed by the budget (E96)");
    expect(designSource(design({}))).toBe("as in the project (the trim would widen the spread)");
    expect(designSource(design({ effect: "no-help" }))).toBe("as in the project (the trim would not bring it nearer the target)");
  });
});
