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
