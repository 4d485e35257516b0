import { describe, expect, it } from "vitest";
import { highDrivers, highGates, highLines, isGateInput, orPlane } from "../../../../src/core/circuit/counterLines.ts";
import { buildCircuit } from "../../../../src/core/circuit/circuit.ts";
import { designators } from "../../../../src/core/matrix/designators.ts";
import { codedDecoder } from "../../../support/codedProjects.ts";
import { makeProject2 } from "../../../support/projects.ts";

const bcd = () => codedDecoder(makeProject2({ counter: { states: 10, code: "binary" }, display: {}, show: [..."0123456789"] }));

describe("counterLines", () => {
  it("reads each state's high stage lines off its code (Q<i> where stage i is 1, nQ<i> where it is 0)", () => {
    const { matrix } = bcd();
    expect([...highLines(matrix, 3)].sort()).toEqual(["Q0", "Q1", "nQ2", "nQ3"]);
    expect([...highLines(matrix, 8)].sort()).toEqual(["Q3", "nQ0", "nQ1", "nQ2"]);
  });

  it("a gate is high exactly when every input is high, and the OR plane leaves out its input diodes", () => {
    const { matrix } = bcd();
    for (let k = 0; k < 10; k++) {
      const lines = highLines(matrix, k);
      const gates = highGates(matrix, k);
      for (const g of matrix.gates) expect(gates.has(g.ref)).toBe(g.inputs.every((i) => lines.has(i)));
      expect(highDrivers(matrix, k)).toEqual(new Set([...lines, ...gates]));
    }
    const plane = orPlane(matrix);
    const orCount = [...plane.values()].reduce((n, l) => n + l.length, 0);
    const inputs = matrix.diodes.filter((d) => isGateInput(matrix, d)).length;
    expect(inputs).toBe(matrix.gates.reduce((n, g) => n + g.inputs.length, 0));
    expect(orCount + inputs).toBe(matrix.diodes.length);
  });

  it("a one-hot counter's only high line is its state's", () => {
    const m = { states: ["S0", "S1"], codes: [], lines: ["S0", "S1"], gates: [] } as never;
    expect([...highLines(m, 1)]).toEqual(["S1"]);
  });
});

describe("buildCircuit on a coded decoder", () => {
  it("has a source per stage line at the state's level, behind the high or the low resistance, and a pull-up per gate from the logic supply", () => {
    const { project, spec, matrix } = bcd();
    const e = project.electrical;
    const c = buildCircuit(spec, matrix, e, 5);
    const byName = new Map(c.elements.map((x) => [x.name, x]));
    expect(byName.get("VQ0")).toMatchObject({ kind: "vsource", node: "q0_v", volts: e.counterOutput.high });
    expect(byName.get("RQ0")).toMatchObject({ a: "q0_v", b: "q0", ohms: e.counterOutput.resistance });
    expect(byName.get("VnQ0")).toMatchObject({ volts: e.counterOutput.low });
    expect(byName.get("RnQ0")).toMatchObject({ ohms: e.counterOutput.lowResistance });
    expect(byName.get("VLOGIC")).toMatchObject({ node: "vlogic", volts: e.logicSupply.volts });
    const parts = designators(spec, matrix, e);
    expect(parts.gates.map((g) => g.gate)).toEqual(matrix.gates.map((g) => g.ref));
    for (const g of parts.gates) {
      expect(byName.get(g.pullUp.ref)).toMatchObject({
        kind: "resistor",
        role: "gate-pull-up",
        a: "vlogic",
        b: g.gate.toLowerCase(),
        ohms: e.gatePullUp,
      });
    }
    // The pull-ups continue the R numbers after every driver resistor.
    const last = Math.max(
      ...parts.drivers
        .flatMap((d) => [d.current, d.base, d.baseEmitter, d.pullDown, d.tieOn])
        .filter((r) => r !== null)
        .map((r) => Number(r.ref.slice(1))),
    );
    expect(parts.gates[0]?.pullUp.ref).toBe(`R${last + 1}`);
    expect(c.nodes).toEqual(expect.arrayContaining(matrix.gates.map((g) => g.ref.toLowerCase())));
    expect(new Set(c.nodes).size).toBe(c.nodes.length);
  });
});
