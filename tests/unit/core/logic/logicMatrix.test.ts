import { describe, expect, it } from "vitest";
import { coverPlan, logicMatrix } from "../../../../src/core/logic/logicMatrix.ts";
import { logicProblem } from "../../../../src/core/logic/logicProblem.ts";
import { statesOfLiterals } from "../../../../src/core/logic/implicants.ts";
import type { Cover } from "../../../../src/core/logic/cover.ts";
import { codedProject, specOf } from "../../../support/codedProjects.ts";

// 0-3 on two binary stages: a = nQ0 + Q1, c = nQ1 + Q0, d = a, e = nQ0, f = nQ0·nQ1, g = Q1 (b is tied on).
const spec = specOf(codedProject("binary", "0123"));
const p = logicProblem(spec);
const term = (literals: number[], feeds: string[]) => ({
  literals,
  states: statesOfLiterals(p, literals),
  feeds: feeds.map((o) => spec.outputs.indexOf(o)).sort((a, b) => a - b),
});
// Literal indices: Q0 0, nQ0 1, Q1 2, nQ1 3.
const cover: Cover = [
  term([1, 3], ["1f"]),
  term([2], ["1a", "1d", "1g"]),
  term([1], ["1a", "1d", "1e"]),
  term([0], ["1c"]),
  term([3], ["1c"]),
];
const meta = { lowerBound: null, optimal: false, depthLimit: 2, policy: "per-segment" as const, method: "heuristic" as const };

describe("logicMatrix", () => {
  it("writes gates and diodes as the matrix JSON says: from is the anode", () => {
    const m = logicMatrix(spec, coverPlan(spec, cover), meta);
    expect(m.schema).toBe("diodeloom/matrix@3");
    expect(m.gates).toEqual([{ ref: "G1", inputs: ["nQ0", "nQ1"] }]);
    expect(m.lines).toEqual(["Q0", "nQ0", "Q1", "nQ1"]);
    expect(m.codes).toEqual(["00", "01", "10", "11"]);
    // The AND plane first (the gate node to each input line), then OR diodes by driving node.
    expect(m.diodes.map((d) => `${d.ref} ${d.from}>${d.to}`)).toEqual([
      "D1 G1>nQ0",
      "D2 G1>nQ1",
      "D3 G1>1f",
      "D4 Q0>1c",
      "D5 nQ0>1a",
      "D6 nQ0>1d",
      "D7 nQ0>1e",
      "D8 Q1>1a",
      "D9 Q1>1d",
      "D10 Q1>1g",
      "D11 nQ1>1c",
    ]);
    expect(m.count).toBe(11);
    expect(m.longestPath).toBe(1);
    expect(m.buses).toEqual([]);
  });

  it("numbers gates by the first state they decode", () => {
    const two: Cover = [term([0, 2], ["1c"]), term([1, 3], ["1f"])];
    expect(logicMatrix(spec, coverPlan(spec, two), meta).gates.map((g) => g.inputs.join("·"))).toEqual(["nQ0·nQ1", "Q0·Q1"]);
  });

  it("counts OR paths through bus nodes and keeps the bus names in order", () => {
    const m = logicMatrix(
      spec,
      {
        gates: [["nQ0", "nQ1"]],
        edges: [
          { from: { gate: 0 }, to: "B1" },
          { from: { node: "Q1" }, to: "B1" },
          { from: { node: "B1" }, to: "1a" },
        ],
      },
      meta,
    );
    expect(m.buses).toEqual(["B1"]);
    expect(m.longestPath).toBe(2);
    expect(m.diodes.map((d) => `${d.from}>${d.to}`)).toEqual(["G1>nQ0", "G1>nQ1", "G1>B1", "Q1>B1", "B1>1a"]);
  });
});
