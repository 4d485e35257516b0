import { describe, expect, it } from "vitest";
import { compileSpec, litCellCount } from "../../../../src/core/spec/decodeSpec.ts";
import { buildMatrix } from "../../../../src/core/matrix/matrix.ts";
import { synthesize, synthSettings, verified } from "../../../../src/core/synth/synthesize.ts";
import { example, showing } from "../../../support/projects.ts";
import { largestCustomProject, largestHexProject } from "../../../support/largestProject.ts";
import { verifyMatrix } from "../../../../src/core/matrix/verify.ts";

describe("synthesize", () => {
  const project = showing([..."0123456789"]);
  const spec = compileSpec(project);

  it("runs each mode and never returns more diodes than the direct matrix", async () => {
    const counts: Record<string, number> = {};
    for (const mode of ["direct", "fast", "exact"] as const) {
      const r = await synthesize(spec, synthSettings(project, { mode }));
      if (!r.ok) throw new Error(JSON.stringify(r.error));
      expect(r.value.verified).toBe(true);
      counts[mode] = r.value.count;
    }
    expect(counts["direct"]).toBe(litCellCount(spec));
    expect(counts["fast"]).toBeLessThanOrEqual(counts["direct"] as number);
    expect(counts["exact"]).toBeLessThanOrEqual(counts["fast"] as number);
  });

  it("takes the project's settings and lets overrides win", () => {
    const s = synthSettings(project, { depthLimit: 1, mode: "fast" });
    expect(s).toEqual({ ...project.synthesis, depthLimit: 1, mode: "fast" });
    expect(synthSettings(project).mode).toBe("exact");
  });

  it("turns a matrix the verifier rejects into a bug report, never a result", () => {
    const die = example("die-roller");
    const dieSpec = compileSpec(die);
    const wrong = buildMatrix(dieSpec, [{ from: "S0", to: "1c" }], {
      lowerBound: null,
      optimal: false,
      depthLimit: 2,
      policy: "mixed",
      method: "heuristic",
    });
    const r = verified(dieSpec, wrong, synthSettings(die));
    expect(r.ok).toBe(false);
    if (r.ok) return;
    expect(r.error.kind).toBe("bug");
    expect(r.error.message).toMatch(/verifier rejects/);
    if (r.error.kind === "bug") expect(r.error.details.join()).toMatch(/does not light/);
  });
});

describe("synthesize at the largest size the format allows", () => {
  // Times are the bench's business; here: it ends, verified, with a bound no higher than its count.
  for (const [name, make] of [
    ["256 states, 8 positions of a 32-segment custom cell", () => largestCustomProject()],
    ["256 states of 8 hex digits", () => largestHexProject()],
  ] as const) {
    it(`${name}: a verified matrix and its bound, by default and with --fast`, async () => {
      const project = make();
      const spec = compileSpec(project);
      const exact = await synthesize(spec, synthSettings(project));
      if (!exact.ok) throw new Error(JSON.stringify(exact.error));
      expect(verifyMatrix(spec, exact.value, synthSettings(project)).ok).toBe(true);
      expect(exact.value.lowerBound).not.toBeNull();
      expect(exact.value.lowerBound ?? Infinity).toBeLessThanOrEqual(exact.value.count);
      expect(exact.value.count).toBeLessThanOrEqual(litCellCount(spec));
      const fast = await synthesize(spec, synthSettings(project, { mode: "fast" }));
      if (!fast.ok) throw new Error(JSON.stringify(fast.error));
      expect(verifyMatrix(spec, fast.value, synthSettings(project)).ok).toBe(true);
      expect(exact.value.count).toBeLessThanOrEqual(fast.value.count);
    }, 120_000);
  }
});
