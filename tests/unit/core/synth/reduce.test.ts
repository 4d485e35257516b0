import { describe, expect, it } from "vitest";
import { planCost, planCount, problemFromLit } from "../../../../src/core/synth/plan.ts";
import { contractPlan, expandPlan, reduceRows, unionPlans } from "../../../../src/core/synth/reduce.ts";
import { litRows } from "../../../support/litSpec.ts";

describe("reduceRows", () => {
  // S0 and S2 light the same outputs; S3 lights nothing.
  const p = problemFromLit(litRows("110", "011", "110", "000"), { group: [0, 0, 1] });
  it("merges identical rows into one that stands for all of them, and drops dark rows", () => {
    const r = reduceRows(p);
    expect(r.problem.n).toBe(2);
    expect(r.members).toEqual([[0, 2], [1]]);
    expect(r.problem.weight).toEqual([2, 1]);
    expect(r.problem.group).toEqual([0, 0, 1]);
  });
  it("restricted to a group, merges the rows that agree on it", () => {
    const r = reduceRows(p, [0, 1]);
    expect(r.outputs).toEqual([0, 1]);
    expect(r.members).toEqual([[0, 2], [1]]);
    const g = reduceRows(p, [2]);
    expect(g.members).toEqual([[1]]);
    expect(g.outputs).toEqual([2]);
  });
  it("expands a plan of merged rows to one of the same cost in every state", () => {
    const r = reduceRows(p);
    const plan = { direct: [[1, 1] as [number, number], [1, 2] as [number, number]], buses: [{ states: [0], outputs: [0, 1] }], links: [] };
    expect(planCost(r.problem, plan)).toBe(2 + 2 + 2);
    const full = expandPlan(r, plan);
    expect(full.buses).toEqual([{ states: [0, 2], outputs: [0, 1] }]);
    expect(full.direct).toEqual([
      [1, 1],
      [1, 2],
    ]);
    expect(planCount(full)).toBe(6);
  });
  it("contracts a plan to one no dearer: each merged row takes its cheapest state's cover", () => {
    const r = reduceRows(p);
    // S0 direct (2 diodes), S2 through its own bus (3 diodes): the merged row takes S0's cover.
    const plan = {
      direct: [[0, 0] as [number, number], [0, 1] as [number, number], [1, 1] as [number, number], [1, 2] as [number, number]],
      buses: [{ states: [2], outputs: [0, 1] }],
      links: [],
    };
    const c = contractPlan(r, plan);
    expect(c.buses).toEqual([]);
    expect(planCount(expandPlan(r, c))).toBeLessThanOrEqual(planCount(plan));
    expect(planCost(r.problem, c)).toBe(6);
  });
  it("joins plans of disjoint groups", () => {
    const a = { direct: [[0, 0] as [number, number]], buses: [], links: [] };
    const b = { direct: [], buses: [{ states: [1, 2], outputs: [2] }], links: [{ from: 2, to: 1 }] };
    expect(unionPlans([a, b])).toEqual({ direct: a.direct, buses: b.buses, links: b.links });
  });
});
