/**
 * Whether a switch is saturated. Sources: ngspice, the open reference
 * simulator (docs/sources.md "DC operating point"), and the bipolar
 * transistor's regions of operation (docs/sources.md "Device physics",
 * recalled from memory): with its base-emitter junction
 * forward-biased, a transistor whose base-collector junction is
 * reverse-biased works in its forward-active region, where Ic = beta Ib;
 * it is saturated only with that junction forward-biased too, and then
 * Ic/Ib is below beta.
 *
 * The case: 12 V panel segments (three red LEDs) on low-side switches, on
 * a 1, 7, 8 counter with complementary lines, every output decoded dark
 * through the divider input network. The dark decode's pull-up and divider
 * give 1a and 1d-1g (lit in one state only) too little base current for
 * the current a 180 Ω series resistor asks, whatever base resistor they
 * have: at the low corner (beta 100) they work in their active region, and
 * with a small base resistor (220 Ω) more base current brings Vce below
 * 2 Vbe. There the solver's GMIN (1e-12 S across each junction, as in
 * SPICE) puts Ic/Ib a part in 1e9 below beta, and the budget called the
 * switch saturated while it printed a forced beta of 100.0. 1b and 1c, lit
 * in every state, are tied on to the logic supply and deeply saturated.
 *
 * For each design the budget's low-corner circuit of every state is run
 * through ngspice, and each switch's verdict must be ngspice's: saturated
 * exactly when its base-collector junction is forward-biased in every
 * state that lights it.
 */
import { describe, expect, it } from "vitest";
import { budgetDesign, solveBudget } from "../../src/core/budget/budget.ts";
import { cornerConditions, cornerModel } from "../../src/core/budget/corners.ts";
import { designModel } from "../../src/core/budget/segmentDesign.ts";
import { buildCircuit } from "../../src/core/circuit/circuit.ts";
import { isLit } from "../../src/core/circuit/stateSweep.ts";
import { circuitNetlist } from "../../src/core/papers/netlist.ts";
import { compileSpec } from "../../src/core/spec/decodeSpec.ts";
import { synthesize, synthSettings } from "../../src/core/synth/synthesize.ts";
import { ngspiceOpRunner } from "../support/ngspiceOp.ts";
import { makeProject2 } from "../support/projects.ts";

const runNgspice = ngspiceOpRunner("saturation");

async function panel(seriesOhms: number, baseOhms: number) {
  const project = makeProject2({
    counter: { states: 3, drive: "complementary" },
    display: {},
    show: ["1", "7", "8"],
    synthesis: { maxDepth: 2, depth: "mixed", decode: "dark", darkInput: "divider", timeLimitMs: 10_000 },
    electrical: {
      preset: "panel-12v-sink",
      driver: { kind: "low-side-switch", baseResistor: baseOhms },
      segment: { seriesResistor: seriesOhms },
    },
  });
  const spec = compileSpec(project);
  const r = await synthesize(spec, synthSettings(project));
  if (!r.ok) throw new Error(JSON.stringify(r.error));
  const b = solveBudget(project, spec, r.value, { trim: "off" });
  if (!b.ok) throw new Error(b.error.message);
  return { project, spec, matrix: r.value, budget: b.value };
}

/** Per switch, ngspice's figures over the states that light it at the low corner. */
interface LowCornerSwitch {
  /** The base-collector junction forward-biased in every lit state. */
  bcForward: boolean;
  /** Vbc, Ic/Ib and Vce in each lit state. */
  points: { vbcV: number; ratio: number; vceV: number }[];
}

async function lowCornerByNgspice(d: Awaited<ReturnType<typeof panel>>, name: string): Promise<Map<string, LowCornerSwitch>> {
  const design = budgetDesign(d.budget);
  const model = designModel(d.project.electrical, design);
  const [low] = cornerConditions(model);
  const driven = [...d.matrix.outputs, ...d.matrix.tiedOn];
  const m = cornerModel(model, low, driven, design.ohms);
  const out = new Map<string, LowCornerSwitch>();
  d.spec.states.forEach((state, k) => {
    const c = buildCircuit(d.spec, d.matrix, m, k);
    const lit = c.drivers.filter((dr) => isLit(d.spec, k, dr.output));
    const probes = lit.flatMap((dr) => [
      `@${(dr.transistor as string).toLowerCase()}[ic]`,
      `@${(dr.transistor as string).toLowerCase()}[ib]`,
    ]);
    const ng = runNgspice(circuitNetlist(c, name), probes, `${name}-${k}.cir`);
    for (const dr of lit) {
      const q = (dr.transistor as string).toLowerCase();
      const vb = ng.get(dr.baseNode as string);
      const vc = ng.get(dr.collectorNode as string);
      if (vb === undefined || vc === undefined) throw new Error(`ngspice printed no voltage at ${dr.output}'s switch in ${state}`);
      const point = { vbcV: vb - vc, ratio: (ng.get(`@${q}[ic]`) as number) / (ng.get(`@${q}[ib]`) as number), vceV: vc };
      const s = out.get(dr.output) ?? { bcForward: true, points: [] };
      s.points.push(point);
      s.bcForward &&= point.vbcV > 0;
      out.set(dr.output, s);
    }
  });
  return out;
}

describe("a switch is judged saturated exactly when ngspice forward-biases its base-collector junction at the low corner", () => {
  it("180 Ω series, 220 Ω base: 1a and 1d-1g work in their active region (Vce above 1 V, Ic = 100 Ib): not saturated, and the budget says so", async () => {
    const d = await panel(180, 220);
    const ng = await lowCornerByNgspice(d, "active");
    const active = ["1a", "1d", "1e", "1f", "1g"];
    for (const o of active) {
      const s = ng.get(o);
      if (s === undefined) throw new Error(`no lit state for ${o}`);
      expect(s.bcForward, `${o}: ngspice's Vbc ${s.points.map((p) => p.vbcV.toFixed(3)).join(", ")}`).toBe(false);
      for (const p of s.points) {
        expect(p.vceV).toBeGreaterThan(1);
        // Forward-active: Ic = beta Ib with the corner's beta, the lowest (100).
        expect(p.ratio).toBeCloseTo(d.project.electrical.tolerance.betaMin, 4);
      }
      expect(d.budget.drivers[o]?.saturated, o).toBe(false);
      // The figure is the real ratio, which ngspice's GMIN also puts a hair below beta: it prints as 100.0.
      expect(d.budget.drivers[o]?.forcedBeta).toBeCloseTo(d.project.electrical.tolerance.betaMin, 4);
    }
    const warned = d.budget.warnings.flatMap((w) => (w.code === "switch-unsaturated" ? [w.output] : []));
    expect(warned).toEqual(active);
    expect(d.budget.corners.shortOf).toContain("switch-unsaturated");
    expect(d.budget.corners.meetsTarget).toBe(false);
    // 1b and 1c, tied on: both junctions forward-biased, a forced beta far below 100.
    for (const o of ["1b", "1c"]) {
      expect(ng.get(o)?.bcForward, o).toBe(true);
      expect(d.budget.drivers[o]?.saturated, o).toBe(true);
      expect(d.budget.drivers[o]?.forcedBeta).toBeLessThan(10);
    }
  }, 120_000);

  it("on every switch of three designs, the budget's verdict is ngspice's junction, and a saturated switch's forced beta is below the lowest beta", async () => {
    let both = { saturated: 0, active: 0 };
    for (const [rs, rb] of [
      [180, 1000],
      [220, 220],
      [330, 1000],
    ] as const) {
      const d = await panel(rs, rb);
      const ng = await lowCornerByNgspice(d, `r${rs}-${rb}`);
      for (const [o, s] of ng) {
        const verdict = d.budget.drivers[o];
        expect(verdict?.saturated, `${rs} Ω / ${rb} Ω ${o}: ngspice's Vbc ${s.points.map((p) => p.vbcV.toFixed(3)).join(", ")}`).toBe(
          s.bcForward,
        );
        if (s.bcForward) expect(verdict?.forcedBeta).toBeLessThan(d.project.electrical.tolerance.betaMin);
        both = s.bcForward ? { ...both, saturated: both.saturated + 1 } : { ...both, active: both.active + 1 };
      }
    }
    // Both verdicts are met, so the check can fail either way.
    expect(both.saturated).toBeGreaterThan(0);
    expect(both.active).toBeGreaterThan(0);
  }, 180_000);
});
