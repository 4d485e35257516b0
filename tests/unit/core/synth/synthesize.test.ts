import { describe, expect, it } from "vitest";
import { compileSpec, litCellCount } from "../../../../src/core/spec/decodeSpec.ts";
import { buildMatrix } from "../../../../src/core/matrix/matrix.ts";
import { synthesize, synthSettings, verified } from "../../../../src/core/synth/synthesize.ts";
import { example, showing } from "../../../support/projects.ts";

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
