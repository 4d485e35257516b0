import { describe, expect, it } from "vitest";
import { solveBudget } from "../../../../src/core/budget/budget.ts";
import { compileSpec } from "../../../../src/core/spec/decodeSpec.ts";
import { synthesize, synthSettings } from "../../../../src/core/synth/synthesize.ts";
import { budgetChart } from "../../../../src/ui/components/budgetChart.ts";
import { microampsShort } from "../../../../src/render/units.ts";
import { example } from "../../../support/projects.ts";

describe("budget chart", async () => {
  const project = example("die-roller");
  const spec = compileSpec(project);
  const m = await synthesize(spec, synthSettings(project, { mode: "fast" }));
  if (!m.ok) throw new Error(m.error.message);
  const b = solveBudget(project, spec, m.value);
  if (!b.ok) throw new Error(b.error.message);
  const chart = budgetChart(b.value, 440);

  it("has one row per output and one tick per lit state", () => {
    expect(chart.rows.map((r) => r.output)).toEqual(Object.keys(b.value.outputs));
    for (const r of chart.rows) {
      const lit = b.value.states.filter((s) => s.outputs[r.output]?.lit).length;
      expect(r.ticks).toHaveLength(lit);
    }
  });
  it("puts every tick inside its output's min-max band, and everything inside the plot", () => {
    for (const r of chart.rows) {
      for (const t of r.ticks) {
        expect(t.x).toBeGreaterThanOrEqual(r.band.x0 - 1e-9);
        expect(t.x).toBeLessThanOrEqual(r.band.x1 + 1e-9);
        expect(t.x).toBeLessThanOrEqual(chart.plotX1);
      }
    }
    expect(chart.targetX).toBeGreaterThan(chart.plotX0);
    expect(chart.targetX).toBeLessThanOrEqual(chart.plotX1);
  });
  it("scales linearly from zero: the axis starts at the plot's left edge at 0 µA", () => {
    expect(chart.axis[0]).toEqual({ x: chart.plotX0, label: "0" });
    const last = chart.axis[chart.axis.length - 1];
    expect(last?.x).toBeCloseTo(chart.plotX1, 9);
  });
  it("labels the axis in microamperes to 3 significant figures", () => {
    expect(microampsShort(0.00014)).toBe("140");
    expect(microampsShort(8.57e-5)).toBe("85.7");
    for (const a of chart.axis.slice(1)) expect(a.label).toMatch(/^\d{1,3}(\.\d+)?$/);
  });
});
