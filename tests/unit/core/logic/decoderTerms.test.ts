import { describe, expect, it } from "vitest";
import { decoderTerms } from "../../../../src/core/logic/decoderTerms.ts";
import { coverPlan, logicMatrix } from "../../../../src/core/logic/logicMatrix.ts";
import { logicProblem } from "../../../../src/core/logic/logicProblem.ts";
import { statesOfLiterals } from "../../../../src/core/logic/implicants.ts";
import { codedProject, specOf } from "../../../support/codedProjects.ts";

describe("decoderTerms", () => {
  it("lists the gates, then the stage lines used straight, with what each drives and where it is high", () => {
    const spec = specOf(codedProject("binary", "0123"));
    const p = logicProblem(spec);
    const term = (literals: number[], feeds: string[]) => ({
      literals,
      states: statesOfLiterals(p, literals),
      feeds: feeds.map((o) => spec.outputs.indexOf(o)),
    });
    const m = logicMatrix(spec, coverPlan(spec, [term([1, 3], ["1f"]), term([2], ["1a", "1g"])]), {
      lowerBound: null,
      optimal: false,
      depthLimit: 2,
      policy: "per-segment",
      method: "heuristic",
    });
    expect(decoderTerms(m)).toEqual([
      { name: "G1", inputs: ["nQ0", "nQ1"], drives: ["1f"], highIn: ["S0"] },
      { name: "Q1", inputs: ["Q1"], drives: ["1a", "1g"], highIn: ["S2", "S3"] },
    ]);
  });
});
