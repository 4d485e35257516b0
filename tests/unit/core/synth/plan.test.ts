import { describe, expect, it } from "vitest";
import { directPlan, levelRules, litCount, planCount, planEdges, problemFromLit } from "../../../../src/core/synth/plan.ts";
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
  it("level rules follow the depth policy", () => {
    const mixed = { depthLimit: 3, policy: "mixed", buses: true, links: true } as const;
    const perSeg = { ...mixed, policy: "per-segment" } as const;
    const uniform = { ...mixed, policy: "uniform" } as const;
    expect(levelRules.direct(mixed, 2)).toBe(true);
    expect(levelRules.direct(perSeg, 2)).toBe(false);
    expect(levelRules.bus(perSeg, 3)).toBe(false);
    expect(levelRules.bus(mixed, 3)).toBe(true);
    expect(levelRules.link(perSeg, 1, 3)).toBe(false);
    expect(levelRules.link(mixed, 1, 3)).toBe(true);
    expect(levelRules.link(uniform, 1, 2)).toBe(false);
    expect(levelRules.bus({ ...mixed, buses: false }, 2)).toBe(false);
  });
});
