import { describe, expect, it } from "vitest";
import { buildMatrix } from "../../../../src/core/matrix/matrix.ts";
import type { DepthPolicy } from "../../../../src/core/project/project.ts";
import { heuristicPlan } from "../../../../src/core/synth/heuristic.ts";
import { planCount, planEdges, problemFromLit } from "../../../../src/core/synth/plan.ts";
import { verifyMatrix } from "../../../../src/core/matrix/verify.ts";
import { litRows, specFromLit } from "../../../support/litSpec.ts";

function run(rows: string[], depth: DepthPolicy, maxDepth = 2, links = true) {
  const spec = specFromLit(litRows(...rows));
  const plan = heuristicPlan(problemFromLit(spec.lit), { depthLimit: maxDepth, policy: depth, buses: true, links });
  const m = buildMatrix(spec, planEdges(spec, plan), {
    lowerBound: null,
    optimal: false,
    depthLimit: maxDepth,
    policy: depth,
    method: "heuristic",
  });
  return { plan, verdict: verifyMatrix(spec, m, { depthLimit: maxDepth, policy: depth }) };
}

describe("heuristicPlan", () => {
  it("finds the one bus of a 3x3 block", () => {
    const { plan, verdict } = run(["111", "111", "111", "000"], "mixed", 2, false);
    expect(verdict.ok).toBe(true);
    expect(planCount(plan)).toBe(6);
    expect(plan.buses).toEqual([{ states: [0, 1, 2], outputs: [0, 1, 2] }]);
  });
  it("links identical columns", () => {
    const { plan, verdict } = run(["111", "111", "111", "000"], "per-segment");
    expect(verdict.ok).toBe(true);
    expect(planCount(plan)).toBe(5); // one output direct (3), two links
    expect(plan.links.length).toBe(2);
  });
  it("depth 1 and uniform give verified plans", () => {
    for (const depth of ["mixed", "per-segment", "uniform"] as const) {
      for (const maxDepth of [1, 2, 3]) {
        const { plan, verdict } = run(["1101", "0111", "1111", "0100", "1010"], depth, maxDepth);
        expect(verdict.ok, `${depth} ${maxDepth}`).toBe(true);
        if (maxDepth === 1) expect(plan.buses.length + plan.links.length).toBe(0);
      }
    }
  });
  it("is deterministic", () => {
    const a = run(["1101", "0111", "1111", "0100", "1010"], "per-segment").plan;
    const b = run(["1101", "0111", "1111", "0100", "1010"], "per-segment").plan;
    expect(a).toEqual(b);
  });
});
