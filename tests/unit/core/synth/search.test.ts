import fc from "fast-check";
import { describe, expect, it } from "vitest";
import { compileSpec } from "../../../../src/core/spec/decodeSpec.ts";
import { buildMatrix } from "../../../../src/core/matrix/matrix.ts";
import type { DepthPolicy } from "../../../../src/core/project/project.ts";
import { candidateFamily } from "../../../../src/core/synth/candidates.ts";
import { defaultHighsLoader, exactPlan } from "../../../../src/core/synth/exact.ts";
import { heuristicPlan } from "../../../../src/core/synth/heuristic.ts";
import {
  litCount,
  planCost,
  planCount,
  planEdges,
  problemFromLit,
  sharingProblem,
  type SharingProblem,
} from "../../../../src/core/synth/plan.ts";
import { expandPlan, reduceRows } from "../../../../src/core/synth/reduce.ts";
import { showing } from "../../../support/projects.ts";
import { searchApplies, searchPlan } from "../../../../src/core/synth/search.ts";
import { verifyMatrix } from "../../../../src/core/matrix/verify.ts";
import { benchProject, BENCH_CASES } from "../../../../bench/synthBench.ts";
import { litRows, specFromLit } from "../../../support/litSpec.ts";
import { bruteMinimum } from "../../../support/bruteMinimum.ts";

const SEED = 20261202;
const POLICIES: readonly DepthPolicy[] = ["mixed", "per-segment", "uniform"];
const UNLIMITED = { maxWork: 1e12 };

const rulesFor = (depth: DepthPolicy) => ({ depthLimit: 2, policy: depth, buses: true, links: true }) as const;
const familyFor = (p: SharingProblem, depth: DepthPolicy) => candidateFamily(p, depth === "mixed" ? 2 : 1);

/** A random lit matrix, `k` cells lit in every `of`. */
const litMatrix = (n: number, m: number, k: number, of: number) =>
  fc.array(
    fc.array(
      fc.integer({ min: 0, max: of - 1 }).map((x) => x < k),
      { minLength: m, maxLength: m },
    ),
    { minLength: 2, maxLength: n },
  );

describe("searchPlan", () => {
  it(`finds the brute-force minimum on random 4 x 4 matrices, every policy (seed ${SEED})`, () => {
    fc.assert(
      fc.property(litMatrix(4, 4, 3, 4), fc.constantFrom(...POLICIES), (lit, depth) => {
        const spec = specFromLit(lit);
        const p = sharingProblem(spec);
        if (litCount(p) === 0) return;
        const family = familyFor(p, depth);
        expect(searchApplies(p, rulesFor(depth), family)).toBe(true);
        // Above the all-padding-bus count (every policy allows it or direct), so the search must return its own plan.
        const r = searchPlan(p, rulesFor(depth), family, litCount(p) + p.n + 1, UNLIMITED);
        expect(r.proven).toBe(true);
        expect(r.plan).not.toBeNull();
        if (!r.plan) return;
        const min = bruteMinimum(spec.lit, depth);
        if (depth === "uniform") {
          // The search covers the all-bus matrices; the direct one is the caller's other choice.
          expect(Math.min(planCount(r.plan), litCount(p))).toBe(min);
        } else expect(planCount(r.plan)).toBe(min);
        expect(r.lowerBound).toBe(planCount(r.plan));
        const matrix = buildMatrix(spec, planEdges(spec, r.plan), {
          lowerBound: null,
          optimal: false,
          depthLimit: 2,
          policy: depth,
          method: "exact",
        });
        expect(verifyMatrix(spec, matrix, { depthLimit: 2, policy: depth }).ok).toBe(true);
        // Cut short: the bound stays at or below the minimum (uniform: once the direct matrix is weighed in).
        const short = searchPlan(p, rulesFor(depth), family, litCount(p) + p.n + 1, { maxWork: 40 });
        const shortBound = depth === "uniform" ? Math.min(short.lowerBound, litCount(p)) : short.lowerBound;
        expect(shortBound).toBeLessThanOrEqual(min);
        if (short.plan) expect(planCount(short.plan)).toBeGreaterThanOrEqual(min);
      }),
      { seed: SEED, numRuns: 150 },
    );
  });

  it(`merging identical states keeps the optimum: random 4 x 5 rows, each repeated 1 to 3 times, every policy (seed ${SEED})`, () => {
    fc.assert(
      fc.property(
        litMatrix(4, 5, 2, 3),
        fc.array(fc.integer({ min: 1, max: 3 }), { minLength: 4, maxLength: 4 }),
        fc.constantFrom(...POLICIES),
        (rows, times, depth) => {
          const spec = specFromLit(rows.flatMap((r, i) => Array.from({ length: times[i] ?? 1 }, () => r)));
          const p = problemFromLit(spec.lit);
          if (litCount(p) === 0) return;
          const r = reduceRows(p);
          const rules = rulesFor(depth);
          const upper = litCount(p) + p.n + 1;
          const whole = searchPlan(p, rules, familyFor(p, depth), upper, UNLIMITED);
          const merged = searchPlan(r.problem, rules, familyFor(r.problem, depth), upper, UNLIMITED);
          expect(whole.proven && merged.proven).toBe(true);
          if (!whole.plan || !merged.plan) throw new Error("the all-padding-bus bound leaves a plan to find");
          expect(planCost(r.problem, merged.plan)).toBe(planCount(whole.plan));
          expect(merged.lowerBound).toBe(whole.lowerBound);
          // Expanded, the merged plan is a verified matrix of that count.
          const expanded = expandPlan(r, merged.plan);
          expect(planCount(expanded)).toBe(planCount(whole.plan));
          const matrix = buildMatrix(spec, planEdges(spec, expanded), {
            lowerBound: null,
            optimal: false,
            depthLimit: 2,
            policy: depth,
            method: "exact",
          });
          expect(verifyMatrix(spec, matrix, { depthLimit: 2, policy: depth }).ok).toBe(true);
        },
      ),
      { seed: SEED, numRuns: 100 },
    );
  });

  it("256 states showing 0-9 repeated (one position) are proven at once: 305 diodes, per-segment", () => {
    const show = Array.from({ length: 256 }, (_, k) => String(k % 10));
    const p = sharingProblem(compileSpec(showing(show)));
    const r = reduceRows(p);
    expect(r.problem.n).toBe(10);
    const rules = rulesFor("per-segment");
    const warm = heuristicPlan(p, rules);
    const s = searchPlan(r.problem, rules, familyFor(r.problem, "per-segment"), planCount(warm) + 1, { maxWork: 5e7 });
    expect(s.proven).toBe(true);
    const best = s.plan ? planCost(r.problem, s.plan) : planCount(warm);
    // The outside study's best known matrix has 305 diodes (issue 16, not a published source).
    expect(best).toBe(305);
    expect(s.lowerBound).toBe(305);
  });

  it("the brute force itself: a 3 x 3 all-lit block under a blank state", () => {
    const lit = litRows("111", "111", "111", "000");
    expect(bruteMinimum(lit, "uniform")).toBe(6);
    expect(bruteMinimum(lit, "mixed")).toBe(5); // one output direct (3), two links
  });

  it(`agrees with HiGHS on random 7 x 5 matrices (seed ${SEED})`, async () => {
    await fc.assert(
      fc.asyncProperty(litMatrix(7, 5, 2, 3), fc.constantFrom(...POLICIES), async (lit, depth) => {
        const p = problemFromLit(lit);
        if (litCount(p) === 0) return;
        const rules = rulesFor(depth);
        const warm = heuristicPlan(p, rules);
        const opts = { timeLimitMs: 20_000, seed: 1, loadHighs: defaultHighsLoader };
        const highs = await exactPlan(p, rules, warm, { ...opts, search: false });
        const search = await exactPlan(p, rules, warm, opts);
        expect(highs.status).toBe("optimal");
        expect(search.status).toBe("optimal");
        expect(planCount(search.plan)).toBe(planCount(highs.plan));
        expect(search.lowerBound).toBe(highs.lowerBound);
      }),
      { seed: SEED, numRuns: 25 },
    );
  }, 60_000);

  it("stops on its work budget with the same plan and an honest bound every run", () => {
    const c = BENCH_CASES.find((x) => x.name === "0-F");
    if (!c) throw new Error("bench case 0-F is missing");
    const p = sharingProblem(compileSpec(benchProject(c, "per-segment")));
    const rules = rulesFor("per-segment");
    const family = familyFor(p, "per-segment");
    const upper = planCount(heuristicPlan(p, rules));
    const a = searchPlan(p, rules, family, upper, { maxWork: 2e7 });
    const b = searchPlan(p, rules, family, upper, { maxWork: 2e7 });
    expect(a.proven).toBe(false);
    expect(a.deadlineHit).toBe(false);
    expect(a).toEqual(b);
    // 52 is the proven optimum (see the bench); a cut-short bound must stay at or below it.
    expect(a.lowerBound).toBeLessThanOrEqual(52);
  });

  it("says when the clock, not the work budget, stopped it", () => {
    const c = BENCH_CASES.find((x) => x.name === "0-F");
    if (!c) throw new Error("bench case 0-F is missing");
    const p = sharingProblem(compileSpec(benchProject(c, "mixed")));
    const rules = rulesFor("mixed");
    const family = familyFor(p, "mixed");
    const r = searchPlan(p, rules, family, planCount(heuristicPlan(p, rules)), { maxWork: 1e12, deadlineMs: Date.now() - 1 });
    expect(r.deadlineHit).toBe(true);
    expect(r.proven).toBe(false);
    expect(r.lowerBound).toBeLessThanOrEqual(50); // the proven optimum (see the bench)
  });

  it("per-segment without buses: level sets that no link can serve are infeasible, not a crash", () => {
    // Links 1 -> 0 and 2 -> 0 together reach every state of output 0 (5 diodes instead of 6); output 1 or 2 long has no source.
    const p = problemFromLit(litRows("110", "110", "101"));
    const rules = { depthLimit: 2, policy: "per-segment", buses: false, links: true } as const;
    const r = searchPlan(p, rules, candidateFamily(p, 1), litCount(p) + 1, UNLIMITED);
    expect(r.proven).toBe(true);
    expect(bruteNoBuses(p)).toBe(5);
    expect(r.plan && planCount(r.plan)).toBe(5);
  });
});

/** Per-segment, links only: each output is direct, or fed entirely by links from direct ones. */
function bruteNoBuses(p: SharingProblem): number {
  let best = Infinity;
  for (let long = 0; long < 1 << p.m; long++) {
    let cost = 0;
    for (let o = 0; o < p.m && cost < Infinity; o++) {
      if (((long >> o) & 1) === 0) {
        cost += p.col[o]?.length ?? 0;
        continue;
      }
      // Cheapest set of short sources whose states together are exactly o's (each a subset of o's).
      const sources = [...Array(p.m).keys()].filter((a) => ((long >> a) & 1) === 0 && p.within[a]?.[o]);
      let cheapest = Infinity;
      for (let pick = 1; pick < 1 << sources.length; pick++) {
        const reached = new Set<number>();
        let links = 0;
        sources.forEach((a, i) => {
          if ((pick >> i) & 1) {
            links++;
            for (const k of p.col[a] ?? []) reached.add(k);
          }
        });
        if (reached.size === (p.col[o]?.length ?? 0)) cheapest = Math.min(cheapest, links);
      }
      cost += cheapest;
    }
    best = Math.min(best, cost);
  }
  return best;
}
