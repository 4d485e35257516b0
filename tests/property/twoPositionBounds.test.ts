/**
 * Two-position counters of up to 24 states, drawn at random (each state
 * shows two digits taken from small random alphabets, so states repeat and
 * the merged problem stays small enough for a plain MILP to finish): every
 * optimum diodeloom claims equals the plain MILP's optimum (the covering
 * model of model.ts with every bus shape, solved by HiGHS alone, no
 * branch-and-bound of our own, from the direct matrix) wherever that MILP
 * proves one; every bound, of any method, is at most every count found by
 * any method.
 */
import fc from "fast-check";
import { describe, expect, it } from "vitest";
import type { DepthPolicy } from "../../src/core/project/project.ts";
import { compileSpec } from "../../src/core/spec/decodeSpec.ts";
import { defaultHighsLoader, exactPlan } from "../../src/core/synth/exact.ts";
import { heuristicPlan } from "../../src/core/synth/heuristic.ts";
import { lagrangeBound } from "../../src/core/synth/lagrangeBound.ts";
import { directPlan, litCount, planCount, sharingProblem } from "../../src/core/synth/plan.ts";
import { reduceRows } from "../../src/core/synth/reduce.ts";
import { synthesize, synthSettings } from "../../src/core/synth/synthesize.ts";
import { showing } from "../support/projects.ts";

const SEED = 1616;
const POLICIES: readonly DepthPolicy[] = ["mixed", "per-segment", "uniform"];

/** Texts of a two-position counter: N states, tens and units digits from small alphabets. */
const twoPositionTexts = fc
  .record({
    n: fc.integer({ min: 2, max: 24 }),
    tens: fc.uniqueArray(fc.integer({ min: 0, max: 9 }), { minLength: 1, maxLength: 3 }),
    units: fc.uniqueArray(fc.integer({ min: 0, max: 9 }), { minLength: 1, maxLength: 4 }),
  })
  .chain(({ n, tens, units }) =>
    fc
      .array(fc.tuple(fc.constantFrom(...tens), fc.constantFrom(...units)), { minLength: n, maxLength: n })
      .map((pairs) => pairs.map(([a, b]) => `${a}${b}`)),
  );

describe("two-position counters: claimed optima and bounds (fast-check seed 1616)", () => {
  it("every claimed optimum is the plain MILP's; every bound is at most every count", async () => {
    let compared = 0;
    await fc.assert(
      fc.asyncProperty(twoPositionTexts, fc.constantFrom(...POLICIES), async (texts, policy) => {
        const project = showing(texts, 2, { synthesis: { maxDepth: 2, depth: policy, timeLimitMs: 3000 } });
        const spec = compileSpec(project);
        const p = sharingProblem(spec);
        const rules = { depthLimit: 2, policy, buses: true, links: true } as const;
        const exact = await synthesize(spec, synthSettings(project));
        expect(exact.ok).toBe(true);
        if (!exact.ok) return;
        const fast = planCount(heuristicPlan(p, rules));
        // The plain MILP: HiGHS alone on the full model, from the direct matrix.
        const milp = await exactPlan(p, rules, directPlan(p), {
          timeLimitMs: 60_000,
          seed: 1,
          loadHighs: defaultHighsLoader,
          search: false,
          familyLimits: { maxBuses: 100_000, maxInputs: 1_000_000 },
          budget: {
            heuristicWork: 0,
            familyWork: 1e9,
            searchWork: 0,
            lpWork: 0,
            lagrangeWork: 0,
            levelWork: 0,
            highsNodes: 1e6,
            highsWork: 1e12,
          },
        });
        const lag = lagrangeBound(reduceRows(p).problem, rules, { maxWork: 1e8, upper: exact.value.count });
        const lagBound = lag.bound === null ? 0 : policy === "uniform" ? Math.min(litCount(p), lag.bound) : lag.bound;
        const counts = [exact.value.count, fast, planCount(milp.plan), litCount(p)];
        const bounds = [exact.value.lowerBound ?? 0, milp.complete ? milp.lowerBound : 0, lagBound];
        for (const b of bounds) for (const c of counts) expect(b, `${texts.join(" ")} ${policy}`).toBeLessThanOrEqual(c);
        if (milp.status === "optimal" && milp.complete) {
          compared++;
          const optimum = planCount(milp.plan);
          if (exact.value.optimal) expect(exact.value.count, `${texts.join(" ")} ${policy}`).toBe(optimum);
          expect(exact.value.count).toBeGreaterThanOrEqual(optimum);
        }
      }),
      { seed: SEED, numRuns: 30 },
    );
    // The comparison must have happened, or the property proved nothing.
    expect(compared).toBeGreaterThan(15);
  }, 600_000);
});
