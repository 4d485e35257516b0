import { describe, expect, it } from "vitest";
import { buildCircuit, type Circuit, type CircuitElement } from "../../../../src/core/circuit/circuit.ts";
import { DEFAULT_DC_SETTINGS, solveDc, type DcMethod } from "../../../../src/core/circuit/dcSolver.ts";
import { clockProject, directDesign, sharedDieRoller } from "../../../support/budgetFixtures.ts";
import { makeProject2 } from "../../../support/projects.ts";

function circuit(nodes: string[], elements: CircuitElement[]): Circuit {
  return { state: "T", stateIndex: 0, temperatureC: 27, nodes, elements, drivers: [], lineNodes: {}, guess: {} };
}

describe("solveDc", () => {
  it("solves a resistor divider exactly", () => {
    const c = circuit(
      ["in", "mid"],
      [
        { kind: "vsource", name: "V1", node: "in", volts: 10 },
        { kind: "resistor", name: "R1", role: "counter", a: "in", b: "mid", ohms: 3000 },
        { kind: "resistor", name: "R2", role: "pull-down", a: "mid", b: "0", ohms: 1000 },
      ],
    );
    const op = solveDc(c);
    expect(op.ok).toBe(true);
    if (!op.ok) return;
    expect(op.value.voltages["mid"]).toBeCloseTo(2.5, 12);
    expect(op.value.currents["R1"]).toBeCloseTo(2.5e-3, 14);
    expect(op.value.currents["V1"]).toBeCloseTo(2.5e-3, 14);
    expect(op.value.method).toBe("newton");
  });

  it("puts a diode's series resistance on an internal node", () => {
    const c = circuit(
      ["in", "a"],
      [
        { kind: "vsource", name: "V1", node: "in", volts: 5 },
        { kind: "resistor", name: "R1", role: "counter", a: "in", b: "a", ohms: 1000 },
        { kind: "diode", name: "D1", anode: "a", cathode: "0", isA: 1e-14, n: 1, rsOhms: 100 },
      ],
    );
    const op = solveDc(c);
    if (!op.ok) throw new Error(op.error.message);
    const i = op.value.currents["D1"] as number;
    const vj = op.value.voltages["D1#j"] as number;
    expect((op.value.voltages["a"] as number) - vj).toBeCloseTo(i * 100, 9);
    expect(op.value.currents["R1"]).toBeCloseTo(i, 12);
  });

  it.each<DcMethod>(["newton", "gmin-stepping", "source-stepping"])("reaches the same operating point by %s alone", (method) => {
    const d = sharedDieRoller();
    const c = buildCircuit(d.spec, d.matrix, d.project.electrical, 4);
    const ref = solveDc(c, c.guess);
    const alone = solveDc(c, undefined, { ...DEFAULT_DC_SETTINGS, methods: [method] });
    if (!ref.ok || !alone.ok) throw new Error("no convergence");
    expect(alone.value.method).toBe(method);
    for (const n of c.nodes) expect(alone.value.voltages[n]).toBeCloseTo(ref.value.voltages[n] as number, 6);
  });

  it("starts from SPICE's junction initialisation when given no guess", () => {
    const d = directDesign("hex", clockProject());
    const c = buildCircuit(d.spec, d.matrix, d.project.electrical, 37);
    const a = solveDc(c, c.guess);
    const b = solveDc(c);
    if (!a.ok || !b.ok) throw new Error("no convergence");
    for (const n of c.nodes) expect(b.value.voltages[n]).toBeCloseTo(a.value.voltages[n] as number, 6);
  });

  it("names the state when it cannot converge, and gives no numbers", () => {
    const d = sharedDieRoller();
    const c = buildCircuit(d.spec, d.matrix, d.project.electrical, 2);
    const op = solveDc(c, undefined, { ...DEFAULT_DC_SETTINGS, maxIterations: 2 });
    expect(op.ok).toBe(false);
    if (op.ok) return;
    expect(op.error.state).toBe("S2");
    expect(op.error.message).toMatch(/state S2/);
  });

  it("is deterministic", () => {
    const d = sharedDieRoller();
    const c = buildCircuit(d.spec, d.matrix, d.project.electrical, 5);
    expect(JSON.stringify(solveDc(c, c.guess))).toBe(JSON.stringify(solveDc(c, c.guess)));
  });

  it("converges on a dark segment with a small series resistance behind the supply (fast-check seed 4243 counterexample)", () => {
    // Its 0.5 Ω joins two nodes near 8 V that carry picoamperes: KCL there can be no tighter than the rounding of its terms.
    const p = makeProject2({
      counter: { states: 2 },
      display: { positions: 1, cell: "custom", segments: ["p", "q"] },
      glyphs: { A: ["q"], B: ["p"] },
      show: ["A", "B"],
      electrical: {
        temperatureC: -0.0000728152201361354,
        counterOutput: { high: 2, low: 0, resistance: 10 },
        logicSupply: { volts: 2 },
        diode: { is: 1e-7, n: 1, rs: 0.5 },
        pullDown: 10000,
        driver: { is: 1e-13, betaF: 20, betaR: 0.5, kind: "current-sink", emitterResistor: 100 },
        segment: { leds: 1, is: 1.7407897721635367e-19, n: 1.7327815909249056, rs: 0.5, seriesResistor: 0, targetA: 0.02, maxA: 10 },
        supply: { volts: 7.99999999885537, minVolts: 7.919999998866816, maxVolts: 8.079999998843924 },
      },
    });
    const d = directDesign("dark segment", p);
    for (let k = 0; k < 2; k++) {
      const c = buildCircuit(d.spec, d.matrix, p.electrical, k);
      const op = solveDc(c, c.guess);
      expect(op.ok, op.ok ? "" : op.error.message).toBe(true);
      if (op.ok) expect(op.value.method).toBe("newton");
    }
  });
});
