/**
 * The reading of a sweep keeps, per state and over the states, exactly the
 * values the kept circuits and operating points hold: the budget's figures
 * come from it instead of from every state's whole solution.
 */
import { describe, expect, it } from "vitest";
import { driverPoint, readSweep } from "../../../../src/core/budget/sweepReading.ts";
import { highDrivers, highGates, highLines, sourceLines } from "../../../../src/core/circuit/counterLines.ts";
import { solveAllStates } from "../../../../src/core/circuit/stateSweep.ts";
import { DcWorkspace } from "../../../../src/core/circuit/dcSolver.ts";
import type { DiodeMatrix } from "../../../../src/core/matrix/matrix.ts";
import type { ElectricalModel } from "../../../../src/core/project/project.ts";
import type { DecodeSpec } from "../../../../src/core/spec/decodeSpec.ts";
import { sharedDieRoller } from "../../../support/budgetFixtures.ts";
import { codedDecoder } from "../../../support/codedProjects.ts";
import { makeProject2 } from "../../../support/projects.ts";

/** Checks a reading against the whole solutions of the same sweep, value for value. */
function expectSameAsSolutions(spec: DecodeSpec, matrix: DiodeMatrix, model: ElectricalModel, design?: ReadonlyMap<string, number>): void {
  const sols = solveAllStates(spec, matrix, model, "check", design);
  const r = readSweep(spec, matrix, model, "check", { design });
  if (!sols.ok || !r.ok) throw new Error("the sweep failed");
  const reading = r.value;
  expect(reading.states).toHaveLength(sols.value.length);
  expect(reading.drivers.map((d) => d.output)).toEqual(sols.value[0]?.circuit.drivers.map((d) => d.output));
  sols.value.forEach((s, k) => {
    const st = reading.states[k];
    if (!st) throw new Error(`no reading of state ${k}`);
    expect([st.state, st.stateIndex, st.method, st.iterations]).toEqual([s.circuit.state, k, s.op.method, s.op.iterations]);
    s.circuit.drivers.forEach((d, j) => {
      expect(st.segmentA[j]).toBe(s.op.currents[d.display]);
      expect(st.inputV[j]).toBe(s.op.voltages[d.inputNode]);
      expect(st.points[j]).toEqual(driverPoint(s, d));
    });
    const high = [...highLines(matrix, k)];
    // A stage line no diode meets has no source in the circuit (sourceLines): it sources nothing.
    expect(st.highSourceA).toBe(high.reduce((a, l) => a + (s.op.currents[`V${l}`] ?? 0), 0));
    expect(st.supplyA).toBe(s.op.currents["VSUP"] ?? 0);
    expect(st.logicA).toBe(s.op.currents["VLOGIC"] ?? 0);
    const wired = [...highDrivers(matrix, k)].filter((d) => s.circuit.lineNodes[d] !== undefined);
    expect([...st.highDriverV]).toEqual(wired.map((d) => [d, s.op.voltages[s.circuit.lineNodes[d] as string]]));
  });
  // Worst cases over the states, worked out here from the whole solutions.
  for (const d of matrix.diodes) {
    const el = sols.value[0]?.circuit.elements.find((x) => x.name === d.ref);
    if (el?.kind !== "diode") throw new Error(`no diode ${d.ref}`);
    const currents = sols.value.map((s) => s.op.currents[d.ref] as number);
    const reverse = sols.value.map((s) => (s.op.voltages[el.cathode] as number) - (s.op.voltages[el.anode] as number));
    expect(reading.diodes.get(d.ref)).toEqual({ maxCurrentA: Math.max(0, ...currents), maxReverseV: Math.max(0, ...reverse) });
  }
  for (const l of sourceLines(matrix)) {
    const node = sols.value[0]?.circuit.lineNodes[l] as string;
    const highs = sols.value.filter((s) => highLines(matrix, s.circuit.stateIndex).has(l));
    const lows = sols.value.filter((s) => !highLines(matrix, s.circuit.stateIndex).has(l));
    const source = Math.max(...highs.map((s) => s.op.currents[`V${l}`] as number));
    const sink = Math.max(...lows.map((s) => -(s.op.currents[`V${l}`] as number)));
    const w = reading.counterLines.get(l);
    expect(w?.source?.a).toBe(source);
    expect(w?.source?.state).toBe(highs.find((s) => s.op.currents[`V${l}`] === source)?.circuit.state);
    expect(w?.source?.v).toBe(highs.find((s) => s.op.currents[`V${l}`] === source)?.op.voltages[node]);
    expect(w?.sink?.a).toBe(sink);
    expect(w?.sink?.state).toBe(lows.find((s) => -(s.op.currents[`V${l}`] as number) === sink)?.circuit.state);
  }
  expect(reading.gates.size).toBe(matrix.gates.length);
  for (const g of matrix.gates) {
    const node = sols.value[0]?.circuit.lineNodes[g.ref] as string;
    const pullUp = sols.value[0]?.circuit.elements.find((x) => x.kind === "resistor" && x.role === "gate-pull-up" && x.b === node);
    if (pullUp?.kind !== "resistor") throw new Error(`no pull-up of ${g.ref}`);
    const isHigh = (s: (typeof sols.value)[number]): boolean => highGates(matrix, s.circuit.stateIndex).has(g.ref);
    const highV = sols.value.filter(isHigh).map((s) => s.op.voltages[node] as number);
    const lowV = sols.value.filter((s) => !isHigh(s)).map((s) => s.op.voltages[node] as number);
    expect(reading.gates.get(g.ref)).toEqual({
      pullUp: { ref: pullUp.name, ohms: pullUp.ohms },
      lowMaxV: lowV.length > 0 ? Math.max(...lowV) : null,
      highMinV: highV.length > 0 ? Math.min(...highV) : null,
      maxPullUpA: Math.max(0, ...sols.value.map((s) => s.op.currents[pullUp.name] as number)),
    });
  }
}

describe("readSweep", () => {
  it("keeps a one-hot matrix's figures exactly as its kept solutions hold them (a sink, a switch, direct drive)", () => {
    for (const preset of ["panel-12v-sink", "bench-5v-switch", "line-direct"]) {
      const d = sharedDieRoller({ preset });
      expectSameAsSolutions(d.spec, d.matrix, d.project.electrical);
    }
  });

  it("keeps a coded decoder's gate levels, pull-up currents and stage lines exactly as its kept solutions hold them", () => {
    const { project, spec, matrix } = codedDecoder(
      makeProject2({ counter: { states: 10, code: "binary" }, display: {}, show: [..."0123456789"], electrical: {} }),
    );
    expect(matrix.gates.length).toBeGreaterThan(0);
    expectSameAsSolutions(spec, matrix, project.electrical);
  });

  it("solves a design's values, and gives the same numbers with a shared scratch space as with its own", () => {
    const d = sharedDieRoller();
    const design = new Map(d.spec.outputs.map((o) => [o, 220]));
    expectSameAsSolutions(d.spec, d.matrix, d.project.electrical, design);
    const workspace = new DcWorkspace();
    const own = readSweep(d.spec, d.matrix, d.project.electrical, "a");
    readSweep(d.spec, d.matrix, d.project.electrical, "b", { design, workspace });
    const shared = readSweep(d.spec, d.matrix, d.project.electrical, "c", { workspace });
    if (!own.ok || !shared.ok) throw new Error("the sweep failed");
    expect(shared.value.states).toEqual(own.value.states);
    expect(shared.value.diodes).toEqual(own.value.diodes);
  });

  it("stops at its deadline, naming the solve and the state it did not start", () => {
    const d = sharedDieRoller();
    const r = readSweep(d.spec, d.matrix, d.project.electrical, "low corner", { deadlineMs: Date.now() - 1 });
    expect(r.ok).toBe(false);
    if (r.ok) return;
    expect(r.error).toMatchObject({ kind: "time-limit", state: "S0", during: "low corner" });
  });
});
