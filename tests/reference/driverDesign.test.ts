/**
 * The driver stages against published worked examples (docs/sources.md
 * "Drivers and levels"): the saturated low-side switch and the emitter
 * follower, solved through the whole pipeline (project, matrix, circuit
 * builder, DC solve, budget) and set beside the hand formulas the examples
 * use.
 *
 * The hand formulas take a datasheet's worst-case Vce(sat) and a round
 * 0.7 V for Vbe; the Ebers-Moll model gives its own, a little different, so
 * each check first shows the published figures from the published inputs,
 * then that the solve satisfies the same formula with its own drops, then
 * how far the two land apart and why.
 */
import { describe, expect, it } from "vitest";
import { solveBudget } from "../../src/core/budget/budget.ts";
import { thermalVoltage } from "../../src/core/circuit/physics.ts";
import { directDesign } from "../support/budgetFixtures.ts";
import { showingWith } from "../support/projects.ts";

/** A red LED model that drops `v` volts at `i` amperes (n = 2, no series resistance). */
function ledAt(v: number, i: number): { is: number; n: number; rs: number } {
  return { is: i / Math.expm1(v / (2 * thermalVoltage(27))), n: 2, rs: 0 };
}

/**
 * An output line held at about `volts` in the lit state: a stiff counter line (1 Ω) and a matrix
 * diode of almost no drop (IS 1e-3 A, N 0.5: about 10 mV at 2 mA), so the stage sees what the
 * example's source gives it.
 */
const stiffLine = (volts: number) => ({
  counterOutput: { high: volts + 0.01, low: 0, resistance: 1 },
  diode: { is: 1e-3, n: 0.5, rs: 0 },
  pullDown: 100e6,
});

describe("saturated low-side switch", () => {
  // Source: Electrical Engineering Stack Exchange, "BJT Switch Design Question" (docs/sources.md "Drivers and levels"):
  // 5 V supply, an LED needing 20 mA at 2.0 V, a 2N3904 with Vce(sat) 0.2 V: Rc = (5 - 2 - 0.2) / 20 mA = 140 Ω;
  // for a forced beta of 10, Ib = 20 mA / 10 = 2 mA and Rb = (5 - 0.8) / 2 mA = 2.1 kΩ (the next preferred value, 2.2 kΩ).
  const vs = 5;
  const vf = 2.0;
  const vceSat = 0.2;
  const ic = 0.02;

  it("the published design equations: Rc = (Vs - n Vf - Vce(sat)) / Ic = 140 Ω, Rb = (Vs - Vbe(sat)) / (Ic / 10) = 2.1 kΩ", () => {
    expect((vs - 1 * vf - vceSat) / ic).toBeCloseTo(140, 9);
    expect((vs - 0.8) / (ic / 10)).toBeCloseTo(2100, 9);
  });

  it("the solved switch carries Ic = (Vs - n Vf - Vce(sat)) / Rs with its own drops, near the published 20 mA, saturated at a forced beta near 10", () => {
    const project = showingWith(["8", " "], {
      preset: "bench-5v-switch",
      ...stiffLine(vs),
      driver: { baseResistor: 2200, baseEmitterResistor: null, betaF: 150 },
      segment: { leds: 1, ...ledAt(vf, ic), seriesResistor: 140, targetA: ic, maxA: 0.03 },
      supply: { volts: vs, minVolts: vs, maxVolts: vs },
      // The example's transistor: the 2N3904's lowest hFE, 30, as the post takes it.
      tolerance: { resistorPct: 0, betaMin: 30, betaMax: 300, temperatureC: [27, 27] },
    });
    const d = directDesign("switch example", project);
    const b = solveBudget(d.project, d.spec, d.matrix, { trim: "off" });
    if (!b.ok) throw new Error(b.error.message);
    const lit = b.value.states[0]?.outputs["1a"];
    const q = lit?.driver;
    if (!lit || !q) throw new Error("no lit switch");
    // The same formula with the solve's own LED drop and Vce(sat), to the solver's precision.
    const ledV = 2 * thermalVoltage(27) * Math.log1p(lit.segmentA / project.electrical.segment.is);
    expect(lit.segmentA).toBeCloseTo((vs - ledV - q.vceV) / 140, 9);
    // The model saturates harder than a datasheet's 0.2 V worst case (Ebers-Moll, BR = 3): Vce(sat) about 0.04 V,
    // so the current lands a few percent above the published 20 mA.
    expect(q.vceV).toBeGreaterThan(0.02);
    expect(q.vceV).toBeLessThan(vceSat);
    expect(lit.segmentA).toBeGreaterThan(ic);
    expect(lit.segmentA).toBeLessThan(ic * 1.06);
    // Base current (5 - Vbe) / 2.2 kΩ, about 1.9 mA: a forced beta of about 11, well under the lowest hFE of 30.
    expect(q.ibA).toBeCloseTo((vs - q.vbeV) / 2200, 4);
    expect(q.icA / q.ibA).toBeGreaterThan(10);
    expect(q.icA / q.ibA).toBeLessThan(12);
    expect(b.value.drivers["1a"]?.saturated).toBe(true);
    expect(b.value.drivers["1a"]?.forcedBeta).toBeLessThan(12);
  });
});

describe("emitter follower", () => {
  // Source: Electrical Engineering Stack Exchange, answer on the emitter follower (docs/sources.md "Drivers and levels"):
  // VE = VB - 0.7 V; a 5.6 V zener at the base gives VE = 4.9 V, and 1 mA in 4.9 kΩ. "Common collector" (Wikipedia):
  // the emitter sits about one Vbe (0.6-0.7 V) below the base.
  it("the published figures: VE = 5.6 - 0.7 = 4.9 V, IE = 4.9 V / 4.9 kΩ = 1 mA", () => {
    expect(5.6 - 0.7).toBeCloseTo(4.9, 12);
    expect(4.9 / 4900).toBeCloseTo(0.001, 12);
  });

  it("the solved follower's emitter sits one Vbe (0.6-0.7 V) below its base, and its current is (Vb - Vbe - n Vf) / Rs", () => {
    // A follower's base held at 5.6 V drives 4.9 kΩ in series with one LED: the current is (VE - Vf) / 4.9 kΩ.
    const project = showingWith(["8", " "], {
      preset: "cathode-5v-follower",
      ...stiffLine(5.6),
      driver: { baseResistor: 0, betaF: 150 },
      segment: { leds: 1, ...ledAt(1.8, 0.0006), seriesResistor: 4900, targetA: 0.0006, maxA: 0.02 },
      supply: { volts: 12, minVolts: 12, maxVolts: 12 },
      tolerance: { resistorPct: 0, betaMin: 150, betaMax: 150, temperatureC: [27, 27] },
    });
    const d = directDesign("follower example", project);
    const b = solveBudget(d.project, d.spec, d.matrix, { trim: "off" });
    if (!b.ok) throw new Error(b.error.message);
    const lit = b.value.states[0]?.outputs["1a"];
    const q = lit?.driver;
    if (!lit || !q) throw new Error("no lit follower");
    expect(lit.inputV).toBeCloseTo(5.6, 1);
    expect(q.vbeV).toBeGreaterThan(0.6);
    expect(q.vbeV).toBeLessThan(0.7);
    const ve = lit.inputV - q.vbeV;
    // VE between the published 4.9 V (Vbe taken as 0.7 V) and 5.0 V (0.6 V): the model's Vbe at about 0.6 mA is 0.63 V.
    expect(ve).toBeGreaterThan(lit.inputV - 0.7);
    expect(ve).toBeLessThan(lit.inputV - 0.6);
    const ledV = 2 * thermalVoltage(27) * Math.log1p(lit.segmentA / project.electrical.segment.is);
    expect(lit.segmentA).toBeCloseTo((ve - ledV) / 4900, 7);
    // The emitter current is the segment's; the collector gives it less the base current, Ie = (1 + 1/beta) Ic.
    expect(q.icA + q.ibA).toBeCloseTo(lit.segmentA, 12);
    expect(q.icA / q.ibA).toBeCloseTo(150, 0);
  });
});
