import { describe, expect, it } from "vitest";
import { buildCircuit, type Circuit, type CircuitElement } from "../../../../src/core/circuit/circuit.ts";
import { DEFAULT_DC_SETTINGS, solveDc, type DcMethod } from "../../../../src/core/circuit/dcSolver.ts";
import { clockProject, directDesign, sharedDieRoller } from "../../../support/budgetFixtures.ts";

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
});
