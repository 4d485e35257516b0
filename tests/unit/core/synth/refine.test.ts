import fc from "fast-check";
import { describe, expect, it } from "vitest";
import { buildMatrix } from "../../../../src/core/matrix/matrix.ts";
import { verifyMatrix } from "../../../../src/core/matrix/verify.ts";
import type { DepthPolicy } from "../../../../src/core/project/project.ts";
import { compileSpec } from "../../../../src/core/spec/decodeSpec.ts";
import { candidateFamily } from "../../../../src/core/synth/candidates.ts";
import { heuristicPlan } from "../../../../src/core/synth/heuristic.ts";
import { directPlan, planCost, planCount, planEdges, problemFromLit, sharingProblem } from "../../../../src/core/synth/plan.ts";
import { expandPlan, reduceRows } from "../../../../src/core/synth/reduce.ts";
import { refinePlan } from "../../../../src/core/synth/refine.ts";
import { searchPlan } from "../../../../src/core/synth/search.ts";
import { WorkMeter } from "../../../../src/core/synth/workMeter.ts";
import { litRows, specFromLit } from "../../../support/litSpec.ts";
import { showing } from "../../../support/projects.ts";

const POLICIES: readonly DepthPolicy[] = ["mixed", "per-segment", "uniform"];
const rulesOf = (policy: DepthPolicy) => ({ depthLimit: 2, policy, buses: true, links: true }) as const;
const pad2 = (k: number): string => String(k).padStart(2, "0");

/** The seven-segment digits 0-9 as lit rows (segments a-g), the shapes of the built-in glyph table. */
const DIGITS = ["1111110", "0110000", "1101101", "1111001", "0110011", "1011011", "1011111", "1110000", "1111111", "1111011"];

describe("refinePlan", () => {
  it("gives each digit of a merged position one bus when its states are many (0-9, each standing for 10 states)", () => {
    // A row standing for 10 states pays 10 for every bus it feeds, so the best
    // matrix feeds each digit's own bus once: 10 x 10 inputs + 49 outputs.
    const p = problemFromLit(litRows(...DIGITS), { weight: Array(10).fill(10) });
    for (const policy of POLICIES) {
      const rules = rulesOf(policy);
      const plan = refinePlan(p, rules, heuristicPlan(p, rules), new WorkMeter(1e8));
      expect(planCost(p, plan), policy).toBe(149);
      // The per-state branch-and-bound proves nothing cheaper exists.
      const family = candidateFamily(p, policy === "mixed" ? 2 : 1);
      const proof = searchPlan(p, rules, family, planCost(p, plan), { maxWork: 1e9 });
      expect(proof.proven && proof.plan === null, policy).toBe(true);
    }
  });

  it("returns a verified plan no dearer than its start, on random lit matrices with merged rows (fast-check seed 16)", () => {
    fc.assert(
      fc.property(
        fc.array(fc.array(fc.boolean(), { minLength: 6, maxLength: 6 }), { minLength: 2, maxLength: 12 }),
        fc.constantFrom(...POLICIES),
        (lit, policy) => {
          const spec = specFromLit(lit);
          const rules = rulesOf(policy);
          const p = problemFromLit(spec.lit);
          const r = reduceRows(p);
          for (const start of [directPlan(r.problem), heuristicPlan(r.problem, rules)]) {
            const refined = refinePlan(r.problem, rules, start, new WorkMeter(1e7));
            expect(planCost(r.problem, refined)).toBeLessThanOrEqual(planCost(r.problem, start));
            const plan = expandPlan(r, refined);
            const m = buildMatrix(spec, planEdges(spec, plan), {
              lowerBound: null,
              optimal: false,
              depthLimit: 2,
              policy,
              method: "heuristic",
            });
            expect(verifyMatrix(spec, m, rules).ok).toBe(true);
          }
        },
      ),
      { seed: 16, numRuns: 150 },
    );
  });

  it("is the same every run and stops on its meter", () => {
    const p = problemFromLit(litRows(...DIGITS), { weight: [3, 3, 3, 3, 2, 2, 2, 2, 2, 2] });
    const rules = rulesOf("per-segment");
    const start = heuristicPlan(p, rules);
    const a = refinePlan(p, rules, start, new WorkMeter(1e7));
    expect(refinePlan(p, rules, start, new WorkMeter(1e7))).toEqual(a);
    expect(refinePlan(p, rules, start, new WorkMeter(0))).toBe(start);
  });
});

describe("heuristicPlan on two-position counters (positions solved on their own, then refined)", () => {
  // Best counts known for these counters (issue 16's outside study): 195 and
  // 298, the sums of the two positions' proven optima (checked below by the
  // branch-and-bound on each merged position).
  for (const [n, best] of [
    [60, 195],
    [100, 298],
  ] as const) {
    it(`00-${n - 1}: at most ${best} diodes in every policy, verified`, () => {
      const spec = compileSpec(
        showing(
          Array.from({ length: n }, (_, k) => pad2(k)),
          2,
        ),
      );
      const p = sharingProblem(spec);
      for (const policy of POLICIES) {
        const rules = rulesOf(policy);
        const plan = heuristicPlan(p, rules);
        expect(planCount(plan), policy).toBeLessThanOrEqual(best);
        const m = buildMatrix(spec, planEdges(spec, plan), {
          lowerBound: null,
          optimal: false,
          depthLimit: 2,
          policy,
          method: "heuristic",
        });
        expect(verifyMatrix(spec, m, rules).ok, policy).toBe(true);
      }
      // Each position merged is proven at its share of the total.
      let sum = 0;
      for (const g of [0, 1]) {
        const r = reduceRows(
          p,
          p.group.flatMap((x, o) => (x === g ? [o] : [])),
        );
        const rules = rulesOf("mixed");
        const start = heuristicPlan(r.problem, rules);
        const proof = searchPlan(r.problem, rules, candidateFamily(r.problem, 2), planCost(r.problem, start), { maxWork: 1e9 });
        expect(proof.proven).toBe(true);
        sum += proof.plan === null ? planCost(r.problem, start) : planCost(r.problem, proof.plan);
      }
      expect(sum).toBe(best);
    });
  }
});
