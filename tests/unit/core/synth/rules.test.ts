import { describe, expect, it } from "vitest";
import { problemFromLit } from "../../../../src/core/synth/plan.ts";
import {
  busFits,
  busPays,
  busStates,
  levelRules,
  linkFits,
  linkPairs,
  statesLighting,
  statesToPay,
} from "../../../../src/core/synth/rules.ts";
import { litRows } from "../../../support/litSpec.ts";

describe("synthesis rules", () => {
  // o0 lit in S0 S1, o1 in S0 S1 S2, o2 in S1 S2.
  const p = problemFromLit(litRows("110", "111", "011", "000"));
  const on = { depthLimit: 2, policy: "per-segment", buses: true, links: true } as const;

  it("a link is exact only where every state lighting its source lights its target", () => {
    expect(linkFits(p, 0, 1)).toBe(true);
    expect(linkFits(p, 2, 1)).toBe(true);
    expect(linkFits(p, 1, 0)).toBe(false); // S2 lights o1 but not o0: a sneak path
    expect(linkFits(p, 0, 0)).toBe(false);
    expect(linkPairs(p, on)).toEqual([
      { from: 0, to: 1 },
      { from: 2, to: 1 },
    ]);
  });
  it("no links when they are off or under the uniform policy", () => {
    expect(linkPairs(p, { ...on, links: false })).toEqual([]);
    expect(linkPairs(p, { ...on, policy: "uniform" })).toEqual([]);
    expect(linkPairs(p, { ...on, policy: "mixed" }).length).toBe(2);
  });
  it("a bus may take exactly the states that light all its outputs", () => {
    expect(busStates(p, [0, 1])).toEqual([0, 1]);
    expect(busStates(p, [1])).toEqual([0, 1, 2]);
    expect(busStates(p, [0, 2])).toEqual([1]);
    expect(statesLighting(p, [0, 1, 2, 3], 2)).toEqual([1, 2]);
    expect(busFits(p, [0, 1], [0, 1])).toBe(true);
    expect(busFits(p, [0, 2], [1, 2])).toBe(false); // S0 does not light o2
  });
  it("a bus pays when |S| + |T| < |S| |T| (common practice: the r + c against r * c count of docs/sources.md)", () => {
    expect(busPays(2, 2)).toBe(false); // 4 either way
    expect(busPays(3, 2)).toBe(true); // 5 against 6
    expect(busPays(2, 3)).toBe(true);
    expect(busPays(9, 1)).toBe(false);
    for (let t = 1; t <= 6; t++) {
      for (let s = 1; s <= 6; s++) expect(busPays(s, t), `${s} x ${t}`).toBe(s >= statesToPay(t));
    }
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
