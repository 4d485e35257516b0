import { describe, expect, it } from "vitest";
import { candidateFamily } from "../../../../src/core/synth/candidates.ts";
import { problemFromLit } from "../../../../src/core/synth/plan.ts";
import { litRows } from "../../../support/litSpec.ts";

describe("candidateFamily", () => {
  const p = problemFromLit(litRows("111", "111", "110", "000"));
  it("lists every output set two or more states share, with all its states", () => {
    const f = candidateFamily(p, 1);
    expect(f.complete).toBe(true);
    const shapes = f.buses.map((b) => `${b.outputs.join("")}:${b.states.join("")}`).sort();
    expect(shapes).toEqual(["0:012", "01:012", "012:01", "02:01", "1:012", "12:01", "2:01"].sort());
  });
  it("under the mixed policy drops shapes no better than direct diodes", () => {
    const shapes = candidateFamily(p, 2).buses.map((b) => b.outputs.join(""));
    // 01 with 3 states saves 1; 012 with 2 states saves 1; 02 and 12 with 2 states save nothing.
    expect(shapes.sort()).toEqual(["01", "012"]);
  });
  it("says when the size limit cut the family short, keeping the best shapes", () => {
    const f = candidateFamily(p, 1, { maxBuses: 2, maxInputs: 100 });
    expect(f.complete).toBe(false);
    expect(f.buses.length).toBeLessThanOrEqual(2);
    expect(f.buses.map((b) => b.outputs.join(""))).toContain("01");
  });
});

describe("candidateFamily on the largest project the format allows", () => {
  it("keeps at most maxBuses shapes and says the family is cut short, without running out of stack", async () => {
    const { compileSpec } = await import("../../../../src/core/spec/decodeSpec.ts");
    const { sharingProblem } = await import("../../../../src/core/synth/plan.ts");
    const { reduceRows } = await import("../../../../src/core/synth/reduce.ts");
    const { largestCustomProject } = await import("../../../support/largestProject.ts");
    const p = reduceRows(sharingProblem(compileSpec(largestCustomProject()))).problem;
    // The overflow path used to collect every shape in one map and spread it into an array.
    const f = candidateFamily(p, 2);
    expect(f.complete).toBe(false);
    expect(f.buses.length).toBeGreaterThan(0);
    expect(f.buses.length).toBeLessThanOrEqual(1500);
    for (const b of f.buses.slice(0, 50)) for (const k of b.states) for (const o of b.outputs) expect(p.lit[k]?.[o]).toBe(true);
  }, 60_000);
});
