import { describe, expect, it } from "vitest";
import { compileSpec, type DecodeSpec } from "../../../../src/core/spec/decodeSpec.ts";
import { buildMatrix, type Edge } from "../../../../src/core/matrix/matrix.ts";
import type { DepthPolicy } from "../../../../src/core/project/project.ts";
import { verifyMatrix } from "../../../../src/core/matrix/verify.ts";
import { makeProject } from "../../../support/projects.ts";

// A custom two-state, three-segment cell keeps the cases readable:
// state S0 lights x and y, S1 lights x, y and z.
const spec: DecodeSpec = compileSpec(
  makeProject({
    counter: { states: 3 },
    display: { positions: 1, cell: "custom", segments: ["x", "y", "z"] },
    glyphs: { p: "xy", q: "xyz", r: "z" },
    show: ["p", "q", "r"],
  }),
);

function check(edges: Edge[], depth: DepthPolicy = "mixed", maxDepth = 2) {
  const m = buildMatrix(spec, edges, { lowerBound: null, optimal: false, depthLimit: maxDepth, policy: depth, method: "heuristic" });
  return verifyMatrix(spec, m, { depthLimit: maxDepth, policy: depth });
}

const direct: Edge[] = [
  { from: "S0", to: "1x" },
  { from: "S0", to: "1y" },
  { from: "S1", to: "1x" },
  { from: "S1", to: "1y" },
  { from: "S1", to: "1z" },
  { from: "S2", to: "1z" },
];

describe("verifyMatrix", () => {
  it("accepts the direct matrix", () => expect(check(direct).ok).toBe(true));

  it("accepts a bus shared by S0 and S1 into x and y (per-segment, not uniform)", () => {
    const edges: Edge[] = [
      { from: "S0", to: "B" },
      { from: "S1", to: "B" },
      { from: "B", to: "1x" },
      { from: "B", to: "1y" },
      { from: "S1", to: "1z" },
      { from: "S2", to: "1z" },
    ];
    expect(check(edges, "per-segment").ok).toBe(true);
    const r = check(edges, "uniform");
    expect(!r.ok && r.error.join()).toMatch(/paths have 1, 2 diodes; the uniform policy/);
  });

  it("rejects a sneak path: a bus feeding z lets S0 light z", () => {
    const r = check([
      { from: "S0", to: "B" },
      { from: "S1", to: "B" },
      { from: "B", to: "1x" },
      { from: "B", to: "1y" },
      { from: "B", to: "1z" },
      { from: "S2", to: "1z" },
    ]);
    expect(r.ok).toBe(false);
    if (!r.ok) expect(r.error).toContain('state S0 ("p") also lights 1z through a sneak path');
  });

  it("rejects a missing diode", () => {
    const r = check(direct.slice(1));
    expect(!r.ok && r.error).toContain('state S0 ("p") does not light 1x');
  });

  it("rejects a link whose source state does not light the target", () => {
    // 1z -> 1x: S2 reaches z, but S2 does not light x.
    const r = check([...direct.filter((e) => !(e.to === "1x")), { from: "S0", to: "1x" }, { from: "1z", to: "1x" }]);
    expect(!r.ok && r.error.join("\n")).toMatch(/S2 \("r"\) also lights 1x/);
  });

  it("rejects a loop", () => {
    const r = check([...direct, { from: "1x", to: "1y" }, { from: "1y", to: "1x" }]);
    expect(!r.ok && r.error.join()).toMatch(/loop/);
  });

  it("rejects a path over the depth limit", () => {
    const edges: Edge[] = [...direct.filter((e) => e.to !== "1y"), { from: "1x", to: "1y" }];
    expect(check(edges, "mixed", 2).ok).toBe(true);
    const r = check(edges, "mixed", 1);
    expect(!r.ok && r.error.join()).toMatch(/1y is reached through 2 diodes, over the limit of 1/);
  });

  it("holds the per-segment policy: one path length per output", () => {
    const edges: Edge[] = [...direct, { from: "1x", to: "1y" }];
    expect(check(edges, "mixed").ok).toBe(true);
    const r = check(edges, "per-segment");
    expect(!r.ok && r.error.join()).toMatch(/1y is reached through paths of 1 and 2 diodes/);
  });

  it("holds the uniform policy: one path length everywhere", () => {
    const edges: Edge[] = [...direct.filter((e) => e.to !== "1y"), { from: "1x", to: "1y" }];
    expect(check(edges, "per-segment").ok).toBe(true);
    const r = check(edges, "uniform");
    expect(!r.ok && r.error.join()).toMatch(/uniform policy/);
  });

  it("rejects a bus that drives nothing, and duplicate diodes", () => {
    expect(!check([...direct, { from: "S0", to: "B" }]).ok).toBe(true);
    const r = check([...direct, { from: "S0", to: "1x" }]);
    expect(!r.ok && r.error.join()).toMatch(/duplicates another diode/);
  });

  it("rejects a diode into a counter line", () => {
    const r = check([...direct, { from: "1x", to: "S2" }]);
    expect(!r.ok && r.error.join()).toMatch(/drives counter line S2/);
  });

  it("rejects claims the numbers do not support", () => {
    const m = buildMatrix(spec, direct, { lowerBound: 7, optimal: true, depthLimit: 2, policy: "mixed", method: "exact" });
    const r = verifyMatrix(spec, m, { depthLimit: 2, policy: "mixed" });
    expect(!r.ok && r.error.join()).toMatch(/lower bound 7 exceeds the count 6/);
  });
});
