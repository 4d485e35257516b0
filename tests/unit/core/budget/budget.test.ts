import { describe, expect, it } from "vitest";
import { BUDGET_SCHEMA, solveBudget, type Budget } from "../../../../src/core/budget/budget.ts";
import { E24, E96 } from "../../../../src/core/budget/eSeries.ts";
import { directDesign, sharedDieRoller, type Design } from "../../../support/budgetFixtures.ts";
import { example, showing } from "../../../support/projects.ts";

function budgetOf(d: Design, options = {}): Budget {
  const b = solveBudget(d.project, d.spec, d.matrix, options);
  if (!b.ok) throw new Error(b.error.message);
  return b.value;
}

const isPreferred = (ohms: number, table: readonly number[]): boolean => {
  const digits = table === E24 ? 2 : 3;
  const sig = Number((ohms / 10 ** (Math.floor(Math.log10(ohms)) - digits + 1)).toFixed(6));
  return table.includes(sig);
};

describe("solveBudget", () => {
  const shared = sharedDieRoller();
  const b = budgetOf(shared);

  it("has the issue's JSON shape in SI units, with finite numbers only", () => {
    expect(b.schema).toBe(BUDGET_SCHEMA);
    expect(b.states.map((s) => s.state)).toEqual(shared.spec.states);
    const s0 = b.states[0];
    expect(Object.keys(s0?.outputs ?? {}).sort()).toEqual([...shared.spec.outputs].sort());
    expect(s0?.outputs["1c"]?.lit).toBe(true);
    expect(s0?.outputs["1c"]?.stringCurrent).toBeGreaterThan(50e-6);
    expect(s0?.outputs["1c"]?.stringCurrent).toBeLessThan(300e-6);
    expect(s0?.outputs["1tl"]?.stringCurrent).toBeLessThan(1e-9);
    expect(s0?.outputs["1c"]?.baseVoltage).toBeGreaterThan(1.5);
    const text = JSON.stringify(b);
    expect(text).not.toMatch(/null|NaN|Infinity/);
    expect(Object.keys(JSON.parse(text) as object)).toEqual(
      expect.arrayContaining(["states", "outputs", "diodes", "supply", "warnings", "trim", "corners", "drivers", "counterLines"]),
    );
  });

  it("shows the dimming of a second diode drop, and the trim taking it out", () => {
    const depth1 = b.outputs["1c"];
    const depth2 = b.outputs["1tr"];
    expect(depth1?.depths).toEqual([1]);
    expect(depth2?.depths).toEqual([2]);
    expect(depth2?.max ?? 1).toBeLessThan((depth1?.min ?? 0) * 0.8);
    expect(b.trim.spreadPct).toBeLessThan(b.trim.spreadPctBefore / 2);
    // A depth-2 output needs a smaller emitter resistor for the same current.
    expect(b.trim.outputs["1tr"]?.ohms ?? 0).toBeLessThan(b.trim.outputs["1c"]?.ohms ?? 0);
    for (const t of Object.values(b.trim.outputs)) {
      expect(isPreferred(t.ohms, E24)).toBe(true);
      expect(Math.abs((t.min + t.max) / 2 - b.targetCurrent)).toBeLessThan(b.targetCurrent * 0.06);
    }
    const e96 = budgetOf(shared, { series: "E96" });
    for (const t of Object.values(e96.trim.outputs)) {
      expect(isPreferred(t.ohms, E96)).toBe(true);
      expect(Math.abs((t.min + t.max) / 2 - b.targetCurrent)).toBeLessThan(b.targetCurrent * 0.02);
    }
  });

  it("per output: min, max and spread over the states that light it", () => {
    for (const [o, r] of Object.entries(b.outputs)) {
      const lit = b.states.map((s) => s.outputs[o]).filter((x) => x?.lit);
      expect(r.min).toBe(Math.min(...lit.map((x) => x?.stringCurrent as number)));
      expect(r.max).toBe(Math.max(...lit.map((x) => x?.stringCurrent as number)));
      expect(r.spreadPct).toBeCloseTo((100 * (r.max - r.min)) / r.max, 9);
    }
  });

  it("per diode, counter line and supply: the worst case over the states", () => {
    const d1 = b.diodes["D1"];
    expect(d1?.from).toBe("S0");
    expect(d1?.maxCurrent).toBeGreaterThan(10e-6);
    expect(d1?.maxReverse).toBeGreaterThan(1.5);
    expect(d1?.ratedCurrent).toBe(0.1);
    for (const [line, c] of Object.entries(b.counterLines)) {
      expect(c.sag).toBeCloseTo(2.4 - c.lineVoltage, 12);
      expect(c.sourceCurrent).toBeCloseTo(c.sag / 1000, 12);
      expect(b.states.find((s) => s.state === line)?.sourceCurrent).toBe(c.sourceCurrent);
    }
    const most = Math.max(...b.states.map((s) => Object.values(s.outputs).reduce((a, o) => a + o.stringCurrent, 0)));
    expect(b.supply.maxCurrent).toBeCloseTo(most, 12);
    expect(b.supply.maxPower).toBeCloseTo(most * 100, 10);
  });

  it("per driver: Vce, dissipation and headroom at the lowest supply", () => {
    for (const d of Object.values(b.drivers)) {
      expect(d.maxVce).toBeGreaterThan(30);
      expect(d.maxPower).toBeGreaterThan(1e-3);
      expect(d.maxPower).toBeLessThan(0.5);
      expect(d.headroom).toBeGreaterThan(20);
      expect(d.headroom).toBeLessThan(90 - 50);
    }
  });

  it("carries the hazardous-voltage and mains cautions above 60 V, and not below", () => {
    expect(b.warnings.filter((w) => w.level === "danger").map((w) => w.code)).toEqual(["hazardous-voltage", "mains-supply"]);
    const low = showing(["1", "7"], 1, { electrical: { string: { dies: 12 }, supply: { volts: 48, minVolts: 45, maxVolts: 50 } } });
    const lb = budgetOf(directDesign("48 V", low));
    expect(lb.warnings.some((w) => w.level === "danger")).toBe(false);
  });

  it("warns of a driver that saturates at the lowest supply", () => {
    const p = showing(["1", "7"], 1, { electrical: { supply: { volts: 56, minVolts: 54, maxVolts: 58 } } });
    const w = budgetOf(directDesign("tight", p)).warnings;
    expect(w.some((x) => x.code === "driver-saturation")).toBe(true);
  });

  it("warns of a diode over its rating", () => {
    const p = showing(["1", "7", "8"], 1, { electrical: { diode: { maxForwardA: 1e-6, maxReverseV: 1 } } });
    const codes = budgetOf(directDesign("weak diode", p)).warnings.map((x) => x.code);
    expect(codes).toContain("diode-current");
    expect(codes).toContain("diode-reverse");
  });

  it("meets its target when nothing varies, and says so over the corners", () => {
    const fixed = showing(["1", "7"], 1, {
      electrical: {
        supply: { volts: 100, minVolts: 100, maxVolts: 100 },
        tolerance: { resistorPct: 0, betaMin: 150, betaMax: 150, temperatureC: [27, 27] },
      },
    });
    const fb = budgetOf(directDesign("fixed", fixed));
    expect(fb.corners.meetsTarget).toBe(true);
    expect(fb.corners.low.minCurrent).toBeCloseTo(Math.min(...Object.values(fb.trim.outputs).map((t) => t.min)), 12);
    expect(b.corners.low.minCurrent).toBeLessThan(b.corners.high.minCurrent);
    expect(b.corners.low.conditions.temperatureC).toBe(0);
  });

  it("stays finite with nothing to drive, and with every output tied on", () => {
    for (const texts of [
      [" ", " "],
      ["8", "8"],
    ]) {
      const eb = budgetOf(directDesign(texts.join(), showing(texts)));
      expect(JSON.stringify(eb)).not.toMatch(/null|NaN|Infinity/);
      expect(Object.keys(eb.diodes)).toEqual([]);
    }
    expect(Object.keys(budgetOf(directDesign("8", showing(["8", "8"]))).outputs)).toHaveLength(7);
  });

  it("handles every example's direct matrix, all by Newton from the builder's guess", () => {
    for (const name of ["relay-hex-monitor", "turntable-position", "die-roller"]) {
      const eb = budgetOf(directDesign(name, example(name)));
      expect(eb.states.every((s) => s.solver.method === "newton")).toBe(true);
    }
  });
});
