import { describe, expect, it } from "vitest";
import { isLit, solveAllStates, segmentCurrents } from "../../../../src/core/circuit/stateSweep.ts";
import { buildCircuit } from "../../../../src/core/circuit/circuit.ts";
import { DEFAULT_DC_SETTINGS, solveDc } from "../../../../src/core/circuit/dcSolver.ts";
import { directDesign } from "../../../support/budgetFixtures.ts";
import { showing, showingWith } from "../../../support/projects.ts";

describe("solveAllStates", () => {
  it("solves one circuit per state, in order, lighting exactly the lit segments", () => {
    const d = directDesign("1 7 8", showing(["1", "7", "8"]));
    const r = solveAllStates(d.spec, d.matrix, d.project.electrical, "nominal");
    if (!r.ok) throw new Error(r.error.message);
    expect(r.value.map((s) => s.circuit.state)).toEqual(["S0", "S1", "S2"]);
    r.value.forEach((s, k) => {
      for (const [o, i] of segmentCurrents(s)) {
        if (isLit(d.spec, k, o)) expect(i).toBeGreaterThan(100e-6);
        else expect(i).toBeLessThan(1e-9);
      }
    });
    expect(isLit(d.spec, 0, "1b")).toBe(true);
    expect(isLit(d.spec, 0, "1a")).toBe(false);
  });

  it.each(["bench-5v-switch", "panel-12v-sink", "cathode-5v-follower", "line-direct", "string-hv-sink"])(
    "lights exactly the lit segments with every preset's kind: %s (lit above a third of the target, unlit below 1 µA)",
    (preset) => {
      const d = directDesign(preset, showingWith(["1", "7", "8"], { preset }));
      const r = solveAllStates(d.spec, d.matrix, d.project.electrical, "nominal");
      if (!r.ok) throw new Error(r.error.message);
      const t = d.project.electrical.segment.targetA;
      r.value.forEach((s, k) => {
        for (const [o, i] of segmentCurrents(s)) {
          if (isLit(d.spec, k, o)) expect(i / t, `${preset} ${o} in S${k}`).toBeGreaterThan(1 / 3);
          else expect(i, `${preset} ${o} in S${k}`).toBeLessThan(1e-6);
        }
      });
    },
  );

  it("stops at its deadline inside a state's solve, not only between states, and says so", () => {
    const d = directDesign("lamp", showing(["1", "7"], 1));
    const r = solveAllStates(d.spec, d.matrix, d.project.electrical, "nominal", undefined, Date.now() - 1);
    expect(r.ok).toBe(false);
    if (r.ok) return;
    expect(r.error.kind).toBe("time-limit");
    expect(r.error.message).toMatch(/time limit ran out during the nominal solve, at state S0 of 2/);
    const c = buildCircuit(d.spec, d.matrix, d.project.electrical, 0);
    const op = solveDc(c, c.guess, { ...DEFAULT_DC_SETTINGS, deadlineMs: Date.now() - 1 });
    expect(op.ok).toBe(false);
    if (op.ok) return;
    expect(op.error.timeLimit).toBe(true);
    expect(op.error.message).toMatch(/time limit ran out while solving state S0 \(after 0 Newton iterations\)/);
    expect(solveDc(c, c.guess, { ...DEFAULT_DC_SETTINGS, deadlineMs: Date.now() + 60_000 }).ok).toBe(true);
  });

  it("names the solve and the state when a circuit fails", () => {
    // A 1e-300 ohm counter resistance (which the schema now refuses, but code may still hand the
    // solver) has a 1e300 S conductance that swamps every other one in double precision, so no
    // method converges: the sweep must say so, not guess.
    const d = directDesign("extreme", showing(["1", "7"], 1));
    const e = d.project.electrical;
    const r = solveAllStates(d.spec, d.matrix, { ...e, counterOutput: { ...e.counterOutput, resistance: 1e-300 } }, "nominal");
    expect(r.ok).toBe(false);
    if (r.ok) return;
    expect(r.error.kind).toBe("no-convergence");
    expect(r.error.message).toMatch(/^nominal: .*state S\d/);
  });
});
