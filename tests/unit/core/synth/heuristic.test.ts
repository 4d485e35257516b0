import { describe, expect, it } from "vitest";
import { buildMatrix } from "../../../../src/core/matrix/matrix.ts";
import type { DepthPolicy } from "../../../../src/core/project/project.ts";
import { heuristicPlan } from "../../../../src/core/synth/heuristic.ts";
import { WorkMeter } from "../../../../src/core/synth/workMeter.ts";
import { expandPlan, reduceRows, unionPlans } from "../../../../src/core/synth/reduce.ts";
import { compileSpec } from "../../../../src/core/spec/decodeSpec.ts";
import { showing } from "../../../support/projects.ts";
import { litCount, planCount, planEdges, problemFromLit, sharingProblem } from "../../../../src/core/synth/plan.ts";
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

describe("heuristicPlan under a work budget", () => {
  it("stops on its meter with a verified plan, the same every run, and never above direct", () => {
    const rows = ["1101", "0111", "1111", "0100", "1010", "0110", "1001"];
    const spec = specFromLit(litRows(...rows));
    const p = problemFromLit(spec.lit);
    const rules = { depthLimit: 2, policy: "per-segment", buses: true, links: true } as const;
    for (const budget of [0, 10, 200, 5000]) {
      const meterA = new WorkMeter(budget);
      const a = heuristicPlan(p, rules, { meter: meterA });
      const b = heuristicPlan(p, rules, { meter: new WorkMeter(budget) });
      expect(b).toEqual(a);
      expect(planCount(a)).toBeLessThanOrEqual(litCount(p));
      // The meter may overrun by the one step that crossed it, never by a whole search.
      expect(meterA.work).toBeLessThan(budget + 200);
      const m = buildMatrix(spec, planEdges(spec, a), {
        lowerBound: null,
        optimal: false,
        depthLimit: 2,
        policy: "per-segment",
        method: "heuristic",
      });
      expect(verifyMatrix(spec, m, rules).ok, `budget ${budget}`).toBe(true);
    }
  });
  it("is never worse than solving each display position on its own (00-29, every policy)", () => {
    const show = Array.from({ length: 30 }, (_, k) => String(k).padStart(2, "0"));
    const p = sharingProblem(compileSpec(showing(show, 2)));
    expect(new Set(p.group)).toEqual(new Set([0, 1]));
    for (const policy of ["mixed", "per-segment"] as const) {
      const rules = { depthLimit: 2, policy, buses: true, links: true } as const;
      const parts = [0, 1].map((g) => {
        const r = reduceRows(
          p,
          p.group.flatMap((x, o) => (x === g ? [o] : [])),
        );
        return expandPlan(r, heuristicPlan(r.problem, rules));
      });
      expect(planCount(heuristicPlan(p, rules)), policy).toBeLessThanOrEqual(planCount(unionPlans(parts)));
    }
  });
});
