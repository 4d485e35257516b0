import fc from "fast-check";
import { describe, expect, it } from "vitest";
import type { DepthPolicy } from "../../../../src/core/project/project.ts";
import { compileSpec } from "../../../../src/core/spec/decodeSpec.ts";
import { candidateFamily } from "../../../../src/core/synth/candidates.ts";
import { heuristicPlan } from "../../../../src/core/synth/heuristic.ts";
import { lagrangeBound, positionSwap, stallRounds } from "../../../../src/core/synth/lagrangeBound.ts";
import { litCount, planCost, planCount, problemFromLit, sharingProblem } from "../../../../src/core/synth/plan.ts";
import { reduceRows } from "../../../../src/core/synth/reduce.ts";
import { searchPlan } from "../../../../src/core/synth/search.ts";
import { workBudget } from "../../../../src/core/synth/workBudget.ts";
import { litRows, specFromLit } from "../../../support/litSpec.ts";
import { bruteMinimum } from "../../../support/bruteMinimum.ts";
import { showing } from "../../../support/projects.ts";
import { twoDigitProblem } from "../../../support/twoDigits.ts";

const POLICIES: readonly DepthPolicy[] = ["mixed", "per-segment", "uniform"];
const rulesOf = (policy: DepthPolicy) => ({ depthLimit: 2, policy, buses: true, links: true }) as const;
const SEED = 20261203;

/** A random lit matrix of up to `n` rows and `m` outputs, about `k` cells lit in every `of`. */
const litMatrix = (n: number, m: number, k: number, of: number) =>
  fc.array(
    fc.array(
      fc.integer({ min: 0, max: of - 1 }).map((x) => x < k),
      { minLength: m, maxLength: m },
    ),
    { minLength: 2, maxLength: n },
  );

/** The bound as the exact stage claims it (uniform: the all-bus bound or the direct count). */
function claimed(p: ReturnType<typeof problemFromLit>, policy: DepthPolicy, upper: number, maxWork = 1e7): number {
  const b = lagrangeBound(reduceRows(p).problem, rulesOf(policy), { maxWork, upper });
  expect(b.bound).not.toBeNull();
  return policy === "uniform" ? Math.min(litCount(p), b.bound ?? 0) : (b.bound ?? 0);
}

describe("lagrangeBound", () => {
  it("never exceeds the proven optimum of a digit counter (0-9 and 0-F, every policy; the branch-and-bound proves it)", () => {
    for (const show of ["0123456789", "0123456789AbCdEF"]) {
      const p = sharingProblem(compileSpec(showing([...show], 1)));
      for (const policy of POLICIES) {
        const rules = rulesOf(policy);
        const start = heuristicPlan(p, rules);
        const proof = searchPlan(p, rules, candidateFamily(p, policy === "mixed" ? 2 : 1), planCost(p, start), { maxWork: 1e10 });
        expect(proof.proven).toBe(true);
        const optimum = proof.plan === null ? planCost(p, start) : planCost(p, proof.plan);
        const b = lagrangeBound(p, rules, { maxWork: 1e8, upper: optimum });
        expect(b.bound).not.toBeNull();
        const bound = policy === "uniform" ? Math.min(litCount(p), b.bound ?? 0) : (b.bound ?? 0);
        expect(bound, `${show} ${policy}`).toBeLessThanOrEqual(optimum);
        // Far above the trivial bound (every output, every state needs a diode).
        expect(bound, `${show} ${policy}`).toBeGreaterThan(Math.max(p.m, p.n));
      }
    }
  });

  it(`never exceeds the brute-force minimum on random 4 x 4 and 5 x 4 matrices, every policy, whatever the step target (seed ${SEED})`, () => {
    fc.assert(
      fc.property(fc.oneof(litMatrix(4, 4, 3, 4), litMatrix(5, 4, 1, 2)), fc.constantFrom(...POLICIES), (lit, policy) => {
        const spec = specFromLit(lit);
        const p = sharingProblem(spec);
        if (litCount(p) === 0) return;
        const min = bruteMinimum(spec.lit, policy);
        // The target at the minimum (rounds stop there) and far above it (bigger steps, more rounds).
        expect(claimed(p, policy, min), policy).toBeLessThanOrEqual(min);
        expect(claimed(p, policy, litCount(p) + p.n + 5), policy).toBeLessThanOrEqual(min);
      }),
      { seed: SEED, numRuns: 200 },
    );
  });

  it(`never exceeds the proven minimum of random merged rows: 4 x 6 rows repeated 1 to 4 times, every policy (seed ${SEED})`, () => {
    fc.assert(
      fc.property(
        litMatrix(4, 6, 1, 2),
        fc.array(fc.integer({ min: 1, max: 4 }), { minLength: 4, maxLength: 4 }),
        fc.constantFrom(...POLICIES),
        (rows, times, policy) => {
          const spec = specFromLit(rows.flatMap((r, i) => Array.from({ length: times[i] ?? 1 }, () => r)));
          const p = problemFromLit(spec.lit);
          if (litCount(p) === 0) return;
          const rules = rulesOf(policy);
          // The branch-and-bound on the states as they are (checked against brute force in search.test.ts).
          const proof = searchPlan(p, rules, candidateFamily(p, policy === "mixed" ? 2 : 1), litCount(p) + p.n + 1, { maxWork: 1e12 });
          expect(proof.proven).toBe(true);
          if (!proof.plan) throw new Error("the all-padding-bus bound leaves a plan to find");
          const min = policy === "uniform" ? Math.min(litCount(p), planCount(proof.plan)) : planCount(proof.plan);
          expect(
            claimed(p, policy, min),
            `${rows.map((r) => r.map(Number).join("")).join(" ")} x ${times.join(",")} ${policy}`,
          ).toBeLessThanOrEqual(min);
        },
      ),
      { seed: SEED, numRuns: 150 },
    );
  });

  it(`never exceeds the proven minimum of random two-position counters whose positions swap (shares kept symmetric), every policy (seed ${SEED})`, () => {
    fc.assert(
      fc.property(
        fc.integer({ min: 2, max: 3 }).chain((g) => litMatrix(3, g, 1, 2).map((digits) => ({ g, digits }))),
        fc.constantFrom(...POLICIES),
        ({ g, digits }, policy) => {
          // Every pair of "digits" (i, j): position 0 shows i, position 1 shows j.
          const lit = digits.flatMap((a) => digits.map((b) => [...a, ...b]));
          const p = problemFromLit(lit, { group: [...Array<number>(g).fill(0), ...Array<number>(g).fill(1)] });
          if (litCount(p) === 0) return;
          expect(positionSwap(reduceRows(p).problem)).not.toBeNull();
          const rules = rulesOf(policy);
          const proof = searchPlan(p, rules, candidateFamily(p, policy === "mixed" ? 2 : 1), litCount(p) + p.n + 1, { maxWork: 1e12 });
          expect(proof.proven).toBe(true);
          if (!proof.plan) throw new Error("the all-padding-bus bound leaves a plan to find");
          const min = policy === "uniform" ? Math.min(litCount(p), planCount(proof.plan)) : planCount(proof.plan);
          const label = `${digits.map((r) => r.map(Number).join("")).join(" ")} ${policy}`;
          expect(claimed(p, policy, min), label).toBeLessThanOrEqual(min);
          expect(claimed(p, policy, litCount(p) + p.n + 5), label).toBeLessThanOrEqual(min);
        },
      ),
      { seed: SEED, numRuns: 150 },
    );
  });

  it("finds the swap of positions on 00-99 (row 37 onto row 73) and none on 00-59", () => {
    const p99 = twoDigitProblem(99);
    const swap = positionSwap(p99);
    expect(swap).not.toBeNull();
    expect(swap?.row[37]).toBe(73);
    expect(swap?.row[55]).toBe(55);
    expect(positionSwap(twoDigitProblem(59))).toBeNull();
  });

  it("takes a merged row's weight: a digit standing for 10 states (0-9 merged, optimum 149 proven in refine.test.ts)", () => {
    const digits = ["1111110", "0110000", "1101101", "1111001", "0110011", "1011011", "1011111", "1110000", "1111111", "1111011"];
    const p = problemFromLit(litRows(...digits), { weight: Array(10).fill(10) });
    for (const policy of POLICIES) {
      const b = lagrangeBound(p, rulesOf(policy), { maxWork: 1e8, upper: 149 });
      expect(b.bound, policy).toBeLessThanOrEqual(149);
      // Each row must feed something at 10 a state: 100 before any output is paid for; the
      // bound meets the optimum under every policy.
      expect(b.bound, policy).toBe(149);
    }
  });

  it("bounds 00-59 (14 outputs) well above the trivial bound, at most the heuristic's count, the same every run", () => {
    const p = twoDigitProblem(59);
    const rules = rulesOf("per-segment");
    const upper = planCount(heuristicPlan(p, rules));
    const a = lagrangeBound(p, rules, { maxWork: 2e8, upper });
    const b = lagrangeBound(p, rules, { maxWork: 2e8, upper });
    expect(b).toEqual({ ...a });
    expect(a.deadlineHit).toBe(false);
    expect(a.bound ?? 0).toBeLessThanOrEqual(upper);
    // The trivial bound is 60 (every state needs a diode); the covering LP reached 159 only when run to the end.
    expect(a.bound ?? 0).toBeGreaterThanOrEqual(140);
  });

  it("holds the link rule exactly in each row (stars): 00-23 mixed reaches 81 at 2e8 work, at most the best count known (85)", () => {
    const p = twoDigitProblem(23);
    const b = lagrangeBound(p, rulesOf("mixed"), { maxWork: 2e8, upper: 85 });
    // With a multiplier per row and link for the rule instead, the same work gave 79 (the
    // multipliers tune along with the shares); the best bound known is 83 (issue 16).
    expect(b.bound ?? 0).toBeGreaterThanOrEqual(81);
    expect(b.bound ?? 0).toBeLessThanOrEqual(85);
  });

  it("halves its step as the budget allows: 00-23 at the 10 s budgets reaches the best bounds known (83 mixed, 87 uniform, issue 16) where halving after 8 rounds stopped at 82 and 86", () => {
    const p = twoDigitProblem(23);
    const maxWork = workBudget(10_000).lagrangeWork;
    // 85 and 91: the best counts known (issue 16; the heuristic's, bench/synthBench.ts). Budgets only, no clock.
    for (const [policy, upper, fast, scaled] of [
      ["mixed", 85, 82, 83],
      ["uniform", 91, 86, 87],
    ] as const) {
      const eight = lagrangeBound(p, rulesOf(policy), { maxWork, upper, stall: 8 });
      const byBudget = lagrangeBound(p, rulesOf(policy), { maxWork, upper });
      expect(eight.bound, policy).toBe(fast);
      // Halving after 8 rounds the step falls to nothing with budget left; the default uses it all.
      expect(eight.work, policy).toBeLessThan(0.7 * maxWork);
      expect(byBudget.bound, policy).toBe(scaled);
      expect(byBudget.work, policy).toBeGreaterThan(0.9 * maxWork);
    }
  });

  it("scales the stall to 1/64 of the rounds the budget pays for, 8 to 30", () => {
    expect([0, 100, 512, 760, 1424, 1920, 5000, Infinity].map(stallRounds)).toEqual([8, 8, 8, 12, 22, 30, 30, 30]);
  });

  it("is out of reach (null) for rows of more than 16 lit outputs", () => {
    const p = problemFromLit([Array(17).fill(true) as boolean[], Array(17).fill(true) as boolean[]]);
    expect(lagrangeBound(p, rulesOf("mixed"), { maxWork: 1e8, upper: 100 }).bound).toBeNull();
  });
});
