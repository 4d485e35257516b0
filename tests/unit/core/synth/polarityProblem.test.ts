import { describe, expect, it } from "vitest";
import { bothOfPlan, bothProblem, choiceEdges, choiceProblem, planOfBoth } from "../../../../src/core/synth/polarityProblem.ts";
import { litRows } from "../../../support/litSpec.ts";
import { polaritySpec } from "../../../support/polaritySpec.ts";

const spec = polaritySpec(litRows("10", "01", "11"), "either", 0);

describe("choiceProblem", () => {
  it("puts lit cells on the active-high rows and dark cells on the active-low rows, by each output's choice", () => {
    const p = choiceProblem(spec, ["lit", "dark"]);
    expect(p.n).toBe(6);
    expect(p.lit.map((r) => r.map((x) => (x ? 1 : 0)).join(""))).toEqual(["10", "00", "10", "01", "00", "00"]);
  });

  it("shares nothing between the halves: no link is exact across them", () => {
    const p = choiceProblem(spec, ["lit", "dark"]);
    expect(p.within[0]?.[1]).toBe(false);
    expect(p.within[1]?.[0]).toBe(false);
  });
});

describe("bothProblem", () => {
  it("holds both polarities side by side, column M+o the dark cells of output o", () => {
    const p = bothProblem(spec);
    expect(p.m).toBe(4);
    expect(p.lit.map((r) => r.map((x) => (x ? 1 : 0)).join(""))).toEqual(["1000", "0100", "1100", "0001", "0010", "0000"]);
  });

  it("turns a plan over both into the choice it makes, and back", () => {
    const plan = { direct: [[0, 0] as const, [2, 0] as const, [3, 3] as const], buses: [], links: [] };
    const { plan: chosen, choice } = planOfBoth(2, plan);
    expect(choice).toEqual(["lit", "dark"]);
    expect(chosen.direct).toEqual([
      [0, 0],
      [2, 0],
      [3, 1],
    ]);
    expect(bothOfPlan(2, chosen, choice)).toEqual(plan);
  });
});

describe("choiceEdges", () => {
  it("names the rows' lines: S<k> in the first half, nS<k> in the second, each diode from its driving end", () => {
    const plan = { direct: [[0, 0] as const, [3, 1] as const], buses: [{ states: [4, 5], outputs: [1] }], links: [{ from: 0, to: 1 }] };
    expect(choiceEdges(spec, plan)).toEqual([
      { from: "S0", to: "1o0" },
      { from: "nS0", to: "1o1" },
      { from: "nS1", to: "~bus0" },
      { from: "nS2", to: "~bus0" },
      { from: "~bus0", to: "1o1" },
      { from: "1o0", to: "1o1" },
    ]);
  });
});
