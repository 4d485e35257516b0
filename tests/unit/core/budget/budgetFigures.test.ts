/**
 * The budget's worst unlit segment (`unlit`), at the nominal values and at
 * each tolerance corner, against an independent DC solve of every state's
 * circuit (`buildCircuit`, `solveDc`, each state from its own guess): the
 * largest current of a segment its state leaves dark, and where.
 */
import { describe, expect, it } from "vitest";
import { budgetDesign, solveBudget } from "../../../../src/core/budget/budget.ts";
import type { UnlitFigure } from "../../../../src/core/budget/budgetTypes.ts";
import { cornerConditions, cornerModel } from "../../../../src/core/budget/corners.ts";
import { designModel } from "../../../../src/core/budget/segmentDesign.ts";
import { buildCircuit } from "../../../../src/core/circuit/circuit.ts";
import { solveDc } from "../../../../src/core/circuit/dcSolver.ts";
import { isLit } from "../../../../src/core/circuit/stateSweep.ts";
import type { Project } from "../../../../src/core/project/project.ts";
import { compileSpec } from "../../../../src/core/spec/decodeSpec.ts";
import { synthesize, synthSettings } from "../../../../src/core/synth/synthesize.ts";
import { example, makeProject2 } from "../../../support/projects.ts";

/** Every state solved on its own: per unlit segment, its current. */
async function unlitSolved(project: Project) {
  const spec = compileSpec(project);
  const r = await synthesize(spec, synthSettings(project, { mode: "fast" }));
  if (!r.ok) throw new Error(r.error.message);
  const matrix = r.value;
  const b = solveBudget(project, spec, matrix);
  if (!b.ok) throw new Error(b.error.message);
  const design = budgetDesign(b.value);
  const model = designModel(project.electrical, design);
  const driven = [...matrix.outputs, ...matrix.tiedOn];
  const [low, high] = cornerConditions(model);
  const cases = [
    { name: "nominal", model, ohms: design.ohms },
    { name: "low", model: cornerModel(model, low, driven, design.ohms), ohms: undefined },
    { name: "high", model: cornerModel(model, high, driven, design.ohms), ohms: undefined },
  ] as const;
  const solved = new Map<string, Map<string, number>>();
  for (const c of cases) {
    const currents = new Map<string, number>();
    spec.states.forEach((state, k) => {
      const circuit = buildCircuit(spec, matrix, c.model, k, c.ohms);
      const op = solveDc(circuit, circuit.guess);
      if (!op.ok) throw new Error(op.error.message);
      for (const d of circuit.drivers)
        if (!isLit(spec, k, d.output)) currents.set(`${d.output} in ${state}`, op.value.currents[d.display] as number);
    });
    solved.set(c.name, currents);
  }
  return { budget: b.value, solved };
}

/** The budget's figure is the largest the solve finds, and the solve's current where the budget says is that largest. */
function agrees(figure: UnlitFigure | null, currents: ReadonlyMap<string, number>, what: string): void {
  expect(figure, what).not.toBeNull();
  if (figure === null) return;
  const largest = Math.max(...currents.values());
  expect(Math.abs(figure.currentA - largest) / largest, `${what}: ${figure.currentA} against ${largest}`).toBeLessThan(1e-6);
  const there = currents.get(`${figure.output} in ${figure.state}`);
  expect(there, `${what}: ${figure.output} in ${figure.state} is unlit`).toBeDefined();
  expect(Math.abs((there as number) - largest) / largest, what).toBeLessThan(1e-6);
}

describe("worst unlit segment", () => {
  it("of PNP high-side switches (the quiz scoreboard): the DC solve's at the nominal values and each corner, far under the ghost limit", async () => {
    const { budget, solved } = await unlitSolved(example("quiz-scoreboard"));
    expect(budget.kind).toBe("high-side-switch");
    expect(budget.unlit.ghostLimitA).toBeCloseTo(0.01 * budget.targetA, 15);
    for (const name of ["nominal", "low", "high"] as const) {
      agrees(budget.unlit[name], solved.get(name) as Map<string, number>, name);
      // Held off by Rbe and the idle lines: leakage, not light (a nanoampere is far below a visible glow).
      expect(budget.unlit[name]?.currentA, name).toBeLessThan(1e-9);
    }
  }, 60_000);

  it("of dark-decoded outputs through dividers: the one output and state where it is worst, at each corner", async () => {
    const project = makeProject2({
      counter: { states: 10, drive: "complementary" },
      display: { positions: 1, cell: "seg7" },
      show: [..."0123456789"],
      synthesis: { depth: "mixed", decode: "dark", darkInput: "divider", timeLimitMs: 5000 },
    });
    const { budget, solved } = await unlitSolved(project);
    for (const name of ["nominal", "low", "high"] as const) agrees(budget.unlit[name], solved.get(name) as Map<string, number>, name);
    // Tens of microamperes at the high corner, in one place: the dark section finds the same.
    expect(budget.unlit.high?.currentA).toBeGreaterThan(1e-5);
    expect(budget.dark?.worstUnlit.corner).toBe("high");
    expect([budget.unlit.high?.output, budget.unlit.high?.state]).toEqual([budget.dark?.worstUnlit.output, budget.dark?.worstUnlit.state]);
    expect(budget.unlit.high?.currentA).toBeCloseTo(budget.dark?.worstUnlit.currentA ?? NaN, 12);
  }, 60_000);

  it("is null where every output is lit in every state", async () => {
    const project = makeProject2({ counter: { states: 2 }, display: { positions: 1, cell: "seg7" }, show: ["8", "8"] });
    const spec = compileSpec(project);
    const r = await synthesize(spec, synthSettings(project, { mode: "fast" }));
    if (!r.ok) throw new Error(r.error.message);
    const b = solveBudget(project, spec, r.value);
    if (!b.ok) throw new Error(b.error.message);
    expect(b.value.unlit).toEqual({ ghostLimitA: b.value.unlit.ghostLimitA, nominal: null, low: null, high: null });
  });
});
