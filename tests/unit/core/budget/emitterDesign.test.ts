import { describe, expect, it } from "vitest";
import {
  appliesTrim,
  designNote,
  designSource,
  projectDesign,
  settleDesign,
  trimEffect,
  type EmitterDesign,
} from "../../../../src/core/budget/emitterDesign.ts";
import { directDesign, sharedDieRoller } from "../../../support/budgetFixtures.ts";
import { example } from "../../../support/projects.ts";

const figures = (spreadPct: number, offTargetPct: number) => ({ spreadPct, offTargetPct });

describe("what a trim does to the design", () => {
  it("improves only when neither the spread nor the distance from the target gets worse, and one gets better", () => {
    expect(trimEffect(figures(36.7, 39), figures(8.4, 5.6), false)).toBe("improves");
    expect(trimEffect(figures(6.8, 11.5), figures(6.8, 4.0), false)).toBe("improves");
    expect(trimEffect(figures(6.8, 11.5), figures(6.2, 11.5), false)).toBe("improves");
    // Nearer the target but a hair less even: the trim must not pass for an improvement.
    expect(trimEffect(figures(6.77, 11.5), figures(6.81, 4.0), false)).toBe("widens-spread");
    expect(trimEffect(figures(11.9, 40), figures(12.2, 7.8), false)).toBe("widens-spread");
    expect(trimEffect(figures(20, 5), figures(10, 8), false)).toBe("moves-off-target");
    expect(trimEffect(figures(10, 5), figures(10, 5), false)).toBe("no-change");
    expect(trimEffect(figures(10, 5), figures(1, 1), true)).toBe("no-change");
  });

  it("is applied by auto only where it improves, by on wherever it changes something, by off never", () => {
    expect(appliesTrim("auto", "improves")).toBe(true);
    for (const e of ["widens-spread", "moves-off-target", "no-change"] as const) expect(appliesTrim("auto", e)).toBe(false);
    for (const e of ["improves", "widens-spread", "moves-off-target"] as const) expect(appliesTrim("on", e)).toBe(true);
    expect(appliesTrim("on", "no-change")).toBe(false);
    for (const e of ["improves", "widens-spread", "moves-off-target", "no-change"] as const) expect(appliesTrim("off", e)).toBe(false);
  });
});

describe("settleDesign", () => {
  it("takes the trim where it improves the design: the die roller with a bus and links at depth 2", () => {
    const d = sharedDieRoller();
    const s = settleDesign(d.project, d.spec, d.matrix, { series: "E24", mode: "auto" });
    if (!s.ok) throw new Error(s.error.message);
    expect(s.value.design.effect).toBe("improves");
    expect(s.value.design.trimmed).toBe(true);
    expect(s.value.after.spreadPct).toBeLessThan(s.value.before.spreadPct);
    expect(s.value.after.offTargetPct).toBeLessThan(s.value.before.offTargetPct);
    expect(Object.fromEntries(s.value.design.emitterOhms)).toEqual(Object.fromEntries(s.value.trim.ohms));
    expect(s.value.solutions).toBe(s.value.trim.solutions);
  });

  it("keeps the project's values where the trim would widen the spread, and applies it only when asked", () => {
    const d = directDesign("hex monitor", example("relay-hex-monitor"));
    const own = projectDesign(d.project.electrical, d.matrix).emitterOhms;
    const auto = settleDesign(d.project, d.spec, d.matrix, { series: "E24", mode: "auto" });
    if (!auto.ok) throw new Error(auto.error.message);
    expect(auto.value.design.effect).toBe("widens-spread");
    expect(auto.value.after.spreadPct).toBeGreaterThan(auto.value.before.spreadPct);
    expect(auto.value.design.trimmed).toBe(false);
    expect([...auto.value.design.emitterOhms]).toEqual([...own]);
    expect(auto.value.solutions).toBe(auto.value.nominal);
    const on = settleDesign(d.project, d.spec, d.matrix, { series: "E24", mode: "on" });
    if (!on.ok) throw new Error(on.error.message);
    expect(on.value.design.trimmed).toBe(true);
    expect(Object.fromEntries(on.value.design.emitterOhms)).toEqual(Object.fromEntries(on.value.trim.ohms));
    const off = settleDesign(d.project, d.spec, d.matrix, { series: "E24", mode: "off" });
    if (!off.ok) throw new Error(off.error.message);
    expect(off.value.design.trimmed).toBe(false);
    expect([...off.value.design.emitterOhms]).toEqual([...own]);
  });
});

describe("the design in words", () => {
  const design = (over: Partial<EmitterDesign>): EmitterDesign => ({
    mode: "auto",
    series: "E24",
    trimmed: false,
    effect: "widens-spread",
    emitterOhms: new Map(),
    ...over,
  });
  it("says whether the trim is applied and why, never calling a worse trim an improvement", () => {
    expect(designNote(design({ trimmed: true, effect: "improves" }))).toBe(
      "Emitter resistors: the E24 trim, applied because it narrows the spread or brings the strings nearer the target, and worsens neither.",
    );
    expect(designNote(design({}))).toBe(
      "Emitter resistors as in the project: the E24 trim is not applied because it would widen the brightness spread.",
    );
    expect(designNote(design({ mode: "on", trimmed: true }))).toBe(
      "Emitter resistors: the E24 trim, applied on request; it widens the brightness spread.",
    );
    expect(designNote(design({ mode: "off", effect: null }))).toBe("Emitter resistors as in the project (the trim is turned off).");
    expect(designNote(design({ effect: null }))).toBe("Emitter resistors as in the project (the trim could not be worked out).");
    expect(designSource(design({ trimmed: true, effect: "improves", series: "E96" }))).toBe("trimmed by the budget (E96)");
    expect(designSource(design({}))).toBe("as in the project (the trim would widen the spread)");
    expect(designSource(design({ effect: "moves-off-target" }))).toBe("as in the project (the trim would move strings off the target)");
  });
});
