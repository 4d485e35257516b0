import { describe, expect, it } from "vitest";
import { directPlan, litCount, planCount, planEdges, problemFromLit } from "../../../../src/core/synth/plan.ts";
import { litRows, specFromLit } from "../../../support/litSpec.ts";

describe("synthPlan", () => {
  const lit = litRows("110", "111", "011", "000");
  it("indexes rows, columns and containment", () => {
    const p = problemFromLit(lit);
    expect(p.col).toEqual([
      [0, 1],
      [0, 1, 2],
      [1, 2],
    ]);
    expect(p.row[3]).toEqual([]);
    expect(p.within[0]?.[1]).toBe(true); // every state lighting o0 lights o1
    expect(p.within[1]?.[0]).toBe(false);
    expect(litCount(p)).toBe(7);
  });
  it("counts and names a plan's diodes", () => {
    const spec = specFromLit(lit);
    const plan = { direct: [[0, 0]] as [number, number][], buses: [{ states: [1, 2], outputs: [1, 2] }], links: [{ from: 0, to: 1 }] };
    expect(planCount(plan)).toBe(6);
    const edges = planEdges(spec, plan);
    expect(edges).toContainEqual({ from: "S1", to: "~bus0" });
    expect(edges).toContainEqual({ from: "~bus0", to: "1o2" });
    expect(edges).toContainEqual({ from: "1o0", to: "1o1" });
    expect(planCount(directPlan(problemFromLit(lit)))).toBe(7);
  });
});
