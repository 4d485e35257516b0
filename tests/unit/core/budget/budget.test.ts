import { describe, expect, it } from "vitest";
import { budgetDesign, solveBudget } from "../../../../src/core/budget/budget.ts";
import { BUDGET_SCHEMA, type Budget, type BudgetOptions } from "../../../../src/core/budget/budgetTypes.ts";
import { E24, E96 } from "../../../../src/core/budget/eSeries.ts";
import { directDesign, sharedDieRoller, type Design } from "../../../support/budgetFixtures.ts";
import { example, showing } from "../../../support/projects.ts";

function budgetOf(d: Design, options: BudgetOptions = {}): Budget {
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

  it("has the budget@2 shape in SI units, each unit in its field's name, with finite numbers only", () => {
    expect(b.schema).toBe(BUDGET_SCHEMA);
    expect(b.states.map((s) => s.state)).toEqual(shared.spec.states);
    const s0 = b.states[0];
    expect(Object.keys(s0?.outputs ?? {}).sort()).toEqual([...shared.spec.outputs].sort());
    expect(s0?.outputs["1c"]?.lit).toBe(true);
    expect(s0?.outputs["1c"]?.stringCurrentA).toBeGreaterThan(50e-6);
    expect(s0?.outputs["1c"]?.stringCurrentA).toBeLessThan(300e-6);
    expect(s0?.outputs["1tl"]?.stringCurrentA).toBeLessThan(1e-9);
    expect(s0?.outputs["1c"]?.baseV).toBeGreaterThan(1.5);
    const text = JSON.stringify(b);
    expect(text).not.toMatch(/null|NaN|Infinity/);
    expect(Object.keys(JSON.parse(text) as object)).toEqual(
      expect.arrayContaining(["states", "outputs", "diodes", "supply", "warnings", "trim", "corners", "drivers", "counterLines"]),
    );
  });

  it("shows the dimming of a second diode drop, and the trim taking it out", () => {
    // The project's own emitter resistors (the trim off): the depth-2 output runs dimmer.
    const own = budgetOf(shared, { trim: "off" });
    const depth1 = own.outputs["1c"];
    const depth2 = own.outputs["1tr"];
    expect(depth1?.pathLengths).toEqual([1]);
    expect(depth2?.pathLengths).toEqual([2]);
    expect(depth2?.maxA ?? 1).toBeLessThan((depth1?.minA ?? 0) * 0.8);
    expect(b.trim.spreadPct).toBeLessThan(b.trim.spreadPctBefore / 2);
    // A depth-2 output needs a smaller emitter resistor for the same current.
    expect(b.trim.outputs["1tr"]?.ohms ?? 0).toBeLessThan(b.trim.outputs["1c"]?.ohms ?? 0);
    for (const t of Object.values(b.trim.outputs)) {
      expect(isPreferred(t.ohms, E24)).toBe(true);
      expect(Math.abs((t.minA + t.maxA) / 2 - b.targetCurrentA)).toBeLessThan(b.targetCurrentA * 0.06);
    }
    const e96 = budgetOf(shared, { series: "E96" });
    for (const t of Object.values(e96.trim.outputs)) {
      expect(isPreferred(t.ohms, E96)).toBe(true);
      expect(Math.abs((t.minA + t.maxA) / 2 - b.targetCurrentA)).toBeLessThan(b.targetCurrentA * 0.02);
    }
  });

  it("per output: min, max and spread over the states that light it", () => {
    for (const [o, r] of Object.entries(b.outputs)) {
      const lit = b.states.map((s) => s.outputs[o]).filter((x) => x?.lit);
      expect(r.minA).toBe(Math.min(...lit.map((x) => x?.stringCurrentA as number)));
      expect(r.maxA).toBe(Math.max(...lit.map((x) => x?.stringCurrentA as number)));
      expect(r.spreadPct).toBeCloseTo((100 * (r.maxA - r.minA)) / r.maxA, 9);
    }
  });

  it("per diode, counter line and supply: the worst case over the states", () => {
    const d1 = b.diodes["D1"];
    expect(d1?.from).toBe("S0");
    expect(d1?.maxCurrentA).toBeGreaterThan(10e-6);
    expect(d1?.maxReverseV).toBeGreaterThan(1.5);
    expect(d1?.ratedCurrentA).toBe(0.1);
    for (const [line, c] of Object.entries(b.counterLines)) {
      expect(c.sagV).toBeCloseTo(2.4 - c.lineV, 12);
      expect(c.sourceCurrentA).toBeCloseTo(c.sagV / 1000, 12);
      expect(b.states.find((s) => s.state === line)?.sourceCurrentA).toBe(c.sourceCurrentA);
    }
    const most = Math.max(...b.states.map((s) => Object.values(s.outputs).reduce((a, o) => a + o.stringCurrentA, 0)));
    expect(b.supply.maxCurrentA).toBeCloseTo(most, 12);
    expect(b.supply.maxPowerW).toBeCloseTo(most * 100, 10);
  });

  it("per driver: Vce, dissipation and headroom at the lowest supply", () => {
    for (const d of Object.values(b.drivers)) {
      expect(d.maxVceV).toBeGreaterThan(30);
      expect(d.maxPowerW).toBeGreaterThan(1e-3);
      expect(d.maxPowerW).toBeLessThan(0.5);
      expect(d.headroomV).toBeGreaterThan(20);
      expect(d.headroomV).toBeLessThan(90 - 50);
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
    expect(fb.corners.low.minCurrentA).toBeCloseTo(Math.min(...Object.values(fb.trim.outputs).map((t) => t.minA)), 12);
    expect(b.corners.low.minCurrentA).toBeLessThan(b.corners.high.minCurrentA);
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

  it("describes one design: with the trim applied every figure is the trimmed design's, and budgetDesign gives its values", () => {
    expect(b.trim.applied).toBe(true);
    expect(b.emitterResistors).toBe("trimmed");
    for (const [o, d] of Object.entries(b.drivers)) {
      expect(d.emitterOhms).toBe(b.trim.outputs[o]?.ohms);
      expect([b.outputs[o]?.minA, b.outputs[o]?.maxA]).toEqual([b.trim.outputs[o]?.minA, b.trim.outputs[o]?.maxA]);
    }
    expect(b.spreadPct).toBe(b.trim.spreadPct);
    expect(Object.fromEntries(budgetDesign(b).emitterOhms)).toEqual(
      Object.fromEntries(Object.entries(b.trim.outputs).map(([o, t]) => [o, t.ohms])),
    );
    const own = budgetOf(shared, { trim: "off" });
    expect(own.emitterResistors).toBe("project");
    expect(Object.values(own.drivers).every((d) => d.emitterOhms === 10_000)).toBe(true);
    expect(own.spreadPct).toBe(own.trim.spreadPctBefore);
    expect(own.corners.low.minCurrentA).toBeLessThan(b.corners.low.minCurrentA);
  });

  it("warns of the design it describes: the project's dim segments only where the trim is not applied, and why", () => {
    const own = budgetOf(shared, { trim: "off" });
    const dim = own.warnings.filter((w) => w.code === "dim-segment");
    expect(dim.map((w) => w.code === "dim-segment" && w.output).sort()).toEqual(["1bl", "1br", "1mr", "1tr"]);
    for (const w of dim) if (w.code === "dim-segment") expect(w.unappliedTrim?.why).toBe("turned-off");
    const spread = own.warnings.find((w) => w.code === "brightness-spread");
    expect(spread).toMatchObject({ spreadPct: own.trim.spreadPctBefore, trim: "turned-off", otherSpreadPct: own.trim.spreadPct });
    // With the trim applied, the design's strings all sit inside the window.
    expect(b.warnings.filter((w) => w.code === "dim-segment")).toEqual([]);
  });

  it("never applies by default a trim that widens the spread, and says so (hex monitor, direct)", () => {
    const hex = directDesign("hex monitor", example("relay-hex-monitor"));
    const auto = budgetOf(hex);
    expect(auto.trim.effect).toBe("widens-spread");
    expect(auto.trim.spreadPct).toBeGreaterThan(auto.trim.spreadPctBefore);
    expect(auto.trim.applied).toBe(false);
    expect(Object.values(auto.drivers).every((d) => d.emitterOhms === 10_000)).toBe(true);
    const forced = budgetOf(hex, { trim: "on" });
    expect(forced.trim.applied).toBe(true);
    expect(forced.spreadPct).toBe(forced.trim.spreadPct);
    for (const [o, d] of Object.entries(forced.drivers)) expect(d.emitterOhms).toBe(forced.trim.outputs[o]?.ohms);
  });
});
