/**
 * The heuristic (the app's first answer after an edit) against the best
 * counts known, on the bench's counters (bench/synthBench.ts), depth limit
 * 2, every policy: within 3 % of the best count known.
 *
 * Best known: for the one-position counters and 1-12, the optimum the exact
 * stage proves with its branch-and-bound (search.ts); the proof is run
 * again here (nothing below the optimum exists), so the figures cannot go
 * stale. For 00-23: the best counts of issue 16's outside study and of this
 * heuristic (docs/sources.md, "Best known counts and bounds of the
 * two-position counters"); 00-59 and 00-99 are checked in refine.test.ts.
 */
import { describe, expect, it } from "vitest";
import { buildMatrix } from "../../../../src/core/matrix/matrix.ts";
import { verifyMatrix } from "../../../../src/core/matrix/verify.ts";
import type { DepthPolicy } from "../../../../src/core/project/project.ts";
import { compileSpec } from "../../../../src/core/spec/decodeSpec.ts";
import { candidateFamily } from "../../../../src/core/synth/candidates.ts";
import { heuristicPlan } from "../../../../src/core/synth/heuristic.ts";
import { litCount, planCount, planEdges, sharingProblem } from "../../../../src/core/synth/plan.ts";
import { reduceRows } from "../../../../src/core/synth/reduce.ts";
import { searchPlan } from "../../../../src/core/synth/search.ts";
import { showing } from "../../../support/projects.ts";

const HEX = "0123456789AbCdEF";
const pad2 = (k: number): string => String(k).padStart(2, "0");

interface Case {
  readonly name: string;
  readonly positions: number;
  readonly show: readonly string[];
  /** Best count known per policy: mixed, per-segment, uniform. */
  readonly best: readonly [number, number, number];
  /** True when `best` is the exact stage's proven optimum (proven again below). */
  readonly proven: boolean;
}

const CASES: readonly Case[] = [
  { name: "0-5", positions: 1, show: [..."012345"], best: [21, 21, 24], proven: true },
  { name: "0-9", positions: 1, show: [..."0123456789"], best: [33, 34, 36], proven: true },
  { name: "0-F", positions: 1, show: [...HEX], best: [50, 52, 52], proven: true },
  {
    name: "1-12",
    positions: 2,
    show: Array.from({ length: 12 }, (_, k) => String(k + 1).padStart(2, " ")),
    best: [40, 41, 44],
    proven: true,
  },
  { name: "00-23", positions: 2, show: Array.from({ length: 24 }, (_, k) => pad2(k)), best: [85, 89, 91], proven: false },
];
const POLICIES: readonly DepthPolicy[] = ["mixed", "per-segment", "uniform"];

describe("heuristicPlan: within 3 % of the best count known on the bench's counters", () => {
  for (const c of CASES) {
    POLICIES.forEach((policy, i) => {
      const best = c.best[i] as number;
      const most = Math.floor(best * 1.03);
      it(`${c.name} ${policy}: at most ${most} diodes (best known ${best}${c.proven ? ", proven" : ""}), verified`, () => {
        const spec = compileSpec(showing(c.show, c.positions));
        const p = sharingProblem(spec);
        const rules = { depthLimit: 2, policy, buses: true, links: true } as const;
        const plan = heuristicPlan(p, rules);
        const m = buildMatrix(spec, planEdges(spec, plan), {
          lowerBound: null,
          optimal: false,
          depthLimit: 2,
          policy,
          method: "heuristic",
        });
        expect(verifyMatrix(spec, m, rules).ok).toBe(true);
        expect(planCount(plan)).toBeLessThanOrEqual(most);
        if (!c.proven) return;
        // The proof: the branch-and-bound finds no matrix below `best`
        // (under uniform it searches the all-bus matrices; the direct one is the other choice).
        expect(planCount(plan)).toBeGreaterThanOrEqual(best);
        const r = reduceRows(p);
        const family = candidateFamily(r.problem, policy === "mixed" ? 2 : 1);
        expect(family.complete).toBe(true);
        const proof = searchPlan(r.problem, rules, family, best, { maxWork: 1e10 });
        expect(proof.proven && proof.plan === null).toBe(true);
        if (policy === "uniform") expect(litCount(p)).toBeGreaterThanOrEqual(best);
      }, 120_000);
    });
  }
});
