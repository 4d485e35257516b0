import { describe, expect, it } from "vitest";
import { improveCover } from "../../../../src/core/logic/coverSearch.ts";
import { heuristicCover, stateGateCover } from "../../../../src/core/logic/coverHeuristic.ts";
import { compareCovers, coverDiodes, coverExact } from "../../../../src/core/logic/cover.ts";
import { termFamily } from "../../../../src/core/logic/implicants.ts";
import { logicProblem } from "../../../../src/core/logic/logicProblem.ts";
import { WorkMeter } from "../../../../src/core/synth/workMeter.ts";
import { codedProject, specOf } from "../../../support/codedProjects.ts";

describe("improveCover", () => {
  const p = logicProblem(specOf(codedProject("binary", "0123456789AbCdEF")));
  const family = termFamily(p);

  it("returns an exact cover never worse than the one it starts from, the same every run", () => {
    for (const start of [stateGateCover(p), heuristicCover(p, family.terms, new WorkMeter(1e8))]) {
      const better = improveCover(p, family.terms, start, new WorkMeter(1e8));
      expect(coverExact(p, better)).toBe(true);
      expect(compareCovers(better, start)).toBeLessThanOrEqual(0);
      expect(improveCover(p, family.terms, start, new WorkMeter(1e8))).toEqual(better);
    }
  });

  it("improves the one-gate-per-state decoder of 0-F, and stays above the proven minimum of 83", () => {
    const start = stateGateCover(p);
    const better = improveCover(p, family.terms, start, new WorkMeter(1e8));
    expect(coverDiodes(better)).toBeLessThan(coverDiodes(start));
    expect(coverDiodes(better)).toBeGreaterThanOrEqual(83);
  });

  it("gives back the cover it got when the budget is spent at once", () => {
    const start = heuristicCover(p, family.terms, new WorkMeter(1e8));
    expect(improveCover(p, family.terms, start, new WorkMeter(0))).toEqual(start);
  });
});
