import { describe, expect, it } from "vitest";
import { exactPlan, defaultHighsLoader, type HighsLoader } from "../../../../src/core/synth/exact.ts";
import { heuristicPlan } from "../../../../src/core/synth/heuristic.ts";
import { planCount, problemFromLit } from "../../../../src/core/synth/plan.ts";
import { litRows } from "../../../support/litSpec.ts";
import { compileSpec } from "../../../../src/core/spec/decodeSpec.ts";
import { synthesize, synthSettings } from "../../../../src/core/synth/synthesize.ts";
import { benchProject, BENCH_CASES } from "../../../../bench/synthBench.ts";
import { workBudget } from "../../../../src/core/synth/workBudget.ts";

function hexProblem(policy: "mixed" | "per-segment" | "uniform") {
  const c = BENCH_CASES.find((x) => x.name === "0-F");
  if (!c) throw new Error("bench case 0-F is missing");
  return benchProject({ ...c, timeLimitMs: 2000 }, policy);
}

const p = problemFromLit(litRows("1101", "0111", "1111", "0100", "1010", "0000"));
const rules = { depthLimit: 2, policy: "per-segment", buses: true, links: true } as const;

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
    const deep = { ...rules, depthLimit: 3 };
    const r = await exactPlan(p, deep, heuristicPlan(p, deep), { timeLimitMs: 5000, seed: 1, loadHighs: defaultHighsLoader });
    expect(r.lowerBound).toBe(5); // max(4 outputs, 5 active states)
  });
  it("a time-limited run gives the same matrix and bound every run (0-F per-segment, 2 s)", async () => {
    // 2 s is too little to prove 52 here, so the run stops on its work budget, not on a proof.
    const project = hexProblem("per-segment");
    const spec = compileSpec(project);
    const a = await synthesize(spec, synthSettings(project));
    const b = await synthesize(spec, synthSettings(project));
    expect(a.ok && b.ok).toBe(true);
    if (!a.ok || !b.ok) return;
    expect(a.value.optimal).toBe(false);
    expect(a.value.lowerBound ?? Infinity).toBeLessThanOrEqual(52);
    // Where the work budget, not the clock, ended both runs, they must agree;
    // a machine slow enough for the clock to cut a run is told so by deadlineHit.
    if (!a.value.deadlineHit && !b.value.deadlineHit) expect(b.value).toEqual(a.value);
  }, 20_000);
  it("the work budgets of a 2 s limit give the same plan and bound on any machine (0-F per-segment)", async () => {
    // The budgets of a 2 s run, with the clock's deadline out of reach: however
    // slow or busy the machine, only the budgets can end the run, so every run
    // must agree (the deterministic core of the case above).
    const hp = problemFromLit(compileSpec(hexProblem("per-segment")).lit);
    const warm = heuristicPlan(hp, rules);
    const opts = { timeLimitMs: 2000, deadlineMs: Date.now() + 600_000, seed: 1, loadHighs: defaultHighsLoader, budget: workBudget(2000) };
    const a = await exactPlan(hp, rules, warm, opts);
    const b = await exactPlan(hp, rules, warm, opts);
    expect(a.deadlineHit).toBe(false);
    expect(a.status).not.toBe("optimal");
    expect(b.plan).toEqual(a.plan);
    expect(b.lowerBound).toBe(a.lowerBound);
    expect(a.lowerBound).toBeLessThanOrEqual(52);
  }, 600_000);
  it("a run the deadline cuts says so, and still returns the warm start or better with an honest bound", async () => {
    const project = hexProblem("per-segment");
    const hp = problemFromLit(compileSpec(project).lit);
    const warm = heuristicPlan(hp, rules);
    // The clock has already run out: every phase stops at its first check.
    const r = await exactPlan(hp, rules, warm, { timeLimitMs: 2000, deadlineMs: Date.now() - 1, seed: 1, loadHighs: defaultHighsLoader });
    expect(r.deadlineHit).toBe(true);
    expect(planCount(r.plan)).toBeLessThanOrEqual(planCount(warm));
    expect(r.lowerBound).toBeLessThanOrEqual(52); // the proven optimum (see the bench)
  });
  it("HiGHS stopped by its work budget gives the same plan and bound every run", async () => {
    const p0 = compileSpec(hexProblem("mixed"));
    const hp = problemFromLit(p0.lit);
    const mixed = { depthLimit: 2, policy: "mixed", buses: true, links: true } as const;
    const warm = heuristicPlan(hp, mixed);
    // The clock and the node budget are far away; only the work budget (LP iterations x columns) can stop HiGHS here.
    const opts = {
      timeLimitMs: 120_000,
      seed: 3,
      loadHighs: defaultHighsLoader,
      search: false,
      budget: {
        heuristicWork: 0,
        searchWork: 0,
        familyWork: 1e12,
        lpWork: 0,
        lagrangeWork: 0,
        levelWork: 0,
        highsNodes: 1e9,
        highsWork: 5e6,
      },
    };
    const a = await exactPlan(hp, mixed, warm, opts);
    const b = await exactPlan(hp, mixed, warm, opts);
    expect(a.status).toBe("time-limit");
    expect(a.deadlineHit).toBe(false);
    expect(b.plan).toEqual(a.plan);
    expect(b.lowerBound).toBe(a.lowerBound);
    expect(a.lowerBound).toBeLessThanOrEqual(50);
  }, 60_000);
});
