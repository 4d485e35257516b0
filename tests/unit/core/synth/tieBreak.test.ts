import { describe, expect, it } from "vitest";
import { problemFromLit, type SharingPlan } from "../../../../src/core/synth/plan.ts";
import { betterPlan, breakTies, comparePlans } from "../../../../src/core/synth/tieBreak.ts";
import { litRows } from "../../../support/litSpec.ts";

describe("tie-break order", () => {
  // Three plans of 4 diodes each (the order looks at counts, not at what they light).
  const direct: SharingPlan = {
    direct: [
      [0, 0],
      [0, 1],
      [1, 0],
      [1, 1],
    ],
    buses: [],
    links: [],
  };
  const bus: SharingPlan = { direct: [], buses: [{ states: [0, 1], outputs: [0, 1] }], links: [] };
  const linked: SharingPlan = {
    direct: [
      [0, 0],
      [1, 0],
      [2, 0],
    ],
    buses: [],
    links: [{ from: 0, to: 1 }],
  };
  const five: SharingPlan = { ...direct, direct: [...direct.direct, [2, 0]] };

  it("fewer diodes first, then fewer bus nodes, then fewer long paths", () => {
    expect(comparePlans(direct, five)).toBeLessThan(0);
    expect(comparePlans(direct, bus)).toBeLessThan(0);
    expect(comparePlans(linked, bus)).toBeLessThan(0);
    expect(comparePlans(direct, linked)).toBeLessThan(0);
    expect(comparePlans(direct, direct)).toBe(0);
  });
  it("keeps the first plan on a full tie", () => {
    const copy: SharingPlan = { ...direct };
    expect(betterPlan(direct, copy)).toBe(direct);
    expect(betterPlan(bus, direct)).toBe(direct);
  });
  it("under the mixed policy turns a bus that does not pay into direct diodes", () => {
    const p = problemFromLit(litRows("11", "11"));
    const rules = { depthLimit: 2, policy: "mixed", buses: true, links: true } as const;
    expect(breakTies(p, rules, bus)).toEqual({ ...direct, direct: direct.direct });
    expect(breakTies(p, { ...rules, policy: "per-segment" }, bus)).toBe(bus);
  });
});
