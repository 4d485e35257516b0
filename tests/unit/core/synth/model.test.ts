import { describe, expect, it } from "vitest";
import { candidateFamily } from "../../../../src/core/synth/candidates.ts";
import { buildSharingModel } from "../../../../src/core/synth/model.ts";
import { problemFromLit } from "../../../../src/core/synth/plan.ts";
import { litRows } from "../../../support/litSpec.ts";

describe("buildSharingModel", () => {
  const p = problemFromLit(litRows("111", "111", "110", "000"));
  const rules = { depthLimit: 2, policy: "per-segment", buses: true, links: true } as const;
  const model = buildSharingModel(p, rules, candidateFamily(p, 1));
  it("writes LP-format sections with binary columns", () => {
    expect(model.text).toMatch(/^Minimize\n obj: /);
    expect(model.text).toContain("\nSubject To\n");
    expect(model.text).toContain("\nBinary\n");
    expect(model.text.trimEnd().endsWith("End")).toBe(true);
    expect(model.columns).toContain("d_0_0");
    expect(model.columns).toContain("v_2_2");
    expect(model.columns).toContain("l_2_0"); // every state lighting o2 lights o0
  });
  it("round-trips a plan through warm start and decode", () => {
    const plan = {
      direct: [
        [0, 0],
        [1, 0],
        [2, 0],
      ] as [number, number][],
      buses: [],
      links: [{ from: 0, to: 1 }],
    };
    const withO2 = { ...plan, buses: [{ states: [0, 1], outputs: [2] }] };
    const start = model.warmStart(withO2);
    expect(start).not.toBeNull();
    const back = model.decode((name) => start?.get(name) ?? 0);
    expect(back.direct).toEqual(withO2.direct);
    expect(back.links).toEqual(withO2.links);
    expect(back.buses).toEqual(withO2.buses);
  });
  it("has whole-number costs only, so the solver may round its bound", () => {
    const objective = model.text.split("Subject To")[0] ?? "";
    expect(objective).not.toMatch(/\d\.\d/);
  });
  it("under the uniform policy models the all-bus matrix only (no direct diodes, no links)", () => {
    const uniform = buildSharingModel(p, { ...rules, policy: "uniform" }, candidateFamily(p, 1));
    expect(uniform.columns.some((c) => c.startsWith("d_") || c.startsWith("l_"))).toBe(false);
    expect(uniform.warmStart({ direct: [[0, 0]], buses: [], links: [] })).toBeNull();
  });
});
