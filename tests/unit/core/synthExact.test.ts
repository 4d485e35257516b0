import { describe, expect, it } from "vitest";
import { exactPlan, defaultHighsLoader, type HighsLoader } from "../../../src/core/synthExact.ts";
import { heuristicPlan } from "../../../src/core/synthHeuristic.ts";
import { planCount, problemFromLit } from "../../../src/core/synthPlan.ts";
import { litRows } from "../../support/litSpec.ts";

const p = problemFromLit(litRows("1101", "0111", "1111", "0100", "1010", "0000"));
const rules = { maxDepth: 2, depth: "per-segment", buses: true, links: true } as const;

describe("exactPlan", () => {
  it("proves a small optimum, never above the warm start", async () => {
    const warm = heuristicPlan(p, rules);
    const r = await exactPlan(p, rules, warm, { timeLimitMs: 5000, seed: 1, loadHighs: defaultHighsLoader });
    expect(r.status).toBe("optimal");
    expect(r.complete).toBe(true);
    expect(planCount(r.plan)).toBeLessThanOrEqual(planCount(warm));
    expect(r.lowerBound).toBe(planCount(r.plan));
  });
  it("gives the same plan every run", async () => {
    const warm = heuristicPlan(p, rules);
    const opts = { timeLimitMs: 5000, seed: 7, loadHighs: defaultHighsLoader };
    const a = await exactPlan(p, rules, warm, opts);
    const b = await exactPlan(p, rules, warm, opts);
    expect(a.plan).toEqual(b.plan);
  });
  it("turns a solver crash into a typed outcome that keeps the warm start", async () => {
    const warm = heuristicPlan(p, rules);
    const crashing: HighsLoader = async () => ({
      createModel() {
        throw new Error("RuntimeError: memory access out of bounds");
      },
    });
    // HiGHS only: the branch-and-bound would prove this instance without reaching the solver.
    const r = await exactPlan(p, rules, warm, { timeLimitMs: 1000, seed: 1, loadHighs: crashing, search: false });
    expect(r.status).toBe("solver-failed");
    expect(r.message).toMatch(/out of bounds/);
    expect(r.plan).toBe(warm);
    expect(r.lowerBound).toBeLessThanOrEqual(planCount(warm));
  });
  it("claims only the combinatorial bound at depth 3", async () => {
    const deep = { ...rules, maxDepth: 3 };
    const r = await exactPlan(p, deep, heuristicPlan(p, deep), { timeLimitMs: 5000, seed: 1, loadHighs: defaultHighsLoader });
    expect(r.lowerBound).toBe(5); // max(4 outputs, 5 active states)
  });
});
